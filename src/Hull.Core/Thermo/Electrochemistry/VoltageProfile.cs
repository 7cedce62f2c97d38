using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Electrochemistry;

/// <summary>
/// The voltage profile of inserting an ion into a host: its plateaus, the Δx-weighted average voltage, the
/// theoretical gravimetric capacity on two mass bases and the energy density on each.
/// </summary>
public sealed record VoltageProfile(
    string Ion,
    int ChargeNumber,
    Composition Host,
    Composition FullyInserted,
    string ChemicalSystem,
    IReadOnlyList<VoltagePlateau> Plateaus,
    double AverageVoltsAgainstMetal,
    double IonsPerHostInserted,
    double CapacityPerHostMassMilliampHoursPerGram,
    double CapacityPerInsertedMassMilliampHoursPerGram,
    double EnergyDensityPerHostMassWattHoursPerKilogram,
    double EnergyDensityPerInsertedMassWattHoursPerKilogram,
    bool EndsAtIonMetal)
{
    /// <summary>What the voltages rest on.</summary>
    public string Caveat => ElectrochemicalConstants.ZeroKelvinCaveat;
}
