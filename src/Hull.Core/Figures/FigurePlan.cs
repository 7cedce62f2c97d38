namespace Hull.Core.Figures;

/// <summary>What a figure will show: the stable phases, the unstable entries within the cut-off (furthest first,
/// so that the ones nearest the hull are drawn on top), the edges, and how many were left out.</summary>
internal sealed class FigurePlan
{
    public FigurePlan(FigureInput input, double cutoff)
    {
        Input = input;
        Cutoff = cutoff;
        Stable = input.Points.Where(p => p.IsStable).OrderBy(p => p.Id, StringComparer.Ordinal).ToArray();
        Unstable = input.Points
            .Where(p => !p.IsStable && p.EnergyAboveHullEvPerAtom <= cutoff)
            .OrderByDescending(p => p.EnergyAboveHullEvPerAtom)
            .ThenBy(p => p.Id, StringComparer.Ordinal)
            .ToArray();
        Hidden = input.Points.Count(p => !p.IsStable && p.EnergyAboveHullEvPerAtom > cutoff);
        ById = input.Points.ToDictionary(p => p.Id, StringComparer.Ordinal);
    }

    public FigureInput Input { get; }

    public double Cutoff { get; }

    public IReadOnlyList<FigurePoint> Stable { get; }

    public IReadOnlyList<FigurePoint> Unstable { get; }

    public int Hidden { get; }

    public IReadOnlyDictionary<string, FigurePoint> ById { get; }

    /// <summary>The component a point sits at the corner of, or -1.</summary>
    public static int CornerOf(FigurePoint p)
    {
        for (int k = 0; k < p.Fractions.Count; k++)
        {
            if (p.Fractions[k] == 1.0) return k;
        }

        return -1;
    }

    public string CompositionNote => Input.OverEndMembers
        ? "compositions as atom fractions of the end-members"
        : "compositions as atom fractions of the elements";

    public string Title => Input.OverEndMembers
        ? $"{Input.SystemName} pseudo-{KindWord} hull"
        : $"{Input.SystemName} hull";

    /// <summary>The words after the system's name in the heading.</summary>
    public string KindName => Input.OverEndMembers ? $"pseudo-{KindWord} hull" : "hull";

    private string KindWord => Input.Components.Count switch { 2 => "binary", 3 => "ternary", _ => "quaternary" };

    public FigureResult Result(string svg, FigureKind kind) =>
        new(svg, kind, Stable.Count, Input.Edges.Count, Unstable.Count, Hidden);
}
