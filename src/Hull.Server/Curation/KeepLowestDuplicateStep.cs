using System.Text.Json.Nodes;
using Hull.Store;

namespace Hull.Server.Curation;

/// <summary>
/// Of entries with the same reduced composition and the same energy basis, keeps only the one lowest in energy per
/// atom (ties: the smallest id), as only the lowest can be on the hull. Bases are not mixed, as totals and formation
/// energies are not comparable.
/// </summary>
public sealed class KeepLowestDuplicateStep : ICurationStep
{
    public const string KindName = "keep_lowest_duplicate";

    public string Kind => KindName;

    public static KeepLowestDuplicateStep Read(StepParameters p) => new();

    public JsonObject Parameters() => [];

    public CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context)
    {
        var best = new Dictionary<(string, string), CurationEntry>();
        foreach (CurationEntry e in entries)
        {
            var key = (e.Phase.Composition.Reduced.HillFormula, e.Row.Basis);
            if (!best.TryGetValue(key, out CurationEntry? held) || IsBetter(e, held)) best[key] = e;
        }
        var kept = new HashSet<CurationEntry>(best.Values);
        return new(entries.Where(kept.Contains).ToList());
    }

    private static bool IsBetter(CurationEntry candidate, CurationEntry held) =>
        candidate.EnergyEvPerAtom < held.EnergyEvPerAtom
        || (candidate.EnergyEvPerAtom == held.EnergyEvPerAtom && EntryIdOrder.Comparer.Compare(candidate.Row.Id, held.Row.Id) < 0);
}
