namespace Hull.Core.Thermo;

/// <summary>Formation energies per atom of a list of entries (in the list's order) and the references used.</summary>
public sealed class FormationEnergySet
{
    internal FormationEnergySet(
        IReadOnlyList<double> evPerAtom, IReadOnlyList<ElementReference> references, IReadOnlyList<EntryEnergyProblem> problems)
    {
        FormationEnergiesEvPerAtom = evPerAtom;
        References = references;
        Problems = problems;
    }

    /// <summary>Formation energy from the elements per atom (eV/atom), one per entry in input order; NaN for an entry
    /// listed in <see cref="Problems"/>.</summary>
    public IReadOnlyList<double> FormationEnergiesEvPerAtom { get; }

    /// <summary>The reference of every element that some total-energy entry contains, sorted by symbol.</summary>
    public IReadOnlyList<ElementReference> References { get; }

    /// <summary>Entries whose formation energy cannot be used, in input order (empty from <see cref="FormationEnergies.Compute"/>).</summary>
    public IReadOnlyList<EntryEnergyProblem> Problems { get; }
}
