namespace Hull.Core.Windows;

/// <summary>A vertex of a polytope with every constraint and coordinate bound that is tight there. Immutable.</summary>
public sealed class PolytopeVertex
{
    internal PolytopeVertex(double[] coordinates, int[] tightLabels, int[] tightLowerBounds, int[] tightUpperBounds)
    {
        Coordinates = coordinates;
        TightLabels = tightLabels;
        TightLowerBounds = tightLowerBounds;
        TightUpperBounds = tightUpperBounds;
    }

    /// <summary>The point, in the polytope's full coordinates.</summary>
    public IReadOnlyList<double> Coordinates { get; }

    /// <summary>Labels of the inequalities tight here, ascending.</summary>
    public IReadOnlyList<int> TightLabels { get; }

    /// <summary>Coordinates sitting at their lower bound, ascending.</summary>
    public IReadOnlyList<int> TightLowerBounds { get; }

    /// <summary>Coordinates sitting at their upper bound, ascending.</summary>
    public IReadOnlyList<int> TightUpperBounds { get; }
}
