using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>
/// The region of elemental chemical potentials (Δμ relative to the elemental references, eV per atom) in which one
/// compound is stable against every other phase of its chemical system: its vertices with their limiting phases,
/// its size, and the element-rich and element-lean vertices. A compound above the hull has none. Immutable.
/// </summary>
public sealed class StabilityWindow
{
    internal StabilityWindow(
        EntryStability compound,
        IReadOnlyList<string> elements,
        WindowKind kind,
        double? loweredByEvPerAtom,
        IReadOnlyList<HullPhase> coexistingPhases,
        IReadOnlyList<WindowVertex> vertices,
        Func<WindowSize>? size,
        IReadOnlyList<ElementExtremes> extremes)
    {
        Compound = compound;
        Elements = elements;
        Kind = kind;
        LoweredByEvPerAtom = loweredByEvPerAtom;
        CoexistingPhases = coexistingPhases;
        Vertices = vertices;
        _size = size is null ? null : new Lazy<WindowSize>(size, LazyThreadSafetyMode.ExecutionAndPublication);
        Extremes = extremes;
        Dimension = vertices.Count == 0 ? -1 : PolytopeMeasure.AffineDimension(vertices.Select(v => v.ChemicalPotentialsEv).ToArray());
    }

    /// <summary>The compound's stability against the hull (energy above hull, decomposition).</summary>
    public EntryStability Compound { get; }

    /// <summary>The elements, in the order of every vertex's potentials.</summary>
    public IReadOnlyList<string> Elements { get; }

    public WindowKind Kind { get; }

    /// <summary>True unless the compound is above the hull (and was not lowered).</summary>
    public bool Exists => Kind != WindowKind.AboveHull && Vertices.Count > 0;

    /// <summary>For <see cref="WindowKind.Lowered"/>: δ, how far below the hull the compound was placed (eV/atom).</summary>
    public double? LoweredByEvPerAtom { get; }

    /// <summary>
    /// For <see cref="WindowKind.LowerDimensional"/>: the hull phases the compound lies among (its decomposition),
    /// which are at their formation limit throughout the window and so are not repeated on each vertex.
    /// </summary>
    public IReadOnlyList<HullPhase> CoexistingPhases { get; }

    /// <summary>The vertices, sorted by descending potentials in element order.</summary>
    public IReadOnlyList<WindowVertex> Vertices { get; }

    private readonly Lazy<WindowSize>? _size;

    /// <summary>The size; null when there is no window. Computed on first use (it costs more than the vertices).</summary>
    public WindowSize? Size => _size?.Value;

    /// <summary>Per element, highest and lowest Δμ and where; empty when there is no window.</summary>
    public IReadOnlyList<ElementExtremes> Extremes { get; }

    /// <summary>The window's dimension: the affine dimension of its vertices (−1 when there is none).</summary>
    public int Dimension { get; }
}
