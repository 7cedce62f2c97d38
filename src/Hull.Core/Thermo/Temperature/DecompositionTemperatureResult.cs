namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// Every sign change of a phase's signed decomposition energy in a stated temperature range at one gas pressure, with
/// the energy at both ends, the breakpoints walked (Ellingham treatment), where an element's reference changes in
/// the range, and what was left out.
/// </summary>
public sealed record DecompositionTemperatureResult(
    string PhaseId,
    string Formula,
    FreeEnergyTreatment Treatment,
    ThermoGas? Gas,
    double FromK,
    double ToK,
    double EnergyAtFromEvPerClosedAtom,
    double EnergyAtToEvPerClosedAtom,
    IReadOnlyList<DecompositionCrossing> Crossings,
    IReadOnlyList<SignedEnergyBreakpoint> Breakpoints,
    IReadOnlyList<ReferenceChange> ReferenceChanges,
    int ScanIntervals,
    IReadOnlyList<string> UnmodelledEntryIds)
{
    /// <summary>True when the phase is stable (signed energy below zero) at the low end of the range.</summary>
    public bool StableAtFrom => EnergyAtFromEvPerClosedAtom < 0;

    /// <summary>True when the phase is stable at the high end of the range.</summary>
    public bool StableAtTo => EnergyAtToEvPerClosedAtom < 0;
}
