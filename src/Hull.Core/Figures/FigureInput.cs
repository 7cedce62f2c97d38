using Hull.Core.Thermo;

namespace Hull.Core.Figures;

/// <summary>
/// What a phase diagram draws, taken from a hull: its components, every phase at its composition with its energy
/// and distance above the hull, the hull's edges, the plotted energy's name and unit, and the data's provenance.
/// </summary>
public sealed class FigureInput
{
    public FigureInput(
        IReadOnlyList<string> components,
        bool overEndMembers,
        IReadOnlyList<FigurePoint> points,
        IReadOnlyList<FigureEdge> edges,
        EnergyAxis axis,
        FigureMetadata metadata)
    {
        ArgumentNullException.ThrowIfNull(components);
        ArgumentNullException.ThrowIfNull(points);
        ArgumentNullException.ThrowIfNull(edges);
        ArgumentNullException.ThrowIfNull(axis);
        ArgumentNullException.ThrowIfNull(metadata);
        Components = components;
        OverEndMembers = overEndMembers;
        Points = points;
        Edges = edges;
        Axis = axis;
        Metadata = metadata;
        var ids = new HashSet<string>(StringComparer.Ordinal);
        foreach (FigurePoint p in points)
        {
            if (p.Fractions.Count != components.Count)
            {
                throw new FigureInputException(
                    $"Phase '{p.Id}' has {p.Fractions.Count} fractions for {components.Count} components.", nameof(points));
            }

            if (!double.IsFinite(p.EnergyEvPerAtom) || !double.IsFinite(p.EnergyAboveHullEvPerAtom) || p.Fractions.Any(f => !double.IsFinite(f)))
            {
                throw new FigureInputException($"Phase '{p.Id}' has a non-finite energy or fraction.", nameof(points));
            }

            if (!ids.Add(p.Id)) throw new FigureInputException($"Phase id '{p.Id}' appears twice.", nameof(points));
        }

        foreach (FigureEdge e in edges)
        {
            if (!ids.Contains(e.FirstId) || !ids.Contains(e.SecondId))
            {
                throw new FigureInputException($"Edge {e.FirstId} - {e.SecondId} names a phase that is not in the figure.", nameof(edges));
            }
        }
    }

    /// <summary>Component names in hull order (element symbols, or end-member formulas).</summary>
    public IReadOnlyList<string> Components { get; }

    /// <summary>True when the components are compound end-members (composition axes are end-member atom fractions).</summary>
    public bool OverEndMembers { get; }

    /// <summary>Every phase, stable or not.</summary>
    public IReadOnlyList<FigurePoint> Points { get; }

    /// <summary>The hull's edges: every tie-line, from the coplanar faces.</summary>
    public IReadOnlyList<FigureEdge> Edges { get; }

    public EnergyAxis Axis { get; }

    public FigureMetadata Metadata { get; }

    /// <summary>The system's name: components joined by '-'.</summary>
    public string SystemName => string.Join('-', Components);

    /// <summary>
    /// The figure of a hull: every entry at its component atom fractions with its hull-axis energy, the stable
    /// phases (synthetic references at their corner), and every tie-line.
    /// </summary>
    /// <param name="hull">The hull, over elements or end-members.</param>
    /// <param name="metadata">The data's provenance.</param>
    /// <remarks>The energy axis's name and unit are the hull's own (<see cref="SystemHull.Axis"/>).</remarks>
    public static FigureInput FromHull(SystemHull hull, FigureMetadata metadata)
    {
        ArgumentNullException.ThrowIfNull(hull);
        EnergyAxis axis = EnergyAxis.Of(hull.Axis);
        var points = new List<FigurePoint>(hull.PointCount);
        foreach (var (entry, fractions, energy, above, isVertex) in hull.PlotPoints())
        {
            points.Add(new FigurePoint(entry.Id, entry.Composition.Formula, fractions, energy, above, isVertex));
        }

        foreach (HullPhase phase in hull.StablePhases.Where(p => p.IsSynthetic))
        {
            int corner = IndexOf(hull.Components, phase.Id);
            double[] fractions = hull.Components.Select((_, k) => k == corner ? 1.0 : 0.0).ToArray();
            points.Add(new FigurePoint(phase.Id, phase.Composition.Formula, fractions, phase.AxisEnergyEvPerAtom, 0.0, true));
        }

        FigureEdge[] edges = hull.TieLines.Select(t => new FigureEdge(t.First.Id, t.Second.Id)).ToArray();
        return new FigureInput(hull.Components, hull.EndMembers is not null, points, edges, axis, metadata);
    }

    private static int IndexOf(IReadOnlyList<string> names, string name)
    {
        for (int k = 0; k < names.Count; k++)
        {
            if (string.Equals(names[k], name, StringComparison.Ordinal)) return k;
        }

        throw new InvalidOperationException($"Synthetic reference {name} is not a component.");
    }
}
