using Hull.Core.Geometry;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// What the per-sample hull programs share: for every composition of the system, the plain hull's program there
/// ("lowest Σ w_j E_j with Σ w_j x_j = x_c over every other composition") with its optimal basis and plane, the few
/// points nearest that plane, and the plain reduced cost from which every other point lies further above it.
/// </summary>
/// <remarks>
/// A sample moves every energy by its error δ_j. For a point j of c's face, its reduced cost against the sample's
/// plane μ is E_j + δ_j − μ·x_j = r0_j + δ_j − (μ − μ0)·x_j, where r0_j is its plain reduced cost against the plain
/// plane μ0; the fractions x_j are non-negative and sum to 1, so that is at least r0_j + min δ − max_k (μ − μ0)_k,
/// min δ the lowest error among the points of c's face.
/// The sample's program is therefore solved over the near points only, and its optimum holds over every point when
/// <see cref="Threshold"/> + min δ − max_k (μ − μ0)_k stays at or above the solver's entering threshold; otherwise it
/// is solved over the whole face (see <see cref="SampleSolver"/>).
/// The same argument with μ = μ0 + min δ (every component alike) bounds the sample's optimum from below by
/// <see cref="PlainValue"/> + min δ: a composition whose representative lies below that needs no program at all.
/// </remarks>
internal sealed class LocalPrograms
{
    /// <summary>
    /// Points kept nearest each composition's plain plane (besides the face's pure points and the plain basis):
    /// enough that a sample's optimum is usually among them, few enough that each program prices a short list.
    /// </summary>
    public const int NearPoints = 48;

    /// <summary>
    /// Points of each face kept in order of their plain reduced cost (the near ones first): a sample's optimum over
    /// the near points is checked against these one by one, until the bound covers the rest.
    /// </summary>
    public const int RankedPoints = 384;

    /// <summary>The fast programs take systems of up to this many components (each near list stays short).</summary>
    public const int MaxComponents = 16;

    private LocalPrograms(HullInput input) => Input = input;

    /// <summary>The plain hull's points in canonical order at their plain energies.</summary>
    public HullInput Input { get; }

    /// <summary>Composition id of each point.</summary>
    public int[] CompositionOf => Input.CompositionOf;

    /// <summary>Number of distinct compositions.</summary>
    public int CompositionCount => Input.CompositionCount;

    /// <summary>Per composition, its components, ascending.</summary>
    public int[][] Components { get; private init; } = [];

    /// <summary>Per composition, its components as bits.</summary>
    public ulong[] Masks { get; private init; } = [];

    /// <summary>Per composition, its points (ascending).</summary>
    public int[][] PointsOf { get; private init; } = [];

    /// <summary>Per composition, whether it is one pure component.</summary>
    public bool[] IsPure { get; private init; } = [];

    /// <summary>Per composition, the points of its face nearest its plain plane (ascending; none of its own).</summary>
    public int[][] Near { get; private init; } = [];

    /// <summary>Per composition, the points of its face nearest its plain plane in order of plain reduced cost, up to <see cref="RankedPoints"/>.</summary>
    public int[][] Ranked { get; private init; } = [];

    /// <summary>Per composition, the plain reduced cost of each point of <see cref="Ranked"/> (eV/atom, ascending).</summary>
    public double[][] RankedCost { get; private init; } = [];

    /// <summary>Per composition, the lowest plain reduced cost of a point of its face not in <see cref="Ranked"/> (eV/atom).</summary>
    public double[] Threshold { get; private init; } = [];

    /// <summary>Per composition, the plain program's optimal plane over its components (eV/atom).</summary>
    public double[][] PlainPlane { get; private init; } = [];

    /// <summary>Per composition, the plain program's optimum: the hull energy there over every other composition (eV/atom; +∞ for a pure one).</summary>
    public double[] PlainValue { get; private init; } = [];

    /// <summary>Per composition, the plain program's optimal basis (points).</summary>
    public int[][] PlainBasis { get; private init; } = [];

    /// <summary>Per distinct face mask, every point whose components lie in it (ascending).</summary>
    public Dictionary<ulong, int[]> FacePoints { get; private init; } = [];

    /// <summary>The largest number of components of a composition.</summary>
    public int MaxRows { get; private init; }

    /// <summary>The programs of the plain hull over <paramref name="amounts"/> (canonical order) at <paramref name="energies"/>, on up to <paramref name="threads"/> threads.</summary>
    public static LocalPrograms Prepare(IReadOnlyList<long[]> amounts, double[] energies, int threads)
    {
        HullInput input = HullInput.Check(amounts, energies);
        int n = energies.Length;
        int m = input.CompositionCount;
        int componentCount = input.ComponentCount;
        var components = new int[m][];
        var masks = new ulong[m];
        var isPure = new bool[m];
        var counts = new int[m];
        foreach (int c in input.CompositionOf) counts[c]++;
        var pointsOf = new int[m][];
        for (int c = 0; c < m; c++) pointsOf[c] = new int[counts[c]];
        Array.Clear(counts);
        for (int p = 0; p < n; p++)
        {
            int c = input.CompositionOf[p];
            pointsOf[c][counts[c]++] = p;
        }

        int maxRows = 1;
        for (int c = 0; c < m; c++)
        {
            var row = input.Row(pointsOf[c][0]);
            var list = new List<int>();
            for (int k = 0; k < componentCount; k++) if (row[k] != 0) list.Add(k);
            components[c] = [.. list];
            foreach (int k in list) masks[c] |= 1UL << k;
            isPure[c] = list.Count == 1;
            maxRows = Math.Max(maxRows, list.Count);
        }

        // Every point of each face, and the plain representatives (the program's columns) of each face.
        var facePoints = new Dictionary<ulong, int[]>();
        foreach (ulong mask in masks.Distinct())
        {
            var points = new List<int>();
            for (int p = 0; p < n; p++) if ((masks[input.CompositionOf[p]] & ~mask) == 0) points.Add(p);
            facePoints[mask] = [.. points];
        }

        var near = new int[m][];
        var ranked = new int[m][];
        var rankedCost = new double[m][];
        var threshold = new double[m];
        var plainPlane = new double[m][];
        var plainValue = new double[m];
        var plainBasis = new int[m][];
        // Each composition's program and ranking is its own (the same on any thread); threads share nothing else.
        Parallel.For(0, m, new ParallelOptions { MaxDegreeOfParallelism = Math.Max(1, threads) }, () => new PrepareScratch(maxRows, n), (c, _, scratch) =>
        {
            if (isPure[c])
            {
                near[c] = [];
                ranked[c] = [];
                rankedCost[c] = [];
                threshold[c] = double.PositiveInfinity;
                plainPlane[c] = [];
                plainValue[c] = double.PositiveInfinity;
                plainBasis[c] = [];
                return scratch;
            }

            var (block, solver, columns, keys, order, xAll, basisAll, weightsAll) = scratch;

            int[] face = facePoints[masks[c]];
            int k = components[c].Length;
            columns.Clear();
            foreach (int p in face)
            {
                int q = input.CompositionOf[p];
                if (q != c && input.RepresentativeOf(p) == p) columns.Add(p);
            }

            block.Refill(components[c], System.Runtime.InteropServices.CollectionsMarshal.AsSpan(columns), input, energies);
            var x = xAll.AsSpan(0, k);
            block.Restrict(input.FractionsOf(pointsOf[c][0]), x);
            var basis = basisAll.AsSpan(0, k);
            var weights = weightsAll.AsSpan(0, k);
            solver.ForgetCandidates();
            plainValue[c] = solver.Solve(block, x, excluded: -1, basis, weights, warm: false);
            double[] mu = solver.Plane.ToArray();
            plainPlane[c] = mu;
            plainBasis[c] = new int[k];
            for (int i = 0; i < k; i++) plainBasis[c][i] = block.Points[basis[i]];

            // Plain reduced costs of every point of the face but c's own, nearest first.
            int count = 0;
            foreach (int p in face)
            {
                if (input.CompositionOf[p] == c) continue;
                var xp = input.FractionsOf(p);
                double cost = energies[p];
                for (int r = 0; r < k; r++) cost -= mu[r] * xp[components[c][r]];
                keys[count] = cost;
                order[count++] = p;
            }

            // Only the ranked prefix needs order: select it, then sort it (the setup stays linear in the face per composition).
            int rankedCount = Math.Min(RankedPoints, count);
            double beyond = rankedCount < count ? SelectLowest(keys, order, count, rankedCount) : double.PositiveInfinity;
            Array.Sort(keys, order, 0, rankedCount);
            var chosen = new List<int>(NearPoints + 2 * k);
            for (int t = 0; t < Math.Min(NearPoints, count); t++) chosen.Add(order[t]);
            foreach (int p in face) if (isPure[input.CompositionOf[p]]) chosen.Add(p);
            chosen.AddRange(plainBasis[c]);
            ranked[c] = order.AsSpan(0, rankedCount).ToArray();
            rankedCost[c] = keys.AsSpan(0, rankedCount).ToArray();
            near[c] = [.. chosen.Distinct().Order()];
            threshold[c] = beyond;
            return scratch;
        }, _ => { });

        return new LocalPrograms(input)
        {
            Components = components,
            Masks = masks,
            PointsOf = pointsOf,
            IsPure = isPure,
            Near = near,
            Ranked = ranked,
            RankedCost = rankedCost,
            Threshold = threshold,
            PlainPlane = plainPlane,
            PlainValue = plainValue,
            PlainBasis = plainBasis,
            FacePoints = facePoints,
            MaxRows = maxRows,
        };
    }

    private sealed record PrepareScratch(
        ColumnBlock Block, BlockSimplex Solver, List<int> Columns, double[] Keys, int[] Order, double[] X, int[] Basis, double[] Weights)
    {
        public PrepareScratch(int maxRows, int points)
            : this(ColumnBlock.Scratch(maxRows, points), new BlockSimplex(maxRows), new List<int>(points), new double[points], new int[points],
                new double[maxRows], new int[maxRows], new double[maxRows])
        {
        }
    }

    /// <summary>
    /// The fast programs take systems of up to this many points: their setup prices every point of each
    /// composition's face once (quadratic in the points), which a system this size pays for within a few samples.
    /// </summary>
    public const int MaxPoints = 20_000;

    /// <summary>Whether the fast programs take a system of <paramref name="componentCount"/> components and <paramref name="pointCount"/> points.</summary>
    public static bool Takes(int componentCount, int pointCount) => componentCount <= MaxComponents && pointCount <= MaxPoints;

    /// <summary>
    /// Reorders keys[0, count) (and order alike) so that the <paramref name="want"/> lowest come first (quickselect),
    /// and returns the lowest key of the rest.
    /// </summary>
    private static double SelectLowest(double[] keys, int[] order, int count, int want)
    {
        int lo = 0, hi = count - 1;
        while (lo < hi)
        {
            double pivot = keys[(lo + hi) >>> 1];
            int i = lo, j = hi;
            while (i <= j)
            {
                while (keys[i] < pivot) i++;
                while (keys[j] > pivot) j--;
                if (i > j) break;
                (keys[i], keys[j]) = (keys[j], keys[i]);
                (order[i], order[j]) = (order[j], order[i]);
                i++;
                j--;
            }

            // [lo, j] ≤ pivot ≤ [i, hi]: go on in the part that holds position want.
            if (want <= j) hi = j;
            else if (want >= i) lo = i;
            else break;
        }

        double lowest = double.PositiveInfinity;
        for (int t = want; t < count; t++) lowest = Math.Min(lowest, keys[t]);
        return lowest;
    }
}
