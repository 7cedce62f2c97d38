using System.Text.Json.Nodes;
using Hull.Core.Thermo;

namespace Hull.Server.Curation;

/// <summary>
/// Drops entries more than <see cref="MaxEvPerAtom"/> above the hull of the entries before this step (formation
/// energy axis, as the stability call computes it). Total energies are measured from the source version's elemental
/// references (<see cref="CurationContext.SourceReferences"/>), the ones that version's own hulls use, so an earlier
/// step that drops an element's lowest entry does not move the scale. Entries the hull cannot place (an element with
/// no reference in the source either) are kept: the step removes only what it has shown to be far above the hull.
/// </summary>
public sealed class DropAboveHullStep(double maxEvPerAtom) : ICurationStep
{
    public const string KindName = "drop_above_hull";

    public double MaxEvPerAtom { get; } = maxEvPerAtom;

    public string Kind => KindName;

    public static DropAboveHullStep Read(StepParameters p)
    {
        double max = p.Number("max_ev_per_atom");
        if (max < 0) throw p.Error("max_ev_per_atom", $"must be 0 or more eV/atom, not {max}");
        return new DropAboveHullStep(max);
    }

    public JsonObject Parameters() => new() { ["max_ev_per_atom"] = MaxEvPerAtom };

    public CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context)
    {
        if (entries.Count == 0) return new(entries);
        DatasetStabilityResult result = DatasetStability.Analyze(entries.Select(e => e.Phase).ToList(), context.SourceReferences);
        var far = new HashSet<int>(result.Entries.Where(s => s.EnergyAboveHullEvPerAtom > MaxEvPerAtom).Select(s => s.RowIndex));
        return new(entries.Where((_, i) => !far.Contains(i)).ToList());
    }
}
