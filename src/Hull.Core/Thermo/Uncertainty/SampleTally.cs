using System.Collections.Concurrent;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// Every sample's reading of every entry (vertex or not, energy above hull, decomposition), stored by sample index so
/// that parallel samples never share a slot and the summary sums in sample order. Decompositions and stable sets are
/// interned as sorted canonical point indices.
/// </summary>
internal sealed class SampleTally
{
    private readonly int _entries;
    private readonly ConcurrentDictionary<int[], int> _keyIds = new(KeyComparer.Instance);
    private readonly List<int[]> _keys = [];
    private readonly Lock _keysLock = new();
    private double[][] _above;
    private bool[][] _vertex;
    private int[][] _products;
    private int[] _stableSets = [];
    private int[] _rebuilt = [];
    private long[] _vertexCounts;

    public SampleTally(int entries)
    {
        _entries = entries;
        _above = new double[entries][];
        _vertex = new bool[entries][];
        _products = new int[entries][];
        for (int e = 0; e < entries; e++)
        {
            _above[e] = [];
            _vertex[e] = [];
            _products[e] = [];
        }

        _vertexCounts = new long[entries];
    }

    /// <summary>Samples recorded so far (0 .. Count − 1).</summary>
    public int Count { get; private set; }

    /// <summary>
    /// Draws samples <paramref name="first"/> .. first + count − 1 on up to <paramref name="threads"/> threads. The
    /// loop checks <paramref name="cancellation"/> before each sample and, once cancelled, throws after the samples
    /// under way have finished (none is left running).
    /// </summary>
    public void Run(SamplingSetup setup, ulong seed, int first, int count, int threads, CancellationToken cancellation)
    {
        Grow(first + count);
        // Each thread keeps one solver for its samples; a sample's answer depends on nothing the solver kept.
        Parallel.For(first, first + count, new ParallelOptions { MaxDegreeOfParallelism = threads, CancellationToken = cancellation },
            () => setup.Local is null ? null : new SampleSolver(setup.Local),
            (s, _, solver) =>
            {
                StabilitySampling.SampleOne(setup, seed, s, this, s, solver);
                return solver;
            },
            _ => { });
        for (int e = 0; e < _entries; e++)
        {
            bool[] flags = _vertex[e];
            for (int s = first; s < first + count; s++)
            {
                if (flags[s])
                {
                    _vertexCounts[e]++;
                }
            }
        }

        Count = first + count;
    }

    public void Record(int entry, int sample, bool isVertex, double aboveEvPerAtom, int[] products)
    {
        _vertex[entry][sample] = isVertex;
        _above[entry][sample] = aboveEvPerAtom;
        _products[entry][sample] = Intern(products);
    }

    public void RecordStableSet(int sample, int[] vertexPoints, int pointsRebuilt)
    {
        _stableSets[sample] = Intern(vertexPoints);
        _rebuilt[sample] = pointsRebuilt;
    }

    /// <summary>Sample <paramref name="sample"/>'s reading of entry <paramref name="entry"/> (decomposition as canonical point indices).</summary>
    public (bool IsVertex, double AboveEvPerAtom, int[] Products) Reading(int entry, int sample) =>
        (_vertex[entry][sample], _above[entry][sample], _keys[_products[entry][sample]]);

    /// <summary>Sample <paramref name="sample"/>'s hull vertices (canonical point indices, ascending).</summary>
    public int[] StableSet(int sample) => _keys[_stableSets[sample]];

    /// <summary>The largest √(p(1−p)/N) over the entries.</summary>
    public double LargestVertexStandardError()
    {
        double largest = 0;
        foreach (long c in _vertexCounts)
        {
            largest = Math.Max(largest, StandardErrorOfFraction(c, Count));
        }

        return largest;
    }

    public StabilitySamplingResult Summarise(SamplingSetup setup, SamplingPlan plan, SamplingStopReason reason)
    {
        SystemHull plain = setup.Plain;
        int n = Count;
        var odds = new List<(int Row, EntryStabilityOdds Odds)>(_entries);
        var probable = new List<string>();
        for (int e = 0; e < _entries; e++)
        {
            int i = setup.EntryPoints[e];
            HullPoint point = plain.PointAt(i);
            string id = point.Phase.Id;
            double p = (double)_vertexCounts[e] / n;
            double[] values = _above[e].AsSpan(0, n).ToArray();
            // Summed as differences from the first value, so that equal values give that value exactly.
            double sum = 0;
            foreach (double v in values)
            {
                sum += v - values[0];
            }

            double mean = values[0] + sum / n;
            double squares = 0;
            foreach (double v in values)
            {
                squares += (v - mean) * (v - mean);
            }

            Array.Sort(values);
            (int[] mode, int modeCount) = Mode(_products[e], n);
            EntryStability plainEntry = plain.GetEntry(id);
            odds.Add((point.RowIndex, new EntryStabilityOdds(
                id,
                point.Entry!.Composition.Formula,
                setup.Sigma[i],
                setup.GroupOf[i] >= 0 ? setup.Groups[setup.GroupOf[i]].Name : null,
                p,
                StandardErrorOfFraction(_vertexCounts[e], n),
                mean,
                Math.Sqrt(squares / (n - 1) / n),
                Percentile(values, 0.05),
                Percentile(values, 0.95),
                mode.Select(k => plain.PointAt(k).Phase.Id).ToArray(),
                (double)modeCount / n,
                plainEntry.IsHullVertex,
                plainEntry.EnergyAboveHullEvPerAtom)));
            if (p >= 0.5)
            {
                probable.Add(id);
            }
        }

        (int[] stableSet, int stableCount) = Mode(_stableSets, n);
        return new StabilitySamplingResult(
            plain.SystemName,
            HullAxis.FormationEnergy,
            plain.References,
            odds.OrderBy(o => o.Row).Select(o => o.Odds).ToArray(),
            probable,
            stableSet.Where(k => plain.PointAt(k).Entry is not null).Select(k => plain.PointAt(k).Phase.Id).ToArray(),
            (double)stableCount / n,
            n,
            plan.Seed,
            reason,
            plan.TargetStandardError,
            LargestVertexStandardError(),
            setup.Groups,
            _rebuilt.AsSpan(0, n).ToArray().Average());
    }

    /// <summary>The percentile by linear interpolation between order statistics at rank (N − 1) q (common practice;
    /// NumPy's default "linear" method).</summary>
    internal static double Percentile(double[] sorted, double q)
    {
        double h = (sorted.Length - 1) * q;
        int lo = (int)Math.Floor(h);
        int hi = Math.Min(lo + 1, sorted.Length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    private static double StandardErrorOfFraction(long hits, int n)
    {
        double p = (double)hits / n;
        return Math.Sqrt(p * (1 - p) / n);
    }

    // The most frequent key; ties go to the smallest key in canonical order, so the answer is deterministic.
    private (int[] Key, int Count) Mode(int[] ids, int n)
    {
        var counts = new Dictionary<int, int>();
        for (int s = 0; s < n; s++)
        {
            counts[ids[s]] = counts.GetValueOrDefault(ids[s]) + 1;
        }

        int best = -1;
        int bestCount = 0;
        foreach ((int id, int c) in counts)
        {
            if (c > bestCount || (c == bestCount && KeyComparer.Compare(_keys[id], _keys[best]) < 0))
            {
                best = id;
                bestCount = c;
            }
        }

        return (_keys[best], bestCount);
    }

    private int Intern(int[] key)
    {
        if (_keyIds.TryGetValue(key, out int id))
        {
            return id;
        }

        lock (_keysLock)
        {
            if (_keyIds.TryGetValue(key, out id))
            {
                return id;
            }

            id = _keys.Count;
            _keys.Add(key);
            _keyIds[key] = id;
            return id;
        }
    }

    private void Grow(int total)
    {
        if (_stableSets.Length >= total)
        {
            return;
        }

        int capacity = Math.Max(total, Math.Min(2 * _stableSets.Length, SamplingLimits.MaxSamples));
        Array.Resize(ref _stableSets, capacity);
        Array.Resize(ref _rebuilt, capacity);
        for (int e = 0; e < _entries; e++)
        {
            Array.Resize(ref _above[e], capacity);
            Array.Resize(ref _vertex[e], capacity);
            Array.Resize(ref _products[e], capacity);
        }
    }

    private sealed class KeyComparer : IEqualityComparer<int[]>
    {
        public static KeyComparer Instance { get; } = new();

        public bool Equals(int[]? x, int[]? y) => x.AsSpan().SequenceEqual(y);

        public int GetHashCode(int[] key)
        {
            var hash = new HashCode();
            foreach (int k in key)
            {
                hash.Add(k);
            }

            return hash.ToHashCode();
        }

        public static int Compare(int[] x, int[] y) => x.AsSpan().SequenceCompareTo(y);
    }
}
