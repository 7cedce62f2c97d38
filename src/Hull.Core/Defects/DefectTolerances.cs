namespace Hull.Core.Defects;

/// <summary>Named tolerances of the defect module, with the reason for each size.</summary>
public static class DefectTolerances
{
    /// <summary>
    /// A lattice whose volume is below this fraction of |a||b||c| is singular: a real supercell has a ratio of
    /// order 0.1–1 (0.7 for a 60° rhombohedral cell), while coplanar vectors typed in error give ~1e-16.
    /// </summary>
    public const double SingularLatticeVolumeRatio = 1e-6;

    /// <summary>
    /// A dielectric tensor may be asymmetric by this fraction of its largest entry (values are typed or printed
    /// to 4–6 digits); it is then symmetrised. A larger asymmetry is an input error.
    /// </summary>
    public const double DielectricAsymmetry = 1e-4;

    /// <summary>
    /// Eigenvalues of the dielectric tensor at or below this fraction of the largest are not positive: physical
    /// tensors have all eigenvalues ≥ 1 and rarely a ratio beyond 1e3.
    /// </summary>
    public const double DielectricEigenvalueRatio = 1e-8;

    /// <summary>
    /// Bulk energy per formula unit of the study and of the host's entry in the dataset may differ by this much
    /// (eV per formula unit) before a warning is given: same-settings calculations agree to ~1e-4 eV, while a
    /// different cutoff, functional or pseudopotential moves the energy by 0.01 eV or much more.
    /// </summary>
    public const double BulkEnergyPerFormulaUnitEv = 0.01;

    /// <summary>
    /// Relative target of the Ewald sums: each tail left out is below this fraction of the leading term, far
    /// below the 1e-6 eV that matters for a correction of order 0.1–1 eV and well above double rounding.
    /// </summary>
    public const double EwaldRelativeTail = 1e-13;

    /// <summary>
    /// A site this close to the point model charge (Å) has no finite model potential; real structures keep
    /// atoms ≥ 0.5 Å apart, so anything nearer is a misplaced defect position.
    /// </summary>
    public const double PointChargeSiteDistanceAngstrom = 1e-3;

    /// <summary>
    /// A given chemical-potential point may miss the host's formation energy, or exceed a competing phase's, by this
    /// much (eV/atom) before a warning: a point typed to four decimals is within it, and a defect's energy moves by
    /// less than 1e-3 eV for such a slip.
    /// </summary>
    public const double GivenPointOffPlaneEvPerAtom = 1e-4;
}
