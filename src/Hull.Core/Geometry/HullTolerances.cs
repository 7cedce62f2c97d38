namespace Hull.Core.Geometry;

/// <summary>Named tolerances of the hull engine, with the reason for each size.</summary>
public static class HullTolerances
{
    /// <summary>
    /// Energies within this distance of the hull count as on it (eV/atom). Formation energies are of order
    /// 0.01–10 eV/atom and the arithmetic that places a point against a facet loses about 1e-15 relative, so
    /// 1e-10 eV/atom is far above rounding yet far below any physically meaningful difference (DFT energies carry
    /// about 1e-3 eV/atom of numerical noise).
    /// </summary>
    public const double EnergyEvPerAtom = 1e-10;

    /// <summary>
    /// A barycentric weight this far below zero still counts as inside a facet. Weights are computed from
    /// fractions in [0, 1] through a well-conditioned inverse, so rounding stays near 1e-15; 1e-9 leaves a wide
    /// margin while keeping a decomposition's atom fractions exact to better than 1e-9.
    /// </summary>
    public const double BarycentricWeight = 1e-9;

    /// <summary>
    /// Determinants of composition-fraction matrices smaller than this fraction of their Hadamard bound are
    /// re-evaluated exactly from the integer amounts: Gaussian elimination on at most a few dozen rows loses
    /// far less than 1e-9 of the bound, so a larger value always has the right sign.
    /// </summary>
    public const double RelativeDeterminantFilter = 1e-9;

    /// <summary>
    /// Largest energy magnitude the engine accepts, eV/atom. Placing a point against a facet loses about 1e-15 of
    /// the energies' magnitude to rounding, so up to 1e4 eV/atom that stays ten times below
    /// <see cref="EnergyEvPerAtom"/>; beyond it the on-hull decision would be made by rounding, and near 1e300 the
    /// plane arithmetic overflows. Formation energies are far inside (the thermodynamics layer keeps them within
    /// ±100 eV/atom).
    /// </summary>
    public const double MaxEnergyMagnitudeEvPerAtom = 1e4;
}
