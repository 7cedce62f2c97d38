namespace Hull.Core.Defects;

/// <summary>
/// A point of chemical-potential space: Δμ_i (eV/atom) of each element relative to its elemental reference, with
/// a label (a window vertex's name, or "given").
/// </summary>
/// <param name="Label">Where the point came from, for display.</param>
/// <param name="DeltaMuEv">Δμ per element symbol.</param>
public sealed record ChemicalPotentialPoint(string Label, IReadOnlyDictionary<string, double> DeltaMuEv);
