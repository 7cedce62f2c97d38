namespace Hull.Core.Windows;

/// <summary>
/// A window (or a two-dimensional section of a larger one) in the plane of two potentials, ready to draw: its
/// vertices in boundary order, the constraints as lines in that plane, and what was held fixed. A window of
/// dimension 1 or 0 in the plane is a segment or a point and is kept as such. Immutable.
/// </summary>
public sealed class WindowMap
{
    internal WindowMap(
        StabilityWindow window, StabilityWindow drawn, string x, string y, string? dependent,
        IReadOnlyDictionary<string, double> fixedPotentials, IReadOnlyList<WindowMapVertex> vertices, IReadOnlyList<WindowMapLine> lines,
        bool defaultSection, IReadOnlyList<double>? nearest)
    {
        Window = window;
        Drawn = drawn;
        XElement = x;
        YElement = y;
        DependentElement = dependent;
        FixedPotentialsEv = fixedPotentials;
        Vertices = vertices;
        Lines = lines;
        SectionChosenByDefault = defaultSection;
        NearestPointEv = nearest;
    }

    /// <summary>The whole window.</summary>
    public StabilityWindow Window { get; }

    /// <summary>What is drawn: the window itself, or its section at <see cref="FixedPotentialsEv"/>.</summary>
    public StabilityWindow Drawn { get; }

    public string XElement { get; }

    public string YElement { get; }

    /// <summary>The element whose potential follows from the compound's equality; null on a two-element map.</summary>
    public string? DependentElement { get; }

    /// <summary>The section's fixed potentials (element → Δμ, eV); empty when the window itself is drawn.</summary>
    public IReadOnlyDictionary<string, double> FixedPotentialsEv { get; }

    /// <summary>True when the section was put at the mean of the window's vertices because none was given.</summary>
    public bool SectionChosenByDefault { get; }

    /// <summary>The drawn vertices: around the boundary for a polygon, end to end for a segment, one for a point.</summary>
    public IReadOnlyList<WindowMapVertex> Vertices { get; }

    /// <summary>The drawn region's dimension in the plane: 2, 1, 0, or −1 when nothing is drawn (no window, or a section that misses).</summary>
    public int Dimension => Drawn.Exists ? Drawn.Dimension : -1;

    /// <summary>Every competing, coexisting and reference constraint that is a line in the plane.</summary>
    public IReadOnlyList<WindowMapLine> Lines { get; }

    /// <summary>When a section misses the window: the window's point nearest to it (all potentials, eV).</summary>
    public IReadOnlyList<double>? NearestPointEv { get; }

    /// <summary>True when a section was asked for and it does not meet the window.</summary>
    public bool SectionMisses => Window.Exists && !Drawn.Exists;
}
