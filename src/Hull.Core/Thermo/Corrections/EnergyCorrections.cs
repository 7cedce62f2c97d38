using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Corrections;

/// <summary>
/// Applies a <see cref="CorrectionSet"/> to a dataset's entries, in three steps, each per atom of the entry:
/// <list type="number">
/// <item>the method rule: a stated shift, or the alignment on a reference compound (the base method's lowest
/// energy per atom of it minus the method's own, both before any correction);</item>
/// <item>the species shifts: s · n_X / N for each shift of element X whose class matches the entry;</item>
/// <item>the fitted references: the elemental entries of X with a total energy move by μ_X − min_X, min_X the
/// lowest of them per atom after step 1, so formation energies are measured from μ_X. Entries given as
/// formation energies are already measured from the references and are left to steps 1 and 2.</item>
/// </list>
/// The set must fit the entries: each element it names is in some entry, each method it names is some entry's
/// tag, and each tag of an entry is the base method or has a rule.
/// </summary>
public static class EnergyCorrections
{
    /// <param name="entries">The entries, ids unique.</param>
    /// <param name="methods">Each entry's method tag (parallel to <paramref name="entries"/>); null for untagged.</param>
    /// <param name="set">The corrections.</param>
    /// <exception cref="ThermoInputException">Lengths that differ, or a set that does not fit the entries (the element,
    /// method or entry named), or a corrected energy that is not finite.</exception>
    public static CorrectionOutcome Apply(IReadOnlyList<PhaseEntry> entries, IReadOnlyList<string?> methods, CorrectionSet set)
    {
        ArgumentNullException.ThrowIfNull(set);
        EntryList.Validate(entries);
        ArgumentNullException.ThrowIfNull(methods);
        if (methods.Count != entries.Count)
        {
            throw new ThermoInputException($"Corrections: {entries.Count} entries but {methods.Count} method tags; give one per entry (null for none).");
        }

        var present = new HashSet<string>(entries.SelectMany(e => e.Composition.Elements), StringComparer.Ordinal);
        foreach (string symbol in set.FittedReferences.Select(r => r.Symbol).Concat(set.SpeciesShifts.Select(s => s.Symbol)))
        {
            if (!present.Contains(symbol))
            {
                throw new ThermoInputException(
                    $"Correction set '{set.Label}' corrects element {symbol}, which no entry of the dataset holds; remove it or correct another dataset.",
                    element: symbol);
            }
        }

        double[] methodShift = MethodShifts(entries, methods, set);

        var species = new double[entries.Count];
        for (int i = 0; i < entries.Count; i++)
        {
            Composition composition = entries[i].Composition;
            foreach (SpeciesShift shift in set.SpeciesShifts)
            {
                if (shift.AppliesTo(composition)) species[i] += shift.ShiftEvPerAtom * composition.AtomicFraction(shift.Symbol);
            }
        }

        var reference = new double[entries.Count];
        foreach (FittedElementReference fitted in set.FittedReferences)
        {
            int[] elemental = Enumerable.Range(0, entries.Count)
                .Where(i => entries[i].IsTotalEnergy && entries[i].Composition.IsSingleElement && entries[i].Composition.Contains(fitted.Symbol))
                .ToArray();
            if (elemental.Length == 0)
            {
                throw new ThermoInputException(
                    $"Correction set '{set.Label}' fits the reference of {fitted.Symbol}, but the dataset has no elemental {fitted.Symbol} entry "
                    + "with a total energy to move onto it.", element: fitted.Symbol);
            }

            double lowest = elemental.Min(i => entries[i].EnergyEvPerAtom + methodShift[i]);
            foreach (int i in elemental) reference[i] = fitted.EnergyEvPerAtom - lowest;
        }

        var corrected = new CorrectedEntry[entries.Count];
        for (int i = 0; i < entries.Count; i++)
        {
            PhaseEntry raw = entries[i];
            double perAtom = methodShift[i] + species[i] + reference[i];
            PhaseEntry moved = raw;
            if (perAtom != 0)
            {
                double energy = raw.Basis is EnergyBasis.TotalPerFormulaUnit or EnergyBasis.FormationPerFormulaUnit
                    ? raw.EnergyEv + perAtom * raw.Composition.AtomsPerFormulaUnit.ToDouble()
                    : raw.EnergyEv + perAtom;
                if (!double.IsFinite(energy))
                {
                    throw new ThermoInputException(
                        string.Create(CultureInfo.InvariantCulture, $"Entry '{raw.Id}': its corrected energy is not finite ({energy} eV)."),
                        entryId: raw.Id, rowIndex: i);
                }

                moved = new PhaseEntry(raw.Id, raw.Composition, energy, raw.Basis);
            }

            corrected[i] = new CorrectedEntry(raw, moved, methods[i], methodShift[i], species[i], reference[i]);
        }

        return new CorrectionOutcome(set, corrected);
    }

    private static double[] MethodShifts(IReadOnlyList<PhaseEntry> entries, IReadOnlyList<string?> methods, CorrectionSet set)
    {
        var tags = new HashSet<string>(methods.OfType<string>(), StringComparer.Ordinal);
        foreach (MethodRule rule in set.MethodRules)
        {
            if (!tags.Contains(rule.Method))
            {
                throw new ThermoInputException(
                    $"Correction set '{set.Label}' has a rule for method '{rule.Method}', but no entry is tagged with it; "
                    + $"the dataset's methods are: {Describe(tags)}.");
            }
        }

        var shiftOf = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (MethodRule rule in set.MethodRules)
        {
            shiftOf[rule.Method] = rule.ShiftEvPerAtom ?? Alignment(entries, methods, set, rule);
        }

        var shifts = new double[entries.Count];
        for (int i = 0; i < entries.Count; i++)
        {
            string? tag = methods[i];
            if (tag is null || string.Equals(tag, set.BaseMethod, StringComparison.Ordinal)) continue;
            if (!shiftOf.TryGetValue(tag, out double shift))
            {
                throw new ThermoInputException(
                    $"Entry '{entries[i].Id}' is tagged with method '{tag}', which correction set '{set.Label}' has no rule for "
                    + $"(its base method is '{set.BaseMethod}'); add a shift or an alignment for it.",
                    entryId: entries[i].Id, rowIndex: i);
            }

            shifts[i] = shift;
        }

        return shifts;
    }

    // The base method's lowest energy per atom of the reference compound minus the rule's method's.
    private static double Alignment(IReadOnlyList<PhaseEntry> entries, IReadOnlyList<string?> methods, CorrectionSet set, MethodRule rule)
    {
        Composition compound = rule.ReferenceCompound!;
        PhaseEntry? onBase = Lowest(entries, methods, compound, tag => tag is null || string.Equals(tag, set.BaseMethod, StringComparison.Ordinal));
        PhaseEntry? onMethod = Lowest(entries, methods, compound, tag => string.Equals(tag, rule.Method, StringComparison.Ordinal));
        string missing = onBase is null ? $"the base method '{set.BaseMethod}'" : $"method '{rule.Method}'";
        if (onBase is null || onMethod is null)
        {
            throw new ThermoInputException(
                $"Correction set '{set.Label}' aligns method '{rule.Method}' on {compound.ReducedFormula}, but no entry of that composition "
                + $"is computed with {missing}.");
        }

        if (onBase.IsTotalEnergy != onMethod.IsTotalEnergy)
        {
            throw new ThermoInputException(
                $"Correction set '{set.Label}' aligns method '{rule.Method}' on {compound.ReducedFormula}, but entry '{onBase.Id}' and entry "
                + $"'{onMethod.Id}' give different kinds of energy (total and formation); align on entries of one kind.",
                entryId: onMethod.Id);
        }

        return onBase.EnergyEvPerAtom - onMethod.EnergyEvPerAtom;
    }

    private static PhaseEntry? Lowest(IReadOnlyList<PhaseEntry> entries, IReadOnlyList<string?> methods, Composition compound, Func<string?, bool> takes)
    {
        PhaseEntry? lowest = null;
        for (int i = 0; i < entries.Count; i++)
        {
            if (!takes(methods[i]) || !entries[i].Composition.HasSameProportions(compound)) continue;
            if (lowest is null || entries[i].EnergyEvPerAtom < lowest.EnergyEvPerAtom) lowest = entries[i];
        }

        return lowest;
    }

    private static string Describe(HashSet<string> tags) =>
        tags.Count == 0 ? "none (no entry has a method tag)" : string.Join(", ", tags.Order(StringComparer.Ordinal).Select(t => $"'{t}'"));
}
