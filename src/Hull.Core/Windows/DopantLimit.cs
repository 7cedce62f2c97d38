using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>
/// How high a dopant's chemical potential may go while the host stays stable and no phase of the dopant with the
/// host's elements forms: per vertex of the host's window, and over the whole extended (host + dopant) polytope,
/// whose vertices are served too. Immutable.
/// </summary>
public sealed class DopantLimit
{
    internal DopantLimit(
        string dopant, StabilityWindow host, IReadOnlyList<HostVertexDopantLimit> perHostVertex,
        IReadOnlyList<string> extendedElements, IReadOnlyList<WindowVertex> extendedVertices, int dopantPhaseCount)
    {
        Dopant = dopant;
        Host = host;
        PerHostVertex = perHostVertex;
        ExtendedElements = extendedElements;
        ExtendedVertices = extendedVertices;
        DopantPhaseCount = dopantPhaseCount;
    }

    public string Dopant { get; }

    /// <summary>The host's window (when the host has none, no limits follow).</summary>
    public StabilityWindow Host { get; }

    /// <summary>One per host vertex, in the host window's vertex order.</summary>
    public IReadOnlyList<HostVertexDopantLimit> PerHostVertex { get; }

    /// <summary>The host's elements then the dopant: the order of the extended vertices' potentials.</summary>
    public IReadOnlyList<string> ExtendedElements { get; }

    /// <summary>
    /// The vertices of the extended polytope on its upper surface (where a dopant phase or the dopant's reference
    /// limits), highest dopant potential first. The first is the overall limit.
    /// </summary>
    public IReadOnlyList<WindowVertex> ExtendedVertices { get; }

    /// <summary>Stable phases containing the dopant that took part (the dopant's reference aside).</summary>
    public int DopantPhaseCount { get; }

    /// <summary>True when the host has a window and so limits exist.</summary>
    public bool Exists => ExtendedVertices.Count > 0;

    /// <summary>The highest dopant Δμ anywhere in the host's window (eV per dopant atom).</summary>
    public double OverallMaxEv => Exists ? ExtendedVertices[0].ChemicalPotentialsEv[^1] : double.NaN;

    /// <summary>The extended vertex where the overall limit is reached.</summary>
    public WindowVertex? OverallVertex => Exists ? ExtendedVertices[0] : null;

    /// <summary>The phases limiting the dopant at the overall maximum.</summary>
    public IReadOnlyList<HullPhase> OverallLimitingPhases =>
        OverallVertex?.LimitingPhases.Where(p => p.Composition.Contains(Dopant)).ToArray() ?? [];
}
