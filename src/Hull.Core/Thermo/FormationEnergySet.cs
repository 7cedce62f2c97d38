namespace Hull.Core.Thermo;

/// <summary>Formation energies per atom of a list of entries (in the list's order) and the references used.</summary>
public sealed class FormationEnergySet
{
    internal FormationEnergySet(IReadOnlyList<double> evPerAtom, IReadOnlyList<ElementReference> references)
    {
        FormationEnergiesEvPerAtom = evPerAtom;
        References = references;
    }

    /// <summary>Formation energy from the elements per atom (eV/atom), one per entry in input order.</summary>
    public IReadOnlyList<double> FormationEnergiesEvPerAtom { get; }

    /// <summary>The reference of every element that some total-energy entry contains, sorted by symbol.</summary>
    public IReadOnlyList<ElementReference> References { get; }
}
