using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The stable phases of a dataset from the hulls of its maximal chemical systems. A phase stable in a subsystem is a
/// vertex of every hull that contains the subsystem (the restriction of a hull to a face is that face's hull), so
/// the union of the maximal hulls' vertices is every stable phase of the dataset, each listed once.
/// </summary>
public static class StablePhaseUnion
{
    /// <summary>
    /// Every hull's stable phases, each once, sorted by id (a synthetic elemental reference after an entry of the
    /// same id: an entry may be named like an element).
    /// </summary>
    public static IReadOnlyList<HullPhase> Of(IEnumerable<SystemHull> hulls)
    {
        ArgumentNullException.ThrowIfNull(hulls);
        var phases = new SortedDictionary<(string Id, bool IsSynthetic), HullPhase>(PhaseKeyOrder.Instance);
        foreach (SystemHull hull in hulls)
        {
            foreach (HullPhase phase in hull.StablePhases)
            {
                phases.TryAdd((phase.Id, phase.IsSynthetic), phase);
            }
        }

        return phases.Values.ToArray();
    }

    /// <summary>
    /// The stable phases of a whole-dataset analysis, each once, sorted like <see cref="Of(IEnumerable{SystemHull})"/>:
    /// every entry that is a hull vertex, and a synthetic elemental reference for each element that some hull system
    /// holds no entry of (it sits at 0 on the formation-energy axis). Systems the analysis could not answer add nothing.
    /// </summary>
    public static IReadOnlyList<HullPhase> Of(DatasetStabilityResult analysis)
    {
        ArgumentNullException.ThrowIfNull(analysis);
        var phases = new SortedDictionary<(string Id, bool IsSynthetic), HullPhase>(PhaseKeyOrder.Instance);
        foreach (EntryStability entry in analysis.Entries)
        {
            if (!entry.IsHullVertex) continue;
            phases.TryAdd(
                (entry.Id, false),
                new HullPhase(entry.Id, isSynthetic: false, entry.Composition, entry.AxisEnergyEvPerAtom, entry.FormationEnergyEvPerAtom));
        }

        foreach (string symbol in analysis.Coverage.SelectMany(c => c.ComponentsAtZeroByDefinition))
        {
            phases.TryAdd((symbol, true), new HullPhase(symbol, isSynthetic: true, Composition.OfElement(symbol), 0.0, 0.0));
        }

        return phases.Values.ToArray();
    }

    private sealed class PhaseKeyOrder : IComparer<(string Id, bool IsSynthetic)>
    {
        public static PhaseKeyOrder Instance { get; } = new();

        public int Compare((string Id, bool IsSynthetic) x, (string Id, bool IsSynthetic) y)
        {
            int byId = string.CompareOrdinal(x.Id, y.Id);
            return byId != 0 ? byId : x.IsSynthetic.CompareTo(y.IsSynthetic);
        }
    }
}
