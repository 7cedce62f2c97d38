namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// Every sample's reading of every entry (vertex or not, energy above hull, decomposition), one row per sample: a
/// sample's worker hands its whole row over at once, into a place of its own (rows of different samples share no
/// memory but at their ends). Each worker interns its decompositions and stable sets (sorted canonical point
/// indices) in its own <see cref="SampleKeys"/>; once the samples are done their ids are merged into the tally's,
/// in sample order, so the tally is the same whichever worker drew which sample.
/// </summary>
internal sealed class SampleTally
{
    private readonly int _entries;
    private readonly SampleKeys _keys = new();
    private readonly List<SampleScratch> _workers = [];
    private SamplingSetup? _setup;
    private double[] _above = [];
    private bool[] _vertex = [];
    private int[] _products = [];
    private int[] _stableSets = [];
    private int[] _rebuilt = [];
    private int[] _workerOf = [];
    private readonly long[] _vertexCounts;

    public SampleTally(int entries)
    {
        _entries = entries;
        _vertexCounts = new long[entries];
    }

    /// <summary>Samples recorded so far (0 .. Count − 1).</summary>
    public int Count { get; private set; }

    /// <summary>
    /// Draws samples <paramref name="first"/> .. first + count − 1 on up to <paramref name="threads"/> workers, each
    /// taking the next sample not yet taken. A worker checks <paramref name="cancellation"/> before each sample; once
    /// it is cancelled, the call throws after the samples under way have finished (none is left running).
    /// </summary>
    public void Run(SamplingSetup setup, ulong seed, int first, int count, int threads, CancellationToken cancellation)
    {
        if (_setup is not null && !ReferenceEquals(_setup, setup))
        {
            throw new InvalidOperationException("A tally samples one setup.");
        }

        _setup = setup;
        Grow(first + count);
        int workers = Math.Max(1, Math.Min(threads, count));
        // Each worker keeps its scratch (and solver) from call to call; a sample's answer depends on nothing kept.
        while (_workers.Count < workers)
        {
            _workers.Add(new SampleScratch(setup));
        }

        int next = first - 1;
        int end = first + count;
        Parallel.For(0, workers, new ParallelOptions { MaxDegreeOfParallelism = workers }, (w, state) =>
        {
            SampleScratch scratch = _workers[w];
            while (!state.ShouldExitCurrentIteration && !cancellation.IsCancellationRequested)
            {
                int s = Interlocked.Increment(ref next);
                if (s >= end)
                {
                    break;
                }

                _workerOf[s] = w;
                StabilitySampling.SampleOne(setup, seed, s, this, scratch);
            }
        });
        cancellation.ThrowIfCancellationRequested();
        Merge(first, end);
        Count = end;
    }

    /// <summary>
    /// Sample <paramref name="sample"/>'s row from <paramref name="scratch"/> (its worker's): per entry vertex flag,
    /// energy above hull and decomposition id, the stable set's id (both in the worker's keys) and how many points
    /// the sample's hull was rebuilt over.
    /// </summary>
    public void RecordRow(int sample, SampleScratch scratch, int stableSet, int pointsRebuilt)
    {
        int at = sample * _entries;
        scratch.RowVertex.AsSpan().CopyTo(_vertex.AsSpan(at, _entries));
        scratch.RowAbove.AsSpan().CopyTo(_above.AsSpan(at, _entries));
        scratch.RowProducts.AsSpan().CopyTo(_products.AsSpan(at, _entries));
        _stableSets[sample] = stableSet;
        _rebuilt[sample] = pointsRebuilt;
    }

    /// <summary>Sample <paramref name="sample"/>'s reading of entry <paramref name="entry"/> (decomposition as canonical point indices).</summary>
    public (bool IsVertex, double AboveEvPerAtom, int[] Products) Reading(int entry, int sample)
    {
        int at = sample * _entries + entry;
        return (_vertex[at], _above[at], _keys[_products[at]]);
    }

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
        var values = new double[n];
        for (int e = 0; e < _entries; e++)
        {
            int i = setup.EntryPoints[e];
            HullPoint point = plain.PointAt(i);
            string id = point.Phase.Id;
            double p = (double)_vertexCounts[e] / n;
            for (int s = 0; s < n; s++)
            {
                values[s] = _above[s * _entries + e];
            }

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
            (int[] mode, int modeCount) = Mode(_products, e, _entries, n);
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

        (int[] stableSet, int stableCount) = Mode(_stableSets, 0, 1, n);
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

    // The most frequent key among ids[start + s·stride] for s < n; ties go to the smallest key in canonical order,
    // so the answer is deterministic.
    private (int[] Key, int Count) Mode(int[] ids, int start, int stride, int n)
    {
        var counts = new Dictionary<int, int>();
        for (int s = 0; s < n; s++)
        {
            int id = ids[start + s * stride];
            counts[id] = counts.GetValueOrDefault(id) + 1;
        }

        int best = -1;
        int bestCount = 0;
        foreach ((int id, int c) in counts)
        {
            if (c > bestCount || (c == bestCount && SampleKeys.Compare(_keys[id], _keys[best]) < 0))
            {
                best = id;
                bestCount = c;
            }
        }

        return (_keys[best], bestCount);
    }

    // The workers' key ids of samples [first, end) become the tally's, met in sample order, and the vertex flags are counted.
    private void Merge(int first, int end)
    {
        for (int s = first; s < end; s++)
        {
            SampleScratch worker = _workers[_workerOf[s]];
            _stableSets[s] = TallyId(worker, _stableSets[s]);
            int at = s * _entries;
            for (int e = 0; e < _entries; e++)
            {
                _products[at + e] = TallyId(worker, _products[at + e]);
                if (_vertex[at + e])
                {
                    _vertexCounts[e]++;
                }
            }
        }
    }

    private int TallyId(SampleScratch worker, int id)
    {
        List<int> ids = worker.TallyIds;
        while (ids.Count <= id)
        {
            ids.Add(-1);
        }

        if (ids[id] < 0)
        {
            ids[id] = _keys.InternShared(worker.Keys[id]);
        }

        return ids[id];
    }

    private void Grow(int total)
    {
        if (_stableSets.Length >= total)
        {
            return;
        }

        // Doubling, but never past the work limit's number of samples (every row holds every entry).
        long cap = Math.Min(SamplingLimits.MaxSamples, SamplingLimits.MaxSampledValues / Math.Max(1, _entries));
        int capacity = (int)Math.Max(total, Math.Min(2L * _stableSets.Length, cap));
        Array.Resize(ref _stableSets, capacity);
        Array.Resize(ref _rebuilt, capacity);
        Array.Resize(ref _workerOf, capacity);
        Array.Resize(ref _above, capacity * _entries);
        Array.Resize(ref _vertex, capacity * _entries);
        Array.Resize(ref _products, capacity * _entries);
    }
}
