using Hull.Core.Thermo.Gases;

namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// The hull of a chemical system at (T, p): the solids' free energies at T with the gas's element open at its
/// Δμ(T, p) (grand free energy per closed-element atom), or the free energies alone when no gas is open.
/// </summary>
public sealed record ThermoHull(
    double TemperatureK,
    FreeEnergyTreatment Treatment,
    ThermoGas? Gas,
    ChemicalPotentialShift? GasShift,
    SystemHull Hull,
    IReadOnlyList<ReferenceAtTemperature> References,
    IReadOnlyList<string> ReservoirEntryIds,
    IReadOnlyList<string> UnmodelledEntryIds);
