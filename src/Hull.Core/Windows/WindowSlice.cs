namespace Hull.Core.Windows;

/// <summary>A window with some potentials held fixed; when the slice misses, the nearest point of the window.</summary>
public sealed class WindowSlice
{
    internal WindowSlice(
        StabilityWindow whole, StabilityWindow slice, IReadOnlyList<string> fixedElements, IReadOnlyList<double> fixedValues,
        IReadOnlyList<double>? nearest, double? distance)
    {
        Whole = whole;
        Slice = slice;
        FixedElements = fixedElements;
        FixedPotentialsEv = fixedValues;
        NearestPointEv = nearest;
        DistanceEv = distance;
    }

    /// <summary>The unsliced window.</summary>
    public StabilityWindow Whole { get; }

    /// <summary>The slice: the part of the window at the fixed potentials (no vertices when it misses).</summary>
    public StabilityWindow Slice { get; }

    /// <summary>The fixed elements, in element-symbol order.</summary>
    public IReadOnlyList<string> FixedElements { get; }

    public IReadOnlyList<double> FixedPotentialsEv { get; }

    /// <summary>True when the compound has a window but the slice does not meet it.</summary>
    public bool Misses => Whole.Exists && !Slice.Exists;

    /// <summary>When the slice misses: the window's point nearest to the slice (all potentials, eV).</summary>
    public IReadOnlyList<double>? NearestPointEv { get; }

    /// <summary>When the slice misses: Euclidean distance over the fixed potentials from that point to the slice (eV).</summary>
    public double? DistanceEv { get; }
}
