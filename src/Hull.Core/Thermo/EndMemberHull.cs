using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The hull over compound end-members of the entries, taken from a larger list (a dataset's entries within the
/// end-members' elements): only entries on the end-members' cone take part, while the elemental references for
/// total energies come from every pure-element entry of the list, as for the hull over elements.
/// </summary>
public static class EndMemberHull
{
    /// <param name="entries">Candidates; entries off the cone are left out; ids unique.</param>
    /// <param name="basis">The end-members, in the hull's component order.</param>
    /// <param name="references">Explicit elemental references (eV/atom) for total energies; they override the
    /// pure-element entries of the list.</param>
    /// <exception cref="ThermoInputException">An end-member without entry, a total energy whose element has no
    /// reference, or bad rows.</exception>
    public static SystemHull Build(IReadOnlyList<PhaseEntry> entries, EndMemberBasis basis, ElementalReferences? references = null)
    {
        ArgumentNullException.ThrowIfNull(entries);
        ArgumentNullException.ThrowIfNull(basis);
        EntryList.Validate(entries);

        // The pure-element entries set the references; they are fed to the formation energies only, not the hull.
        var onCone = new List<PhaseEntry>();
        var forReferences = new List<PhaseEntry>();
        foreach (PhaseEntry entry in entries)
        {
            bool inside = basis.Contains(entry.Composition);
            if (inside) onCone.Add(entry);
            if (inside || entry.Composition.Elements.Count == 1) forReferences.Add(entry);
        }

        FormationEnergySet formation = FormationEnergies.Compute(forReferences, references);
        var byId = new Dictionary<string, double>(forReferences.Count, StringComparer.Ordinal);
        for (int row = 0; row < forReferences.Count; row++) byId[forReferences[row].Id] = formation.FormationEnergiesEvPerAtom[row];

        var inputs = onCone.Select((e, row) => (e, row, byId[e.Id], (double?)byId[e.Id])).ToArray();
        IReadOnlyList<ElementReference> used = formation.References
            .Where(r => basis.Elements.Contains(r.Symbol, StringComparer.Ordinal)).ToArray();
        return new SystemHull(HullAxis.FormationEnergy, new ComponentSpace.OverEndMembers(basis), inputs, used);
    }
}
