using System.Globalization;

namespace Hull.Core.Thermo;

/// <summary>
/// Turns entries of any <see cref="EnergyBasis"/> into formation energies per atom. Total energies subtract the
/// elemental references: an explicit one where given, otherwise the lowest total energy per atom among the
/// pure-element entries of that element. Formation energies pass through (elements sit at 0 by definition).
/// </summary>
public static class FormationEnergies
{
    /// <exception cref="ThermoInputException">A null row, a repeated id, or a total energy whose element has no reference.</exception>
    public static FormationEnergySet Compute(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        EntryList.Validate(entries);
        references ??= ElementalReferences.None;
        IReadOnlyDictionary<string, ElementReference> resolved = ResolveReferences(entries, references);

        var energies = new double[entries.Count];
        for (int row = 0; row < entries.Count; row++)
        {
            energies[row] = FormationEvPerAtom(entries[row], resolved);
        }

        ElementReference[] used = resolved.Values.OrderBy(r => r.Symbol, StringComparer.Ordinal).ToArray();
        return new FormationEnergySet(energies, used);
    }

    private static double FormationEvPerAtom(PhaseEntry entry, IReadOnlyDictionary<string, ElementReference> references)
    {
        double perAtom = entry.EnergyEvPerAtom;
        if (!entry.IsTotalEnergy)
        {
            return perAtom;
        }

        // Per atom: e - sum_el x_el * mu_el. A pure-element entry has x = 1 exactly, so the entry that sets its
        // element's reference comes out at exactly 0.
        double formation = perAtom;
        foreach (string symbol in entry.Composition.Elements)
        {
            formation -= entry.Composition.AtomicFraction(symbol) * references[symbol].TotalEnergyEvPerAtom;
        }

        return formation;
    }

    private static IReadOnlyDictionary<string, ElementReference> ResolveReferences(
        IReadOnlyList<PhaseEntry> entries, ElementalReferences explicitReferences)
    {
        // Default: the lowest total energy per atom of each element's pure entries; ties go to the smaller id
        // so the choice does not depend on input order.
        var lowest = new Dictionary<string, (double EvPerAtom, string Id)>(StringComparer.Ordinal);
        foreach (PhaseEntry entry in entries)
        {
            if (!entry.IsTotalEnergy || entry.Composition.Elements.Count != 1)
            {
                continue;
            }

            string symbol = entry.Composition.Elements[0];
            double perAtom = entry.EnergyEvPerAtom;
            if (!lowest.TryGetValue(symbol, out var best) || perAtom < best.EvPerAtom
                || (perAtom == best.EvPerAtom && string.CompareOrdinal(entry.Id, best.Id) < 0))
            {
                lowest[symbol] = (perAtom, entry.Id);
            }
        }

        var resolved = new Dictionary<string, ElementReference>(StringComparer.Ordinal);
        var missing = new SortedDictionary<string, List<(string Id, int Row)>>(StringComparer.Ordinal);
        bool anyFormation = false;
        for (int row = 0; row < entries.Count; row++)
        {
            PhaseEntry entry = entries[row];
            if (!entry.IsTotalEnergy)
            {
                anyFormation = true;
                continue;
            }

            foreach (string symbol in entry.Composition.Elements)
            {
                if (resolved.ContainsKey(symbol))
                {
                    continue;
                }

                if (explicitReferences.TryGetEvPerAtom(symbol, out double given))
                {
                    resolved[symbol] = new ElementReference(symbol, given, null);
                }
                else if (lowest.TryGetValue(symbol, out var best))
                {
                    resolved[symbol] = new ElementReference(symbol, best.EvPerAtom, best.Id);
                }
                else
                {
                    if (!missing.TryGetValue(symbol, out var needing))
                    {
                        missing[symbol] = needing = [];
                    }

                    needing.Add((entry.Id, row));
                }
            }
        }

        if (missing.Count > 0)
        {
            (string symbol, List<(string Id, int Row)> needing) = missing.First();
            string others = missing.Count > 1
                ? $" References are also missing for {string.Join(", ", missing.Keys.Skip(1))}."
                : string.Empty;
            string mixing = anyFormation
                ? " The set mixes formation and total energies; that is allowed only where every element in a total-energy entry has a reference."
                : string.Empty;
            throw new ThermoInputException(
                string.Create(
                    CultureInfo.InvariantCulture,
                    $"No reference energy for element {symbol}: the total energies of {EntryList.Describe(needing)} need one. "
                    + $"Add a pure-{symbol} entry with a total energy, or give an explicit reference for {symbol}.{others}{mixing}"),
                entryId: needing[0].Id,
                rowIndex: needing[0].Row,
                element: symbol,
                isMissingReference: true);
        }

        return resolved;
    }
}
