namespace Hull.Core.Thermo.Gases;

/// <summary>
/// Δμ of a gas's element: μ per atom of the gas at (T, p) minus the dataset's elemental reference for that element
/// (the energy per atom the hull measures formation energies from), eV/atom.
/// <see cref="ZeroPointOffsetEvPerAtom"/> is the part of Δμ that is the molecule's zero-point energy per atom, which
/// the gas's reference includes and a dataset reference of computed energies at rest usually does not; it is
/// already inside <see cref="DeltaMuEvPerAtom"/> and written out so nobody adds it twice (0 in the fitted mode).
/// </summary>
public sealed record ChemicalPotentialShift(
    string Element,
    GasChemicalPotential Gas,
    double DatasetReferenceEvPerAtom,
    double ZeroPointOffsetEvPerAtom)
{
    /// <summary>μ per atom of the gas at (T, p), eV/atom.</summary>
    public double MuEvPerAtom => Gas.EvPerAtom;

    /// <summary>Δμ = μ per atom − dataset reference, eV/atom.</summary>
    public double DeltaMuEvPerAtom => Gas.EvPerAtom - DatasetReferenceEvPerAtom;
}
