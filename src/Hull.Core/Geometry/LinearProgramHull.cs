using System.Collections.Concurrent;
using System.Numerics;

namespace Hull.Core.Geometry;

/// <summary>
/// Energies above the hull, decompositions and stable points without building facets: for each distinct
/// composition, one small linear program finds the hull energy there over all other compositions.
/// </summary>
/// <remarks>
/// In many components the lower hull has far more facets than points (millions for a few thousand points in eight
/// components), while stability questions need only the hull energy at each point. For a composition c the
/// program "lowest Σ w_j E_j with Σ w_j x_j = x_c, w ≥ 0" over every other composition gives the hull energy at
/// x_c without c; c is a hull vertex when its energy lies below that by more than
/// <see cref="HullTolerances.EnergyEvPerAtom"/>, and otherwise the optimal columns are its decomposition. The
/// same number, for a stable c, is its decomposition energy. Only compositions whose components are a subset of
/// c's can take part (amounts are non-negative), so each program runs over c's own face of the simplex: a
/// binary's program has two rows, whatever the number of components. Facets, when wanted, come from
/// <see cref="LowerHull"/>. Representatives, tie rules and input checks are the same as there.
/// </remarks>
public sealed class LinearProgramHull : IHullStability
{
    /// <summary>Consecutive compositions (in composition order) solved in sequence, each starting from the previous optimum.</summary>
    private const int ChunkSize = 32;

    /// <summary>
    /// Estimated pricing work (multiply-adds: queries × columns × rows × passes) from which compositions are solved
    /// on all cores: about 1.7e7, some milliseconds, far above the cost of starting workers.
    /// </summary>
    private const long ParallelWork = 1L << 24;

    /// <summary>
    /// Pricing passes over the block one composition's program takes, for the work estimate of a group's solves:
    /// measured 11 full passes and 33 steps (each pricing a candidate list) per composition on the pair family in
    /// 8 components. Counting one pass per program kept groups of 100 ms and more on one core.
    /// </summary>
    private const long PricingPassesPerSolve = 16;

    private readonly HullInput _input;
    private readonly List<(ulong Mask, int[] Points)> _groups;
    private readonly bool[] _isVertex;
    private readonly double[] _hullEnergy;
    private readonly double[] _hullEnergyWithout;
    private readonly int[][] _decompositionPoints;
    private readonly double[][] _decompositionWeights;
    private readonly ConcurrentDictionary<ulong, ColumnBlock> _locateBlocks = new();

    // On-demand mode only (see Prepare): which compositions have their hull energy without themselves (and so
    // their vertex status), which are fully solved (decomposition into vertices only), and the last solve's state.
    private readonly bool[]? _valueSolved;
    private readonly bool[]? _solved;
    private readonly Dictionary<ulong, ColumnBlock>? _blocks;
    private readonly int[]? _columnInBlock;
    private IReadOnlyList<int>? _vertexPoints;
    private (ColumnBlock Block, BlockSimplex Solver, int[] Basis, double[] Weights, double[] X)? _last;

    private LinearProgramHull(HullInput input, List<(ulong Mask, int[] Points)> groups, bool onDemand)
    {
        _input = input;
        _groups = groups;
        int compositions = input.CompositionCount;
        _isVertex = new bool[input.Energies.Length];
        _hullEnergy = new double[compositions];
        _hullEnergyWithout = new double[compositions];
        _decompositionPoints = new int[compositions][];
        _decompositionWeights = new double[compositions][];
        if (onDemand)
        {
            _solved = new bool[compositions];
            _valueSolved = new bool[compositions];
            _blocks = new Dictionary<ulong, ColumnBlock>();
            _columnInBlock = new int[input.Energies.Length];
            foreach (var (_, points) in groups)
            {
                for (int q = 0; q < points.Length; q++) _columnInBlock[points[q]] = q;
            }
        }
    }

    /// <summary>Number of components.</summary>
    public int ComponentCount => _input.ComponentCount;

    /// <summary>Number of input points.</summary>
    public int PointCount => _input.Energies.Length;

    /// <summary>Input indices of the points that are vertices of the lower hull, ascending.</summary>
    public IReadOnlyList<int> VertexPoints
    {
        get
        {
            if (_vertexPoints is null)
            {
                if (_solved is not null)
                {
                    for (int p = 0; p < PointCount; p++) Solved(p);
                }
                var vertices = new List<int>();
                for (int i = 0; i < _isVertex.Length; i++) if (_isVertex[i]) vertices.Add(i);
                _vertexPoints = vertices.AsReadOnly();
            }
            return _vertexPoints;
        }
    }

    /// <summary>The largest number of components this engine takes (components are kept as bits of a 64-bit set).</summary>
    public const int MaxComponents = 64;

    /// <summary>
    /// Computes the hull energy at every point's composition. Same input as <see cref="LowerHull.Build(IReadOnlyList{long[]}, IReadOnlyList{double})"/>.
    /// </summary>
    /// <exception cref="ArgumentException">As <see cref="LowerHull.Build(IReadOnlyList{long[]}, IReadOnlyList{double})"/>; also more than <see cref="MaxComponents"/> components.</exception>
    public static LinearProgramHull Build(IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom)
    {
        return Prepare(HullInput.Check(amounts, energiesEvPerAtom), onDemand: false);
    }

    /// <summary>
    /// The engine over checked input. On demand, a composition is solved when first asked about (the many small
    /// hulls of a dataset each report only some of their points); such an instance is for one thread only.
    /// </summary>
    internal static LinearProgramHull Prepare(HullInput input, bool onDemand)
    {
        if (input.ComponentCount > MaxComponents)
        {
            throw new ArgumentException($"{input.ComponentCount} components; this engine takes at most {MaxComponents}.", "amounts");
        }
        input.PureComponentPoints();
        // On demand (a dataset's hull) the input order is already canonical; otherwise composition order makes the
        // reported decompositions independent of the input order.
        var hull = new LinearProgramHull(input, GroupByMask(input, inputOrder: onDemand), onDemand);
        if (!onDemand) hull.SolveAll();
        return hull;
    }

    /// <summary>Whether input point i is a vertex of the lower hull.</summary>
    public bool IsVertex(int pointIndex)
    {
        Solved(pointIndex);
        return _isVertex[pointIndex];
    }

    /// <summary>Energy above the hull of input point i, eV/atom: zero for points within tolerance of the hull.</summary>
    public double EnergyAboveHullEvPerAtom(int pointIndex)
    {
        int c = Solved(pointIndex);
        double above = _input.Energies[pointIndex] - _hullEnergy[c];
        return above > HullTolerances.EnergyEvPerAtom ? above : 0.0;
    }

    /// <summary>Hull energy and decomposition at the composition of input point i (no facet: index -1).</summary>
    public HullPosition LocatePoint(int pointIndex)
    {
        int c = Solved(pointIndex);
        return new HullPosition(-1, (int[])_decompositionPoints[c].Clone(), (double[])_decompositionWeights[c].Clone(), _hullEnergy[c]);
    }

    /// <summary>
    /// The hull energy at point i's composition when every point of that composition is left out (eV/atom), or null
    /// for a pure component, which nothing else can make. For a point on the hull, its energy minus this is its
    /// decomposition energy.
    /// </summary>
    public double? HullEnergyWithoutCompositionEvPerAtom(int pointIndex)
    {
        double value = _hullEnergyWithout[Solved(pointIndex)];
        return double.IsNaN(value) ? null : value;
    }

    /// <summary>Hull energy and decomposition at composition fractions (non-negative, summing to 1; no facet: index -1).</summary>
    /// <exception cref="ArgumentException">Wrong length, negative or non-finite fractions, or a sum other than 1.</exception>
    public HullPosition Locate(ReadOnlySpan<double> fractions)
    {
        HullInput.CheckFractions(fractions, ComponentCount);
        ulong mask = 0;
        for (int k = 0; k < fractions.Length; k++) if (fractions[k] > 0) mask |= 1UL << k;
        var block = _locateBlocks.GetOrAdd(mask, m => ColumnBlock.Gather(m, _groups, _input));
        int rows = block.Components.Length;
        Span<double> x = stackalloc double[rows];
        block.Restrict(fractions, x);
        Span<int> basis = stackalloc int[rows];
        Span<double> weights = stackalloc double[rows];
        double energy = new BlockSimplex(rows).Solve(block, x, excluded: -1, basis, weights, warm: false);
        var (points, fractionsOut) = Decomposition(block, basis, weights);
        if (!AllVertices(points)) (points, fractionsOut) = VerticesOnly(block, x, -1, points);
        return new HullPosition(-1, points, fractionsOut, energy);
    }

    /// <summary>
    /// Chemical potentials (eV/atom, one per component) at these fractions: the dual of the hull program over all
    /// components and every composition, i.e. the plane through its optimal basis (a lower-hull facet holding the
    /// fractions; where several do, the one the simplex method ended on). See <see cref="IHullStability.ChemicalPotentialsEvPerAtomAt"/>.
    /// </summary>
    /// <remarks>
    /// The program runs over all components even when some fractions are zero: restricted to the composition's own
    /// face it would leave the potentials of the absent components undetermined.
    /// </remarks>
    /// <exception cref="ArgumentException">Wrong length, negative or non-finite fractions, or a sum other than 1.</exception>
    public double[] ChemicalPotentialsEvPerAtomAt(ReadOnlySpan<double> fractions)
    {
        HullInput.CheckFractions(fractions, ComponentCount);
        int n = ComponentCount;
        ulong all = n == 64 ? ulong.MaxValue : (1UL << n) - 1;
        var block = _locateBlocks.GetOrAdd(all, m => ColumnBlock.Gather(m, _groups, _input));
        Span<double> x = stackalloc double[n];
        block.Restrict(fractions, x);
        Span<int> basis = stackalloc int[n];
        Span<double> weights = stackalloc double[n];
        var solver = new BlockSimplex(n);
        solver.Solve(block, x, excluded: -1, basis, weights, warm: false);
        var mu = new double[n];
        // Rows of the full block are the components in order.
        solver.Plane.CopyTo(mu);
        return mu;
    }

    /// <summary>The components present in an amount row, as bits.</summary>
    private static ulong MaskOf(ReadOnlySpan<long> row)
    {
        ulong mask = 0;
        for (int k = 0; k < row.Length; k++) if (row[k] != 0) mask |= 1UL << k;
        return mask;
    }

    /// <summary>Representative points grouped by their component set, groups by mask, points in composition order (or input order).</summary>
    private static List<(ulong Mask, int[] Points)> GroupByMask(HullInput input, bool inputOrder)
    {
        int[] candidates = inputOrder ? input.CandidatesInInputOrder : input.Candidates;
        var groupOfMask = new Dictionary<ulong, int>(16);
        var counts = new List<int>(16);
        var groupOf = new int[candidates.Length];
        for (int i = 0; i < candidates.Length; i++)
        {
            ulong mask = MaskOf(input.Row(candidates[i]));
            if (!groupOfMask.TryGetValue(mask, out int g))
            {
                g = counts.Count;
                groupOfMask.Add(mask, g);
                counts.Add(0);
            }
            groupOf[i] = g;
            counts[g]++;
        }
        // Groups by ascending mask (every subset before its supersets); points keep their order within a group.
        var ordered = groupOfMask.Keys.ToArray();
        Array.Sort(ordered);
        var groups = new List<(ulong Mask, int[] Points)>(ordered.Length);
        var pointsOfGroup = new int[counts.Count][];
        foreach (ulong mask in ordered)
        {
            int g = groupOfMask[mask];
            pointsOfGroup[g] = new int[counts[g]];
            groups.Add((mask, pointsOfGroup[g]));
        }
        var filled = new int[counts.Count];
        for (int i = 0; i < candidates.Length; i++)
        {
            int g = groupOf[i];
            pointsOfGroup[g][filled[g]++] = candidates[i];
        }
        return groups;
    }

    /// <summary>
    /// Solves every group, fewest components first. A group's programs read the vertex status of its subset groups
    /// only, which have fewer components, so the groups of one component count are independent of each other and
    /// run side by side when together they are worth the cores; each writes its own points only.
    /// </summary>
    private void SolveAll()
    {
        var levels = new List<(ulong Mask, int[] Points)>[ComponentCount + 1];
        foreach (var group in _groups) (levels[BitOperations.PopCount(group.Mask)] ??= []).Add(group);
        for (int size = 1; size <= ComponentCount; size++)
        {
            var level = levels[size];
            if (level is null) continue;
            if (size == 1)
            {
                foreach (var (_, points) in level)
                {
                    int p = points[0];
                    SetVertex(p);
                    _hullEnergyWithout[_input.CompositionOf[p]] = double.NaN;
                }
                continue;
            }
            long work = 0;
            foreach (var (mask, points) in level) work += (long)points.Length * ColumnCount(mask) * size * PricingPassesPerSolve;
            // Each group gathers its own block, so that the gathering runs side by side too.
            if (level.Count > 1 && work >= ParallelWork) Parallel.For(0, level.Count, g => SolveGroupOf(level[g].Mask, level[g].Points));
            else foreach (var (mask, points) in level) SolveGroupOf(mask, points);
        }
    }

    private void SolveGroupOf(ulong mask, int[] points)
    {
        var block = ColumnBlock.Gather(mask, _groups, _input);
        if (!TrySolveGroupOverCandidates(block, points)) SolveGroup(block, points);
    }

    /// <summary>The number of columns <see cref="ColumnBlock.Gather"/> would collect for <paramref name="mask"/>.</summary>
    private int ColumnCount(ulong mask)
    {
        int count = 0;
        foreach (var (m, points) in _groups) if ((m & ~mask) == 0) count += points.Length;
        return count;
    }

    /// <summary>Runs <paramref name="work"/> for every chunk of a group, on all cores when the group is large.</summary>
    private static void ForEachChunk(int count, long workPerPoint, Action<int> work)
    {
        int chunks = (count + ChunkSize - 1) / ChunkSize;
        // Small groups (the many small hulls of a dataset, already built in parallel one level up) run inline:
        // handing them to the thread pool costs more than it saves and makes the outer workers spin.
        if (chunks > 1 && count * workPerPoint >= ParallelWork) Parallel.For(0, chunks, work);
        else for (int chunk = 0; chunk < chunks; chunk++) work(chunk);
    }

    /// <summary>What to do with one composition's optimum; returns whether the next solve may start from this basis.</summary>
    private delegate bool SolvedHandler(int q, int point, double[] x, BlockSimplex solver, int[] basis, double[] weights, double value);

    /// <summary>
    /// Solves the program of each of <paramref name="points"/> (one group) over <paramref name="columns"/>, without
    /// column <paramref name="excludedColumn"/>(q) (-1: none), chunk by chunk. Each chunk warm-starts from its own
    /// previous composition only, so the result (including which of several equal decompositions is reported) does
    /// not depend on how threads share the chunks.
    /// </summary>
    private void SolveEach(int[] points, ColumnBlock columns, Func<int, int> excludedColumn, SolvedHandler onSolved)
    {
        int rows = columns.Components.Length;
        ForEachChunk(points.Length, (long)columns.Count * rows * PricingPassesPerSolve, chunk =>
        {
            var solver = new BlockSimplex(rows);
            var basis = new int[rows];
            var weights = new double[rows];
            var x = new double[rows];
            bool warm = false;
            int end = Math.Min(points.Length, (chunk + 1) * ChunkSize);
            for (int q = chunk * ChunkSize; q < end; q++)
            {
                int p = points[q];
                columns.Restrict(_input.FractionsOf(p), x);
                double value = solver.Solve(columns, x, excludedColumn(q), basis, weights, warm);
                warm = onSolved(q, p, x, solver, basis, weights, value);
            }
        });
    }

    /// <summary>Makes every decomposition of the group one into vertices, over the columns of <paramref name="columns"/>.</summary>
    private void FinishGroup(int[] points, ColumnBlock columns)
    {
        ForEachChunk(points.Length, (long)columns.Count * columns.Components.Length, chunk =>
        {
            int end = Math.Min(points.Length, (chunk + 1) * ChunkSize);
            for (int q = chunk * ChunkSize; q < end; q++) FinishDecomposition(points[q], columns);
        });
    }

    /// <summary>The group's compositions each against every other column of the block.</summary>
    private void SolveGroup(ColumnBlock block, int[] points)
    {
        SolveEach(points, block, q => block.OwnGroupStart + q, (_, p, _, _, basis, weights, without) =>
        {
            Record(p, block, basis, weights, without);
            return true;
        });
        // Every subset mask is numerically smaller, so all columns of this block now have their vertex status.
        FinishGroup(points, block);
    }

    /// <summary>
    /// Above this share of vertices among the subset columns a group is solved over all its columns: nearly every
    /// column would be kept, and the first pass below would be spent for nothing.
    /// </summary>
    private const double CandidatesUpToVertexShare = 0.5;

    /// <summary>
    /// Solves a group over the columns that can matter, when few of the block's columns are vertices. The lower
    /// hull of a set is the hull of its vertices, and the subset columns' vertex status is known (their groups come
    /// first), so only three kinds of column take part: the subset vertices; the group's own candidates, those
    /// below the hull of the subset vertices by more than the tolerance (every vertex of the group is one, as the
    /// hull without a vertex lies at or below that hull); and, where a composition turns out a vertex, every column
    /// of the block, since removing a vertex can expose points that are no vertex of the whole set. Its
    /// hull energy without itself is then checked against the plane of the small program's optimum: the answer
    /// stands when no column of the block lies below that plane (the optimality condition over the whole block),
    /// and is solved over the whole block otherwise. A composition that is no vertex has the hull of all vertices
    /// above it, which the small program holds in full. A composition that is no candidate keeps its answer over
    /// the subset vertices when no candidate lies below that answer's plane (the optimality condition over the
    /// small block), and is solved again over the small block otherwise. Returns false, having done nothing, where
    /// most subset columns are vertices.
    /// </summary>
    private bool TrySolveGroupOverCandidates(ColumnBlock block, int[] points)
    {
        int own = block.OwnGroupStart;
        var subsetVertices = new List<int>();
        for (int j = 0; j < own; j++) if (_isVertex[block.Points[j]]) subsetVertices.Add(block.Points[j]);
        if (subsetVertices.Count > CandidatesUpToVertexShare * own) return false;

        var bound = ColumnBlock.FromPoints(block.Components, subsetVertices, _input);
        int rows = block.Components.Length;
        var candidate = new bool[points.Length];
        // The optimal plane of each composition that is no candidate: its answer over the subset vertices stands
        // over the small block too unless a candidate lies below that plane.
        var planes = new double[points.Length * rows];
        SolveEach(points, bound, _ => -1, (q, p, _, solver, basis, weights, above) =>
        {
            candidate[q] = _input.Energies[p] < above - HullTolerances.EnergyEvPerAtom;
            if (!candidate[q])
            {
                Record(p, bound, basis, weights, above);
                solver.Plane.CopyTo(planes.AsSpan(q * rows, rows));
            }
            return true;
        });

        var kept = new List<int>(subsetVertices);
        var columnOf = new int[points.Length];
        for (int q = 0; q < points.Length; q++)
        {
            columnOf[q] = candidate[q] ? kept.Count : -1;
            if (candidate[q]) kept.Add(points[q]);
        }
        var small = ColumnBlock.FromPoints(block.Components, kept, _input);
        var solveAgain = new bool[points.Length];
        ForEachChunk(points.Length, (long)(small.Count - subsetVertices.Count) * rows, chunk =>
        {
            int end = Math.Min(points.Length, (chunk + 1) * ChunkSize);
            for (int q = chunk * ChunkSize; q < end; q++)
            {
                solveAgain[q] = candidate[q] || BlockSimplex.AnyColumnBelow(small, planes.AsSpan(q * rows, rows), subsetVertices.Count, small.Count);
            }
        });
        var again = new List<int>();
        for (int q = 0; q < points.Length; q++) if (solveAgain[q]) again.Add(q);
        var againPoints = new int[again.Count];
        for (int i = 0; i < againPoints.Length; i++) againPoints[i] = points[again[i]];
        SolveEach(againPoints, small, i => columnOf[again[i]], (i, p, x, solver, basis, weights, without) =>
        {
            int q = again[i];
            if (!(_input.Energies[p] < without - HullTolerances.EnergyEvPerAtom && BlockSimplex.AnyColumnBelow(block, solver.Plane, own + q)))
            {
                Record(p, small, basis, weights, without);
                return true;
            }
            // A vertex whose removal exposes a column left out: its program over the whole block, from the corners.
            var wholeBasis = new int[rows];
            without = new BlockSimplex(rows).Solve(block, x, own + q, wholeBasis, weights, warm: false);
            Record(p, block, wholeBasis, weights, without);
            return true;
        });
        // Every vertex of the block is a column of the small one, so decompositions into vertices are found there.
        FinishGroup(points, small);
        return true;
    }

    /// <summary>
    /// Makes the decomposition of a non-vertex composition use vertices only. The optimal basis may contain a
    /// point that lies exactly on the hull without being a vertex (an exact mixture of others); the program is
    /// then solved again without such columns until none is left. The hull energy does not change (a mixture's
    /// vertices give the same energy), only which equivalent phases are named.
    /// </summary>
    private void FinishDecomposition(int point, ColumnBlock block)
    {
        int c = _input.CompositionOf[point];
        if (_isVertex[point] || AllVertices(_decompositionPoints[c])) return;
        var x = new double[block.Components.Length];
        block.Restrict(_input.FractionsOf(point), x);
        (_decompositionPoints[c], _decompositionWeights[c]) = VerticesOnly(block, x, point, _decompositionPoints[c]);
    }

    /// <summary>
    /// Solves the program at x again without <paramref name="ownPoint"/> (-1: none) and without every non-vertex
    /// column met in a decomposition, starting from <paramref name="decomposition"/>, until only vertices remain.
    /// </summary>
    private (int[] Points, double[] Fractions) VerticesOnly(ColumnBlock block, ReadOnlySpan<double> x, int ownPoint, int[] decomposition)
    {
        int rows = block.Components.Length;
        var excluded = new bool[block.Count];
        int ownColumn = ownPoint < 0 ? -1 : Array.IndexOf(block.Points, ownPoint);
        if (ownColumn >= 0) excluded[ownColumn] = true;
        var solver = new BlockSimplex(rows);
        var basis = new int[rows];
        var weights = new double[rows];
        int[] current = decomposition;
        // Each round excludes at least one more column, so this ends within the block's size.
        for (int round = 0; round <= block.Count; round++)
        {
            foreach (int q in current)
            {
                // A first decomposition may come from a larger block (a vertex candidate solved over every column)
                // and name a column this block lacks: it cannot come back from a solve here.
                int column = IsVertexColumn(q) ? -1 : Array.IndexOf(block.Points, q);
                if (column >= 0) excluded[column] = true;
            }
            solver.Solve(block, x, -1, basis, weights, warm: false, excluded);
            var (points, fractions) = Decomposition(block, basis, weights);
            if (AllVertices(points)) return (points, fractions);
            current = points;
        }
        throw new InvalidOperationException("A decomposition into hull vertices did not settle.");
    }

    private bool AllVertices(int[] points)
    {
        foreach (int q in points) if (!IsVertexColumn(q)) return false;
        return true;
    }

    /// <summary>Vertex status of a representative point, working it out first in on-demand mode.</summary>
    private bool IsVertexColumn(int point)
    {
        if (_valueSolved is not null) SolveValue(point);
        return _isVertex[point];
    }

    /// <summary>The composition id of input point i, solving it first in on-demand mode.</summary>
    private int Solved(int pointIndex)
    {
        if ((uint)pointIndex >= (uint)PointCount) throw new ArgumentOutOfRangeException(nameof(pointIndex));
        int c = _input.CompositionOf[pointIndex];
        if (_solved is null || _solved[c]) return c;
        int p = _input.RepresentativeOf(pointIndex);
        ColumnBlock? block = SolveValue(p);
        if (block is not null) FinishDecomposition(p, block);
        _solved[c] = true;
        return c;
    }

    /// <summary>
    /// On demand: the hull energy at a representative point's composition without it, its vertex status and a
    /// first decomposition. Returns the block of its components (null for a pure component).
    /// </summary>
    private ColumnBlock? SolveValue(int p)
    {
        int c = _input.CompositionOf[p];
        ulong mask = MaskOf(_input.Row(p));
        if (BitOperations.PopCount(mask) == 1)
        {
            if (!_valueSolved![c])
            {
                SetVertex(p);
                _hullEnergyWithout[c] = double.NaN;
                _valueSolved[c] = true;
            }
            return null;
        }
        if (!_blocks!.TryGetValue(mask, out var block)) _blocks[mask] = block = ColumnBlock.Gather(mask, _groups, _input);
        if (!_valueSolved![c])
        {
            int rows = block.Components.Length;
            // Consecutive questions tend to be about neighbouring compositions: start from the last optimum when
            // it was over the same columns.
            bool warm = _last is { } last && ReferenceEquals(last.Block, block);
            if (!warm) _last = (block, new BlockSimplex(rows), new int[rows], new double[rows], new double[rows]);
            var (_, solver, basis, weights, x) = _last!.Value;
            block.Restrict(_input.FractionsOf(p), x);
            double without = solver.Solve(block, x, block.OwnGroupStart + _columnInBlock![p], basis, weights, warm);
            Record(p, block, basis, weights, without);
            _valueSolved[c] = true;
        }
        return block;
    }

    private void Record(int point, ColumnBlock block, int[] basis, double[] weights, double hullWithout)
    {
        int c = _input.CompositionOf[point];
        _hullEnergyWithout[c] = hullWithout;
        if (_input.Energies[point] < hullWithout - HullTolerances.EnergyEvPerAtom)
        {
            SetVertex(point);
            return;
        }
        (_decompositionPoints[c], _decompositionWeights[c]) = Decomposition(block, basis, weights);
        _hullEnergy[c] = hullWithout;
    }

    private void SetVertex(int point)
    {
        int c = _input.CompositionOf[point];
        _isVertex[point] = true;
        _hullEnergy[c] = _input.Energies[point];
        _decompositionPoints[c] = [point];
        _decompositionWeights[c] = [1.0];
    }

    /// <summary>The basis columns of positive weight as input points and atom fractions (renormalised to sum 1).</summary>
    private static (int[] Points, double[] Weights) Decomposition(ColumnBlock block, ReadOnlySpan<int> basis, ReadOnlySpan<double> weights)
    {
        int kept = 0;
        double total = 0;
        for (int i = 0; i < basis.Length; i++)
        {
            if (weights[i] > HullTolerances.BarycentricWeight) { kept++; total += weights[i]; }
        }
        var points = new int[kept];
        var fractions = new double[kept];
        for (int i = 0, j = 0; i < basis.Length; i++)
        {
            if (weights[i] <= HullTolerances.BarycentricWeight) continue;
            points[j] = block.Points[basis[i]];
            fractions[j++] = weights[i] / total;
        }
        Array.Sort(points, fractions);
        return (points, fractions);
    }
}
