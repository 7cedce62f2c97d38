using Hull.Core.Thermo.Gases;

namespace Hull.Core.Windows;

/// <summary>
/// A gas element's Δμ read as a reservoir condition: the pressure that gives it at a chosen temperature, or the
/// temperature that gives it at a chosen pressure (whichever was asked; both may be). Immutable.
/// </summary>
/// <param name="Element">The gas's element (O, N, H, F, Cl).</param>
/// <param name="Gas">The gas (O2, ...).</param>
/// <param name="DeltaMuEvPerAtom">The Δμ read, eV/atom.</param>
/// <param name="Pressure">At the chosen temperature: the pressure (log10 too, which stays finite where p under- or overflows).</param>
/// <param name="Temperature">At the chosen pressure: the temperature solve, with why it stopped.</param>
/// <param name="ComputedMolecule">True when read through a computed molecule against the dataset's reference, false for the fitted default.</param>
public sealed record GasCondition(string Element, string Gas, double DeltaMuEvPerAtom, PressureForShift? Pressure, TemperatureSolveResult? Temperature,
    bool ComputedMolecule = false);
