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
