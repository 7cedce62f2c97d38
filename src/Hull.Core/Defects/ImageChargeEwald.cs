namespace Hull.Core.Defects;

/// <summary>
/// Ewald summation of the electrostatic energy of a periodic array of model charges in a uniform compensating
/// background, in a medium with a scalar or anisotropic dielectric tensor, for any (triclinic) cell.
/// </summary>
/// <remarks>
/// The medium is mapped onto vacuum (<see cref="VacuumFrame"/>); there the periodic energy minus the isolated
/// charge's self-energy is (q²/2)[Σ_{R≠0} v_s(R) + (4π/V)Σ_{G≠0} e^{−GᵀCG/2 − G²/4γ²}/G² − v_l(0) − π/(Vγ²)] with
/// C = 2S (see <see cref="SplitCoulombKernel"/>), finite for a point charge as well as a Gaussian.
/// </remarks>
public static class ImageChargeEwald
{
    /// <summary>The lattice correction E_lat (eV) of charge state <paramref name="charge"/> (units of e).</summary>
    public static ImageChargeEnergy LatticeCorrection(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge, EwaldSettings? settings = null)
    {
        return LatticeCorrection(cell, dielectric, model, charge, settings ?? EwaldSettings.Default, forceQuadrature: false);
    }

    internal static ImageChargeEnergy LatticeCorrection(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge, EwaldSettings settings, bool forceQuadrature)
    {
        settings.Validate();
        if (charge == 0) return new ImageChargeEnergy(0, 0, 0, 0);
        var frame = new VacuumFrame(cell, dielectric, model);
        double gamma = settings.SplittingPerAngstrom ?? frame.DefaultSplitting;
        var kernel = new SplitCoulombKernel(2 * frame.Covariance, gamma, forceQuadrature);
        double x = settings.CutoffArgument;
        double volume = frame.Cell.VolumeCubicAngstrom;

        List<Vector3D> real = frame.RealVectors(kernel.RealSpaceCutoff(x));
        double realSum = 0;
        foreach (var r in real) realSum += kernel.ShortRange(r);

        List<Vector3D> reciprocal = frame.ReciprocalVectors(kernel.ReciprocalCutoff(x));
        double reciprocalSum = 0;
        foreach (var g in reciprocal) reciprocalSum += kernel.ReciprocalDamping(g) / g.Dot(g);
        reciprocalSum *= 4 * Math.PI / volume;

        double periodicMinusIsolated = 0.5 * (realSum + reciprocalSum - kernel.LongRangeAtOrigin() - kernel.BackgroundTerm(volume));
        double energy = -PhysicalConstants.CoulombEvAngstrom * charge * charge * frame.ScreeningFactor * periodicMinusIsolated;
        return new ImageChargeEnergy(energy, gamma, real.Count, reciprocal.Count);
    }
}
