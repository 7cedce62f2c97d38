namespace Hull.Core.Defects;

/// <summary>Computes E_corr = E_lat − qΔV for a charge state of a defect in a study's supercell.</summary>
public static class FiniteSizeCorrector
{
    /// <summary>
    /// The correction of charge state q with its alignment input (null: image charge only). The model charge sits at
    /// <paramref name="defectFractional"/>; the lattice term does not depend on where.
    /// </summary>
    public static FiniteSizeCorrection Correct(LatticeCell cell, DielectricTensor dielectric, ModelCharge model, int charge,
        Vector3D defectFractional, AlignmentInput? alignment, EwaldSettings? settings = null, string field = "alignment")
    {
        double lattice = ImageChargeEwald.LatticeCorrection(cell, dielectric, model, charge, settings).CorrectionEv;
        AlignmentResult? result = alignment switch
        {
            null => null,
            AlignmentInput.GivenShift given => Given(given, field),
            AlignmentInput.PlanarAverages planar => PotentialAlignment.FromPlanarAverages(cell, dielectric, model, charge, defectFractional, planar, field),
            AlignmentInput.AtomicSites sites => PotentialAlignment.FromAtomicSites(cell, dielectric, model, charge, defectFractional, sites, settings, field),
            _ => throw new DefectInputException(field, "unknown kind of alignment input"),
        };
        return new FiniteSizeCorrection(charge, lattice, result);
    }

    private static AlignmentResult Given(AlignmentInput.GivenShift given, string field)
    {
        if (!double.IsFinite(given.ShiftVolts)) throw new DefectInputException($"{field}.shift_volts", "a given potential shift must be a finite number");
        return new AlignmentResult(AlignmentMethod.Given, given.ShiftVolts, 0, 0, new Dictionary<int, double>(), 0, double.NaN, []);
    }
}
