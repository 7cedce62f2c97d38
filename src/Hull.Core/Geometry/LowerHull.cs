namespace Hull.Core.Geometry;

/// <summary>
/// The lower convex hull of points in the composition simplex lifted by energy per atom: the stable points, the
/// facets, and for any composition the hull energy and the decomposition into hull points.
/// </summary>
/// <remarks>
/// Points are given as exact non-negative integer amounts of each component (any positive scale per point) so that
/// the engine can decide affine independence exactly; energies are compared with
/// <see cref="HullTolerances.EnergyEvPerAtom"/>. Of several points with the same composition only the lowest in
/// energy (lowest index among exact ties) takes part; the others are placed against it. Construction runs on the
/// remaining points in a canonical order (by composition, then energy), so the result does not depend on input
/// order beyond that tie rule.
/// <para>
/// A point is a vertex when its energy lies below the hull of all points of other compositions by more than the
/// tolerance; a point within the tolerance of the hull is on it (energy above hull 0) but no vertex, even when it is
/// an exact mixture of vertices at their mixed energy. Incremental construction can keep such a point as a facet
/// corner (when it came before the points it mixes), so every corner is checked against the hull without it
/// (<see cref="ExtremeCornerCheck"/>) and, if any fails, the facets are rebuilt on the vertices alone: facet
/// corners, and with them all decompositions, are vertices only.
/// </para>
/// </remarks>
public sealed class LowerHull : IHullStability
{
    private const int MaxRepairRounds = 8;

    /// <summary>
    /// Builds in all (the first, and rebuilds on the corners shown to be vertices). A rebuild has only known vertices
    /// as corners unless a repair hands back a left-out point, which only a fault can cause, so two builds suffice
    /// and more than a few mean a fault.
    /// </summary>
    private const int MaxCornerRounds = 4;

    /// <summary>
    /// How far a point left out of a rebuild may lie below the rebuilt hull (eV/atom). It lay within the tolerance of
    /// the first hull, which lies within the tolerance of the hull without it (it was no corner, or no vertex), and
    /// the rebuilt facets lie up to the tolerance above the exact hull of the points they were built from (every
    /// point may be the tolerance below them): three tolerances, and a fourth for rounding.
    /// </summary>
    private const double LeftOutSlackEvPerAtom = 4 * HullTolerances.EnergyEvPerAtom;

    private readonly int _n;
    private readonly HullInput _input;
    // For HullEnergyWithoutCompositionEvPerAtom: the finished hull's stars (built on first use) and buffers of past calls.
    private ExtremeCornerCheck.StarIndex? _stars;
    private readonly System.Collections.Concurrent.ConcurrentBag<ExtremeCornerCheck.Scratch> _spareScratch = new();
    private readonly double[] _energies;
    // Facet corners are representative points; the rest of the state is kept per composition (indexed by
    // composition id), as only a composition's representative takes part.
    private int[] _facetVertices = [];
    private double[] _facetLu = [];
    private int[] _facetPivots = [];
    private int[] _facetNeighbors = [];
    private double[] _facetMu = [];
    private readonly bool[] _isVertex;
    private readonly int[] _compositionFacet;
    private readonly double[] _hullEnergy;

    private LowerHull(HullInput input, FacetLimits limits)
    {
        _limits = limits;
        _n = input.ComponentCount;
        _input = input;
        _energies = input.Energies;
        _isVertex = new bool[input.CompositionCount];
        _compositionFacet = new int[input.CompositionCount];
        _hullEnergy = new double[input.CompositionCount];
        Facets = [];
        VertexPoints = [];
    }

    /// <summary>Number of components (dimensions of the composition simplex plus one).</summary>
    public int ComponentCount => _n;

    /// <summary>Number of input points.</summary>
    public int PointCount => _energies.Length;

    /// <summary>Input indices of the points that are vertices of the lower hull, ascending.</summary>
    public IReadOnlyList<int> VertexPoints { get; private set; }

    /// <summary>The lower facets; their projections tile the composition simplex.</summary>
    public IReadOnlyList<HullFacet> Facets { get; private set; }

    /// <summary>
    /// The faces of the lower hull: the facets grouped by plane, each face given by its corner points, ascending.
    /// Where more than one point per component lies on one plane of the hull (stable phases exactly coplanar, such
    /// as four phases on one plane of a ternary), the facets triangulate that face and one diagonal is as good as the
    /// other; a face lists all its corners, whichever triangulation was built. Faces come in the order of their first
    /// facet.
    /// </summary>
    /// <remarks>
    /// Two neighbouring facets share a plane when the corner of one opposite their common ridge lies on the other's
    /// plane within <see cref="HullTolerances.EnergyEvPerAtom"/> (the tolerance that puts points on the hull); a face
    /// is a connected group of such facets. On a convex hull all facets on one supporting plane are connected.
    /// </remarks>
    public IReadOnlyList<IReadOnlyList<int>> CoplanarFaces()
    {
        int count = Facets.Count;
        var parent = new int[count];
        for (int f = 0; f < count; f++) parent[f] = f;
        int Root(int f)
        {
            while (parent[f] != f) f = parent[f] = parent[parent[f]];
            return f;
        }
        for (int f = 0; f < count; f++)
        {
            for (int i = 0; i < _n; i++)
            {
                int g = _facetNeighbors[f * _n + i];
                if (g <= f) continue;
                int far = -1;
                for (int j = 0; j < _n; j++)
                {
                    if (_facetNeighbors[g * _n + j] == f) { far = _facetVertices[g * _n + j]; break; }
                }
                if (far < 0) continue;
                var x = _input.FractionsOf(far);
                double plane = 0;
                for (int k = 0; k < _n; k++) plane += _facetMu[f * _n + k] * x[k];
                if (Math.Abs(_energies[far] - plane) > HullTolerances.EnergyEvPerAtom) continue;
                int a = Root(f), b = Root(g);
                if (a != b) parent[Math.Max(a, b)] = Math.Min(a, b);
            }
        }
        var corners = new SortedSet<int>?[count];
        var order = new List<int>();
        for (int f = 0; f < count; f++)
        {
            int r = Root(f);
            if (corners[r] is null) { corners[r] = []; order.Add(r); }
            for (int i = 0; i < _n; i++) corners[r]!.Add(_facetVertices[f * _n + i]);
        }
        return order.Select(r => (IReadOnlyList<int>)corners[r]!.ToArray()).ToArray();
    }

    /// <summary>
    /// Builds the lower hull. <paramref name="amounts"/>[i][k] is the non-negative integer amount of component k in
    /// point i (only ratios matter); <paramref name="energiesEvPerAtom"/>[i] its energy per atom. Every component
    /// needs a point made of it alone.
    /// </summary>
    /// <exception cref="ArgumentException">Inconsistent sizes, negative or all-zero amounts, non-finite energies,
    /// or a component without a pure point; the message names the point and component.</exception>
    public static LowerHull Build(IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom)
    {
        return Build(HullInput.Check(amounts, energiesEvPerAtom));
    }

    internal static LowerHull Build(HullInput input) => Build(input, FacetLimits.None);

    /// <summary>
    /// As <see cref="Build(HullInput)"/>, stopping with <see cref="FacetBudgetExceededException"/> at the first of
    /// the <paramref name="limits"/> reached (rebuilds count towards the total).
    /// </summary>
    internal static LowerHull Build(HullInput input, FacetLimits limits)
    {
        var hull = new LowerHull(input, limits);
        hull.Construct();
        return hull;
    }

    /// <summary>Facets construction made, removed ones and rebuilds included: the work the hull took.</summary>
    public long FacetsMade { get; private set; }

    /// <summary>Points construction added, rebuilds included (each builds its star of new facets).</summary>
    public long PointsAdded { get; private set; }

    private readonly FacetLimits _limits;

    /// <summary>
    /// The hull energy at point i's composition when every point of that composition is left out (eV/atom), or null
    /// for a pure component, which nothing else can make. For a point on the hull, its energy minus this is its
    /// decomposition energy. Removing a composition that is no vertex leaves the hull as it is; removing a vertex
    /// changes it only inside the vertex's star, so one small program over the star answers.
    /// </summary>
    public double? HullEnergyWithoutCompositionEvPerAtom(int pointIndex)
    {
        if ((uint)pointIndex >= (uint)_energies.Length) throw new ArgumentOutOfRangeException(nameof(pointIndex));
        HullInput input = _input;
        int c = input.CompositionOf[pointIndex];
        int rep = input.CandidatesInInputOrder[c];
        var row = input.Row(rep);
        int present = 0;
        foreach (long amount in row) if (amount != 0) present++;
        if (present == 1) return null;
        if (!_isVertex[c]) return _hullEnergy[c];
        _stars ??= ExtremeCornerCheck.IndexStars(input, _facetVertices, _compositionFacet, _isVertex, input.Candidates, input.PureComponentPoints());
        var scratch = _spareScratch.TryTake(out var spare) ? spare : new ExtremeCornerCheck.Scratch(input);
        double without = ExtremeCornerCheck.HullEnergyWithout(input, rep, _facetVertices, _stars, scratch);
        _spareScratch.Add(scratch);
        return without;
    }

    /// <summary>Whether input point i is a vertex of the lower hull.</summary>
    public bool IsVertex(int pointIndex)
    {
        if ((uint)pointIndex >= (uint)_energies.Length) throw new ArgumentOutOfRangeException(nameof(pointIndex));
        int c = _input.CompositionOf[pointIndex];
        return _isVertex[c] && _input.CandidatesInInputOrder[c] == pointIndex;
    }

    /// <summary>Energy above the hull of input point i, eV/atom: zero for points within tolerance of the hull.</summary>
    public double EnergyAboveHullEvPerAtom(int pointIndex)
    {
        if ((uint)pointIndex >= (uint)_energies.Length) throw new ArgumentOutOfRangeException(nameof(pointIndex));
        double above = _energies[pointIndex] - _hullEnergy[_input.CompositionOf[pointIndex]];
        return above > HullTolerances.EnergyEvPerAtom ? above : 0.0;
    }

    /// <summary>Hull energy and decomposition at the composition of input point i.</summary>
    public HullPosition LocatePoint(int pointIndex)
    {
        if ((uint)pointIndex >= (uint)_energies.Length) throw new ArgumentOutOfRangeException(nameof(pointIndex));
        int c = _input.CompositionOf[pointIndex];
        int facet = _compositionFacet[c];
        if (_isVertex[c])
        {
            int rep = _input.CandidatesInInputOrder[c];
            return new HullPosition(facet, [rep], [1.0], _energies[rep]);
        }
        return PositionIn(facet, _input.FractionsOf(pointIndex));
    }

    /// <summary>Hull energy and decomposition at composition fractions (non-negative, summing to 1).</summary>
    /// <exception cref="ArgumentException">Wrong length, negative or non-finite fractions, or a sum other than 1.</exception>
    public HullPosition Locate(ReadOnlySpan<double> fractions)
    {
        HullInput.CheckFractions(fractions, _n);
        Span<double> lambda = stackalloc double[_n];
        int facet = Walk(fractions, 0, lambda);
        return PositionIn(facet, fractions);
    }

    /// <summary>Chemical potentials (eV/atom, one per component) of the facet that holds these fractions; see <see cref="IHullStability.ChemicalPotentialsEvPerAtomAt"/>.</summary>
    /// <exception cref="ArgumentException">Wrong length, negative or non-finite fractions, or a sum other than 1.</exception>
    public double[] ChemicalPotentialsEvPerAtomAt(ReadOnlySpan<double> fractions)
    {
        HullInput.CheckFractions(fractions, _n);
        Span<double> lambda = stackalloc double[_n];
        int facet = Walk(fractions, 0, lambda);
        return _facetMu.AsSpan(facet * _n, _n).ToArray();
    }

    private HullPosition PositionIn(int facet, ReadOnlySpan<double> x)
    {
        Span<double> lambda = stackalloc double[_n];
        Barycentric(facet, x, lambda);
        var points = new List<int>(_n);
        var weights = new List<double>(_n);
        double total = 0;
        for (int i = 0; i < _n; i++)
        {
            if (lambda[i] <= HullTolerances.BarycentricWeight) continue;
            points.Add(_facetVertices[facet * _n + i]);
            weights.Add(lambda[i]);
            total += lambda[i];
        }
        var w = weights.ToArray();
        for (int i = 0; i < w.Length; i++) w[i] /= total;
        double energy = 0;
        for (int k = 0; k < _n; k++) energy += _facetMu[facet * _n + k] * x[k];
        return new HullPosition(facet, points.ToArray(), w, energy);
    }

    private void Construct()
    {
        HullInput input = _input;
        int[] candidates = input.Candidates;
        if (_n == 1)
        {
            int best = candidates[0];
            SetFacets([[best]], [-1]);
            _compositionFacet[0] = 0;
            _hullEnergy[0] = _energies[best];
            return;
        }

        int[] pure = input.PureComponentPoints();
        // Per composition, as the hull state.
        var knownVertex = new bool[input.CompositionCount];
        var left = new bool[input.CompositionCount];
        int[] building = candidates;
        for (int round = 0; ; round++)
        {
            BuildAndRepair(input, pure, building, candidates, left);
            var demoted = ExtremeCornerCheck.FindNonVertexCorners(input, _facetVertices, _facetLu, _facetPivots, _facetMu, _compositionFacet, _isVertex, candidates, pure, knownVertex);
            if (demoted.Count == 0) return;
            if (round == MaxCornerRounds)
            {
                throw new InvalidOperationException(
                    $"The hull could not be completed: {demoted.Count} points (first: point {demoted[0]}) remain facet corners but are no vertices after {MaxCornerRounds} rebuilds.");
            }
            // Build again on the corners shown to be vertices: the hull of the vertices is the hull of all points,
            // and a vertex of all points is one of any subset, so no corner of the new facets can fail the check.
            // Only a point handed back by the repairs (deeper than the slack below, which a fault alone can cause)
            // becomes a new corner, and is checked in the next round.
            int[] compositionOf = input.CompositionOf;
            foreach (int p in pure) knownVertex[compositionOf[p]] = true;
            foreach (int p in candidates) left[compositionOf[p]] = !knownVertex[compositionOf[p]];
            building = candidates.Where(p => knownVertex[compositionOf[p]]).ToArray();
        }
    }

    /// <summary>
    /// Builds the hull of the candidates not <paramref name="left"/> out, then locates every candidate and hands back
    /// any still below it (construction can leave a few on degenerate data, rounding others) until none is. Points left out are handed back only when
    /// nothing else is below and they are deeper than <see cref="LeftOutSlackEvPerAtom"/>.
    /// </summary>
    private void BuildAndRepair(HullInput input, int[] pure, int[] building, int[] candidates, bool[] left)
    {
        int[] compositionOf = input.CompositionOf;
        var builder = new LowerHullBuilder(input, _limits.After(FacetsMade));
        try
        {
            var facets = builder.Build(pure, building);
            for (int round = 0; ; round++)
            {
                SetFacets(facets, builder.LowerNeighbors());
                var below = LocateCandidates(candidates);
                // A point left out may lie below a hull that is not complete yet; it is judged on the completed one.
                var handBack = below.Where(b => !left[compositionOf[b.Point]]).ToList();
                if (handBack.Count == 0)
                {
                    handBack = below.Where(b => _hullEnergy[compositionOf[b.Point]] - _energies[b.Point] > LeftOutSlackEvPerAtom).ToList();
                }
                if (handBack.Count == 0) break;
                if (round == MaxRepairRounds)
                {
                    throw new InvalidOperationException($"The hull could not be completed: {handBack.Count} points remain below it after {MaxRepairRounds} repairs.");
                }
                facets = builder.Repair(handBack.Select(b => (b.Point, builder.InternalId(b.Facet))).ToList());
            }
        }
        finally
        {
            FacetsMade += builder.FacetsMade;
            PointsAdded += builder.PointsAdded;
        }
    }

    private void SetFacets(List<int[]> facets, int[] neighbors)
    {
        int f = facets.Count;
        _facetVertices = new int[f * _n];
        _facetLu = new double[f * _n * _n];
        _facetPivots = new int[f * _n];
        _facetMu = new double[f * _n];
        _facetNeighbors = neighbors;
        var list = new HullFacet[f];
        Array.Clear(_isVertex);
        for (int i = 0; i < f; i++)
        {
            var verts = facets[i];
            Array.Copy(verts, 0, _facetVertices, i * _n, _n);
            var lu = _facetLu.AsSpan(i * _n * _n, _n * _n);
            var mu = _facetMu.AsSpan(i * _n, _n);
            for (int r = 0; r < _n; r++)
            {
                _input.FractionsOf(verts[r]).CopyTo(lu.Slice(r * _n, _n));
                mu[r] = _energies[verts[r]];
                _isVertex[_input.CompositionOf[verts[r]]] = true;
            }
            SmallLinearSolver.Factorize(lu, _n, _facetPivots.AsSpan(i * _n, _n));
            SmallLinearSolver.Solve(lu, _n, _facetPivots.AsSpan(i * _n, _n), mu);
            list[i] = new HullFacet((int[])verts.Clone(), mu.ToArray());
        }
        Facets = Array.AsReadOnly(list);
        var vertices = new List<int>();
        for (int c = 0; c < _isVertex.Length; c++) if (_isVertex[c]) vertices.Add(_input.CandidatesInInputOrder[c]);
        vertices.Sort();
        VertexPoints = vertices.AsReadOnly();
    }

    /// <summary>
    /// Finds each candidate's facet by walking from the previous candidate's (they are in composition order, so
    /// neighbours are close), in parallel chunks, and returns the candidates that lie below the hull.
    /// </summary>
    private List<(int Point, int Facet)> LocateCandidates(int[] candidates)
    {
        // Chunks large enough that a worker's start-up is negligible; a hull of one chunk (the many small hulls of a
        // dataset, built in parallel one level up) is located inline rather than through the thread pool.
        const int chunk = 4096;
        int chunks = (candidates.Length + chunk - 1) / chunk;
        var below = new List<(int, int)>[chunks];
        if (chunks == 1)
        {
            below[0] = LocateChunk(candidates, 0, candidates.Length);
        }
        else
        {
            Parallel.For(0, chunks, c => below[c] = LocateChunk(candidates, c * chunk, Math.Min(candidates.Length, (c + 1) * chunk)));
        }
        return below.SelectMany(b => b).ToList();
    }

    private List<(int Point, int Facet)> LocateChunk(int[] candidates, int begin, int end)
    {
        var found = new List<(int, int)>();
        Span<double> lambda = stackalloc double[_n];
        int facet = 0;
        for (int i = begin; i < end; i++)
        {
            int p = candidates[i];
            int c = _input.CompositionOf[p];
            var x = _input.FractionsOf(p);
            facet = _isVertex[c] ? FacetWithVertex(p, x, facet, lambda) : Walk(x, facet, lambda);
            _compositionFacet[c] = facet;
            if (_isVertex[c]) { _hullEnergy[c] = _energies[p]; continue; }
            double hull = 0;
            for (int k = 0; k < _n; k++) hull += _facetMu[facet * _n + k] * x[k];
            _hullEnergy[c] = hull;
            if (_energies[p] < hull - HullTolerances.EnergyEvPerAtom) found.Add((p, facet));
        }
        return found;
    }

    private int FacetWithVertex(int point, ReadOnlySpan<double> x, int start, Span<double> lambda)
    {
        int f = Walk(x, start, lambda);
        if (Array.IndexOf(_facetVertices, point, f * _n, _n) >= 0) return f;
        for (int g = 0; g < _facetVertices.Length / _n; g++)
        {
            if (Array.IndexOf(_facetVertices, point, g * _n, _n) >= 0) return g;
        }
        return f;
    }

    private void Barycentric(int facet, ReadOnlySpan<double> x, Span<double> lambda)
    {
        x.CopyTo(lambda);
        SmallLinearSolver.SolveTransposed(_facetLu.AsSpan(facet * _n * _n, _n * _n), _n, _facetPivots.AsSpan(facet * _n, _n), lambda);
    }

    /// <summary>
    /// Visibility walk to the facet containing x: step across the ridge opposite the most negative weight. Crossing
    /// such a ridge never lowers the facet plane's value at x (the hull is convex), so the walk heads for the
    /// maximum; a step cap guards against cycling on exactly coplanar facets, after which every facet is tried.
    /// </summary>
    private int Walk(ReadOnlySpan<double> x, int start, Span<double> lambda)
    {
        int facetCount = _facetVertices.Length / _n;
        if (facetCount == 1) return 0;
        int f = start;
        int maxSteps = 64 + 2 * facetCount;
        for (int step = 0; step < maxSteps; step++)
        {
            Barycentric(f, x, lambda);
            int worst = 0;
            for (int i = 1; i < _n; i++) if (lambda[i] < lambda[worst]) worst = i;
            if (lambda[worst] >= -HullTolerances.BarycentricWeight) return f;
            int g = _facetNeighbors[f * _n + worst];
            if (g < 0) break;
            f = g;
        }
        int best = 0;
        double bestMin = double.NegativeInfinity;
        for (int g = 0; g < facetCount; g++)
        {
            Barycentric(g, x, lambda);
            double min = double.PositiveInfinity;
            for (int i = 0; i < _n; i++) min = Math.Min(min, lambda[i]);
            if (min > bestMin) { bestMin = min; best = g; }
        }
        return best;
    }
}
