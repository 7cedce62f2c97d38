namespace Hull.Core.Thermo.Temperature;

/// <summary>How free energies depend on temperature in a calculation at (T, p).</summary>
public enum FreeEnergyTreatment
{
    /// <summary>
    /// The Ellingham approximation: every species, the gas included, keeps its H and S at 298.15 K, so every free
    /// energy is a straight line in T; solids need standard-entropy models. Decomposition energies are then piecewise
    /// linear in T and their sign changes are found exactly.
    /// </summary>
    Ellingham,

    /// <summary>
    /// The gas's μ(T, p) from its tabulated H°(T) and S°(T), the solids from their models (a standard entropy with
    /// constant H and S, or a tabulated G(T)); sign changes are bracketed on a scan and root-solved.
    /// </summary>
    TabulatedGas,
}
