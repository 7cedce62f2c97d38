using System.Globalization;

namespace Hull.Core.Thermo;

/// <summary>
/// Turns entries of any <see cref="EnergyBasis"/> into formation energies per atom. Total energies subtract the
/// elemental references: an explicit one where given, otherwise the lowest total energy per atom among the
/// pure-element entries of that element. Formation energies pass through (elements sit at 0 by definition).
/// </summary>
public static class FormationEnergies
{
    /// <exception cref="ThermoInputException">A null row, a repeated id, a total energy whose element has no
    /// reference, or a formation energy outside <see cref="FormationEnergyRange"/> (the entry named).</exception>
    public static FormationEnergySet Compute(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        FormationEnergySet set = Evaluate(entries, references);
        if (set.Problems.Count == 0)
        {
            return set;
        }

        EntryEnergyProblem first = set.Problems.FirstOrDefault(p => p.Kind == EntryEnergyProblemKind.MissingReference) ?? set.Problems[0];
        if (first.Kind == EntryEnergyProblemKind.MissingReference)
        {
            throw MissingReferenceError(entries, set);
        }

        throw new ThermoInputException(first.Message, entryId: first.EntryId, rowIndex: first.RowIndex);
    }

    /// <summary>
    /// As <see cref="Compute"/>, but an entry whose formation energy cannot be used (no reference for one of its
    /// elements, or out of range) is listed in <see cref="FormationEnergySet.Problems"/> with NaN as its energy
    /// instead of failing the whole list, so a dataset can answer for the rest.
    /// </summary>
    /// <exception cref="ThermoInputException">A null row or a repeated id.</exception>
    public static FormationEnergySet Evaluate(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        EntryList.Validate(entries);
        references ??= ElementalReferences.None;
        IReadOnlyDictionary<string, ElementReference> resolved = ResolveReferences(entries, references);

        var energies = new double[entries.Count];
        var problems = new List<EntryEnergyProblem>();
        for (int row = 0; row < entries.Count; row++)
        {
            PhaseEntry entry = entries[row];
            string? missing = entry.IsTotalEnergy ? entry.Composition.Elements.FirstOrDefault(e => !resolved.ContainsKey(e)) : null;
            if (missing is not null)
            {
                energies[row] = double.NaN;
                problems.Add(new EntryEnergyProblem(entry.Id, row, EntryEnergyProblemKind.MissingReference, missing,
                    $"Entry '{entry.Id}' ({entry.Composition.Formula}) is a total energy, but element {missing} has no reference: "
                    + $"add a pure-{missing} entry with a total energy, or give an explicit reference for {missing}."));
                continue;
            }

            double formation = FormationEvPerAtom(entry, resolved);
            if (!FormationEnergyRange.Contains(formation))
            {
                energies[row] = double.NaN;
                string implied = entry.IsTotalEnergy ? " (implied by its total energy and the elemental references)" : string.Empty;
                problems.Add(new EntryEnergyProblem(entry.Id, row, EntryEnergyProblemKind.OutOfRange, null,
                    $"Entry '{entry.Id}' ({entry.Composition.Formula}): {FormationEnergyRange.Describe(formation)}{implied}; "
                    + "check the number and its energy basis."));
                continue;
            }

            energies[row] = formation;
        }

        ElementReference[] used = resolved.Values.OrderBy(r => r.Symbol, StringComparer.Ordinal).ToArray();
        return new FormationEnergySet(energies, used, problems);
    }

    /// <summary>
    /// The formation energy per atom of a candidate assessed against an existing hull: a formation energy passes
    /// through; a total energy takes the hull's own elemental references (<see cref="SystemHull.References"/>), the
    /// same ones its entries were placed with, so candidate and entries share one energy scale.
    /// </summary>
    /// <param name="candidate">The candidate, in any basis.</param>
    /// <param name="references">The references the hull used.</param>
    /// <exception cref="ThermoInputException">A total energy with an element the references lack; names the candidate and the element.</exception>
    public static double OfCandidate(PhaseEntry candidate, IReadOnlyList<ElementReference> references)
    {
        ArgumentNullException.ThrowIfNull(candidate);
        ArgumentNullException.ThrowIfNull(references);
        var byElement = new Dictionary<string, ElementReference>(StringComparer.Ordinal);
        if (candidate.IsTotalEnergy)
        {
            foreach (string symbol in candidate.Composition.Elements)
            {
                ElementReference? reference = references.FirstOrDefault(r => string.Equals(r.Symbol, symbol, StringComparison.Ordinal));
                if (reference is null)
                {
                    throw new ThermoInputException(
                        $"Candidate '{candidate.Id}' ({candidate.Composition.Formula}) is a total energy, but the hull has no elemental reference for {symbol}: "
                        + $"its entries hold no total-energy entry of pure {symbol} (missing elemental reference).",
                        entryId: candidate.Id,
                        element: symbol);
                }

                byElement[symbol] = reference;
            }
        }

        return FormationEvPerAtom(candidate, byElement);
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
        foreach (PhaseEntry entry in entries)
        {
            if (!entry.IsTotalEnergy)
            {
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
            }
        }

        return resolved;
    }

    /// <summary>The error for missing references: the first element, the entries that need it, the others missing.</summary>
    private static ThermoInputException MissingReferenceError(IReadOnlyList<PhaseEntry> entries, FormationEnergySet set)
    {
        var referenced = new HashSet<string>(set.References.Select(r => r.Symbol), StringComparer.Ordinal);
        var missing = new SortedDictionary<string, List<(string Id, int Row)>>(StringComparer.Ordinal);
        foreach (EntryEnergyProblem problem in set.Problems.Where(p => p.Kind == EntryEnergyProblemKind.MissingReference))
        {
            foreach (string symbol in entries[problem.RowIndex].Composition.Elements.Where(e => !referenced.Contains(e)))
            {
                if (!missing.TryGetValue(symbol, out var needing))
                {
                    missing[symbol] = needing = [];
                }

                needing.Add((problem.EntryId, problem.RowIndex));
            }
        }

        (string element, List<(string Id, int Row)> needers) = missing.First();
        string others = missing.Count > 1
            ? $" References are also missing for {string.Join(", ", missing.Keys.Skip(1))}."
            : string.Empty;
        string mixing = entries.Any(e => !e.IsTotalEnergy)
            ? " The set mixes formation and total energies; that is allowed only where every element in a total-energy entry has a reference."
            : string.Empty;
        return new ThermoInputException(
            string.Create(
                CultureInfo.InvariantCulture,
                $"No reference energy for element {element}: the total energies of {EntryList.Describe(needers)} need one. "
                + $"Add a pure-{element} entry with a total energy, or give an explicit reference for {element}.{others}{mixing}"),
            entryId: needers[0].Id,
            rowIndex: needers[0].Row,
            element: element,
            isMissingReference: true);
    }
}
