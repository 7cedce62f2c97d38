using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>The highest dopant potential at one vertex of the host's window, and what sets it.</summary>
public sealed class HostVertexDopantLimit
{
    internal HostVertexDopantLimit(int hostVertex, double maxEv, IReadOnlyList<HullPhase> limitingPhases, bool atReference)
    {
        HostVertex = hostVertex;
        MaxDopantPotentialEv = maxEv;
        LimitingPhases = limitingPhases;
        DopantAtReference = atReference;
    }

    /// <summary>Index into the host window's vertices.</summary>
    public int HostVertex { get; }

    /// <summary>Highest Δμ of the dopant there (eV per dopant atom).</summary>
    public double MaxDopantPotentialEv { get; }

    /// <summary>The dopant's phases that form first (solubility-limiting), sorted by id; empty when the reference limits.</summary>
    public IReadOnlyList<HullPhase> LimitingPhases { get; }

    /// <summary>True when the dopant's own reference (Δμ = 0) is the limit there.</summary>
    public bool DopantAtReference { get; }
}
