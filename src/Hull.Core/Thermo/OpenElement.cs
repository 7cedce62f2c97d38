namespace Hull.Core.Thermo;

/// <summary>
/// An element open to a reservoir, at a chemical potential relative to its elemental reference (eV/atom, on the
/// same scale as formation energies: 0 is the element's reference state).
/// </summary>
public sealed record OpenElement(string Symbol, double ChemicalPotentialEvPerAtom);
