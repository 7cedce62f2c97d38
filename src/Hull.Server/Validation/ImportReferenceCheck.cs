using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Server.Errors;
using Hull.Store;

namespace Hull.Server.Validation;

/// <summary>
/// The import rule for total energies, checked against the version the batch builds on. Every stored version keeps
/// every formation energy that can be computed within <see cref="FormationEnergyRange"/>:
/// <list type="bullet">
/// <item>a total-energy row whose elements all have a reference (in the new version) must imply a formation energy in
/// range, else the batch is refused naming the row;</item>
/// <item>a total-energy row with an element that has no reference is accepted: analyses report its system as lacking
/// a reference until a pure-element total-energy entry (or an explicit reference in the query) supplies one;</item>
/// <item>a batch that changes an element's reference (a new lowest pure-element entry, a replaced or new one) is
/// refused when the new reference would put a stored entry outside the range, naming the batch row that sets the
/// reference and the stored entry.</item>
/// </list>
/// </summary>
public static class ImportReferenceCheck
{
    /// <summary>Stored entries named per refused reference change: the first few are enough to find the cause.</summary>
    private const int MaxStoredEntriesNamed = 5;

    /// <summary>
    /// The violations of <paramref name="rows"/> on top of a version whose ledger is <paramref name="ledger"/>, and the
    /// ledger of the version the batch would make.
    /// </summary>
    /// <param name="rows">The batch, already checked row by row (formulas parse, bases defined).</param>
    /// <param name="policy">The batch's duplicate policy (under replace, its rows supersede stored ones of the same id).</param>
    /// <param name="ledger">The base version's pure-element total-energy entries.</param>
    /// <param name="baseEntries">Reads the base version's entries; called only when the batch changes a reference.</param>
    /// <param name="rowsField">What the violations call the rows: "entries" for a request's, "staged" for a session's at commit.</param>
    /// <param name="rowIndexes">Each row's index in the violations' field names (a session's rows read in part keep
    /// their place in the whole session); null when it is the row's position in <paramref name="rows"/>. Under the
    /// reject policy, <paramref name="rows"/> may hold the total-energy rows only: the others neither set nor take a
    /// reference; under replace every row is needed, since any of them may supersede a stored reference.</param>
    public static async Task<(IReadOnlyList<FieldViolation> Violations, ReferenceLedger Next)> CheckAsync(
        IReadOnlyList<EntryRow> rows, DuplicatePolicy policy, ReferenceLedger ledger, Func<Task<IReadOnlyList<PhaseEntry>>> baseEntries,
        string rowsField = "entries", IReadOnlyList<int>? rowIndexes = null)
    {
        // Only total energies take or set references, so only they are parsed: a session can hold many rows.
        var totals = new List<(int Row, PhaseEntry Entry)>();
        for (int i = 0; i < rows.Count; i++)
        {
            EnergyBasis basis = Mapping.WireMapping.BasisOf(rows[i]);
            if (basis is EnergyBasis.TotalPerFormulaUnit or EnergyBasis.TotalPerAtom)
            {
                totals.Add((i, new PhaseEntry(rows[i].Id, Composition.Parse(rows[i].Formula), rows[i].EnergyEv, basis)));
            }
        }

        // Under the reject policy a repeated id fails the batch in the store anyway; either way the batch's row is
        // what the new version would hold.
        var batchIds = new HashSet<string>(rows.Select(r => r.Id), StringComparer.Ordinal);
        ReferenceLedger next = ledger.With(totals.Select(t => t.Entry), policy == DuplicatePolicy.Replace ? batchIds : []);

        var changed = new Dictionary<string, (ElementReference? Reference, int CauseRow)>(StringComparer.Ordinal);
        foreach (string element in ledger.Elements.Concat(next.Elements).Distinct())
        {
            ElementReference? before = ledger.ReferenceOf(element), after = next.ReferenceOf(element);
            if (before == after) continue;
            // The row that sets the new reference, else the row that replaced the old one.
            string causeId = after is not null && batchIds.Contains(after.SourceEntryId!) ? after.SourceEntryId! : before!.SourceEntryId!;
            changed[element] = (after, FindRow(rows, causeId));
        }

        var violations = new List<FieldViolation>();
        foreach ((int i, PhaseEntry entry) in totals)
        {
            if (ImpliedFormation(entry, next) is double formation && !FormationEnergyRange.Contains(formation))
            {
                violations.Add(new($"{rowsField}[{rowIndexes?[i] ?? i}].energy_ev",
                    $"id '{entry.Id}' ({rows[i].Formula}): {FormationEnergyRange.Describe(formation)}, implied by its total energy and the references "
                    + $"{DescribeReferences(entry, next)}; check the number and its energy basis"));
            }
        }

        if (changed.Count > 0)
        {
            var pushedOut = new SortedDictionary<int, List<string>>();
            foreach (PhaseEntry stored in await baseEntries().ConfigureAwait(false))
            {
                if (batchIds.Contains(stored.Id) && policy == DuplicatePolicy.Replace) continue;
                if (!stored.IsTotalEnergy) continue;
                string? element = stored.Composition.Elements.FirstOrDefault(changed.ContainsKey);
                if (element is null) continue;
                if (ImpliedFormation(stored, next) is double formation && !FormationEnergyRange.Contains(formation))
                {
                    int cause = changed[element].CauseRow;
                    if (!pushedOut.TryGetValue(cause, out List<string>? named)) pushedOut[cause] = named = [];
                    if (named.Count < MaxStoredEntriesNamed)
                    {
                        named.Add($"'{stored.Id}' ({stored.Composition.Formula}) at {FormationEnergyRange.Show(formation)} eV/atom");
                    }
                }
            }

            foreach ((int cause, List<string> named) in pushedOut)
            {
                Composition causeComposition = Composition.Parse(rows[cause].Formula);
                string element = causeComposition.Elements.Count == 1 ? causeComposition.Elements[0] : "its element";
                ElementReference? now = changed.Values.FirstOrDefault(c => c.CauseRow == cause).Reference;
                string setTo = now is null ? "leaves no reference" : $"sets the {element} reference to {FormationEnergyRange.Show(now.TotalEnergyEvPerAtom)} eV/atom";
                violations.Add(new($"{rowsField}[{rowIndexes?[cause] ?? cause}].energy_ev",
                    $"id '{rows[cause].Id}' {setTo}, which puts stored entries outside the accepted ±{FormationEnergyRange.MaxMagnitudeEvPerAtom:0} eV/atom "
                    + $"formation energy: {string.Join(", ", named)}; check the number, or replace those entries in the same import"));
            }
        }

        return (violations, next);
    }

    private static int FindRow(IReadOnlyList<EntryRow> rows, string id)
    {
        for (int i = 0; i < rows.Count; i++)
        {
            if (rows[i].Id == id) return i;
        }

        return -1;
    }

    /// <summary>The formation energy per atom a total-energy entry implies with the ledger's references; null when it
    /// is not a total energy or an element has no reference (accepted; reported by analyses).</summary>
    private static double? ImpliedFormation(PhaseEntry entry, ReferenceLedger ledger)
    {
        if (!entry.IsTotalEnergy) return null;
        double formation = entry.EnergyEvPerAtom;
        foreach (string element in entry.Composition.Elements)
        {
            if (ledger.ReferenceOf(element) is not { } reference) return null;
            formation -= entry.Composition.AtomicFraction(element) * reference.TotalEnergyEvPerAtom;
        }

        return formation;
    }

    private static string DescribeReferences(PhaseEntry entry, ReferenceLedger ledger) =>
        string.Join(", ", entry.Composition.Elements.Select(e => ledger.ReferenceOf(e)!)
            .Select(r => $"{r.Symbol} {FormationEnergyRange.Show(r.TotalEnergyEvPerAtom)} eV/atom from '{r.SourceEntryId}'"));
}
