namespace Hull.Core.Thermo;

/// <summary>
/// Places entries on a grand-potential axis: Φ = (E_f − Σ_open n_o μ_o) / N_closed per formula unit, where E_f is
/// the formation energy of the formula unit, n_o its atoms of open element o, μ_o that element's chemical potential
/// relative to its reference, and N_closed its atoms of closed elements.
/// </summary>
public static class GrandPotentialEntries
{
    /// <summary>
    /// The entries on <paramref name="axis"/>, in input order, each with its formation energy beside it. Entries made
    /// of open elements only have no closed atoms to count and are left out (they are the reservoir).
    /// </summary>
    /// <exception cref="ThermoInputException">A closed-hull axis, bad rows or missing references.</exception>
    public static IReadOnlyList<HullAxisEntry> Of(
        IReadOnlyList<PhaseEntry> entries, HullAxis axis, ElementalReferences? references = null)
    {
        ArgumentNullException.ThrowIfNull(axis);
        if (axis.Quantity != HullAxisQuantity.GrandPotential)
        {
            throw new ThermoInputException($"Grand potentials need a grand-potential axis; got {axis.DisplayName}.");
        }

        FormationEnergySet formation = FormationEnergies.Compute(entries, references);
        var placed = new List<HullAxisEntry>(entries.Count);
        for (int row = 0; row < entries.Count; row++)
        {
            double formationEvPerAtom = formation.FormationEnergiesEvPerAtom[row];
            if (OpenElementHull.GrandPotentialEvPerClosedAtom(entries[row].Composition, formationEvPerAtom, axis) is { } phi)
            {
                placed.Add(new HullAxisEntry(entries[row], phi, formationEvPerAtom));
            }
        }

        return placed;
    }
}
