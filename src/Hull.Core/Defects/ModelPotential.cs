namespace Hull.Core.Defects;

/// <summary>
/// The electrostatic potential (V) of the periodic model charge with its compensating background (zero mean over
/// the cell), at atomic sites or as a planar average along a lattice axis.
/// </summary>
public static class ModelPotential
{
    /// <summary>
    /// Potential (V) at each site (fractional coordinates) of the periodic model charge q centred at
    /// <paramref name="defectFractional"/>. Ewald-summed in the vacuum frame like <see cref="ImageChargeEwald"/>.
    /// </summary>
    public static double[] AtSites(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge,
        Vector3D defectFractional, IReadOnlyList<Vector3D> sitesFractional, EwaldSettings? settings = null)
    {
        return AtSites(cell, dielectric, model, charge, defectFractional, sitesFractional, settings ?? EwaldSettings.Default, forceQuadrature: false);
    }

    internal static double[] AtSites(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge,
        Vector3D defectFractional, IReadOnlyList<Vector3D> sitesFractional, EwaldSettings settings, bool forceQuadrature)
    {
        settings.Validate();
        var result = new double[sitesFractional.Count];
        if (charge == 0) return result;
        var frame = new VacuumFrame(cell, dielectric, model);
        double gamma = settings.SplittingPerAngstrom ?? DefaultSplitting(frame);
        var kernel = new SplitCoulombKernel(frame.Covariance, gamma, forceQuadrature);
        double x = settings.CutoffArgument;
        double volume = frame.Cell.VolumeCubicAngstrom;

        // Offsets are reduced to the nearest image first, so one set of lattice vectors serves every site.
        var offsets = new Vector3D[sitesFractional.Count];
        double longest = 0;
        for (int s = 0; s < offsets.Length; s++)
        {
            var site = sitesFractional[s];
            if (!site.IsFinite) throw new DefectInputException($"sites[{s}]", "site coordinates must be finite numbers");
            offsets[s] = frame.Cell.MinimumImage(defectFractional, site);
            longest = Math.Max(longest, offsets[s].Length);
            if (kernel.IsPoint && cell.MinimumImage(defectFractional, site).Length < DefectTolerances.PointChargeSiteDistanceAngstrom)
            {
                throw new DefectInputException($"sites[{s}]", "the site coincides with the defect position, where a point model charge has no finite potential");
            }
        }

        double realCutoff = kernel.RealSpaceCutoff(x);
        List<Vector3D> lattice = frame.RealVectors(realCutoff + longest);
        lattice.Add(new Vector3D(0, 0, 0));
        List<Vector3D> reciprocal = frame.ReciprocalVectors(kernel.ReciprocalCutoff(x));
        var weights = new double[reciprocal.Count];
        for (int k = 0; k < reciprocal.Count; k++)
        {
            weights[k] = 4 * Math.PI / volume * kernel.ReciprocalDamping(reciprocal[k]) / reciprocal[k].Dot(reciprocal[k]);
        }

        double background = kernel.BackgroundTerm(volume);
        double scale = PhysicalConstants.CoulombEvAngstrom * charge * frame.ScreeningFactor;
        double cutoff2 = realCutoff * realCutoff;
        for (int s = 0; s < offsets.Length; s++)
        {
            var u = offsets[s];
            double sum = 0;
            foreach (var r in lattice)
            {
                var d = u - r;
                if (d.Dot(d) <= cutoff2) sum += kernel.ShortRange(d);
            }

            for (int k = 0; k < reciprocal.Count; k++) sum += weights[k] * Math.Cos(reciprocal[k].Dot(u));
            result[s] = scale * (sum - background);
        }

        return result;
    }

    // An anisotropic Gaussian's real-space terms each need a quadrature while a reciprocal term is one cosine per
    // site: a split of γ ≥ 1/(2√c_min) leaves real space to the few images within a few widths of a site, and the
    // Gaussian's own transform still bounds the reciprocal sum (measured in bench/: ~3× faster for 200 sites).
    private static double DefaultSplitting(VacuumFrame frame)
    {
        var (values, _) = frame.Covariance.SymmetricEigen();
        bool anisotropic = values.X > 0 && values.Z - values.X > 1e-15 * values.Z;
        return anisotropic ? Math.Max(frame.DefaultSplitting, 0.5 / Math.Sqrt(values.X)) : frame.DefaultSplitting;
    }

    /// <summary>
    /// Planar average (V) of the model potential over the lattice planes spanned by the two axes other than
    /// <paramref name="axis"/>, at <paramref name="points"/> equally spaced positions f = k/points along it
    /// (the layout of a DFT grid): (4π q/V) Σ_{m≠0} ρ̂(m b) cos(2πm(f − f_d)) / (m b)ᵀε(m b).
    /// </summary>
    public static double[] PlanarAverage(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge,
        double defectFractionalAlongAxis, int axis, int points)
    {
        if (axis is < 0 or > 2) throw new DefectInputException("axis", $"axis must be 0, 1 or 2, not {axis}");
        if (points < 2) throw new DefectInputException("points", $"a planar average needs at least 2 points, not {points}");
        var result = new double[points];
        if (charge == 0) return result;
        var b = cell.Reciprocal(axis);
        double bEb = dielectric.Tensor.QuadraticForm(b);
        double bSb = model.Covariance.QuadraticForm(b);
        double prefactor = 4 * Math.PI * PhysicalConstants.CoulombEvAngstrom * charge / (cell.VolumeCubicAngstrom * bEb);
        for (int k = 0; k < points; k++)
        {
            double f = (double)k / points - defectFractionalAlongAxis;
            f -= Math.Floor(f);
            double sum;
            if (model.IsPoint)
            {
                // Σ_{m≥1} cos(2πmf)/m² = π²(f² − f + 1/6) on [0, 1] (the Bernoulli polynomial B₂), common practice
                sum = 2 * Math.PI * Math.PI * (f * f - f + 1.0 / 6);
            }
            else
            {
                // Terms fall as e^{−m² bᵀSb/2}; stop once they are below the relative tail of the Ewald sums.
                int mMax = (int)Math.Ceiling(Math.Sqrt(-2 * Math.Log(DefectTolerances.EwaldRelativeTail) / bSb));
                sum = 0;
                for (int m = mMax; m >= 1; m--)
                {
                    sum += 2 * Math.Exp(-0.5 * m * m * bSb) * Math.Cos(2 * Math.PI * m * f) / (m * (double)m);
                }
            }

            result[k] = prefactor * sum;
        }

        return result;
    }
}
