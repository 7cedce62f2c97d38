namespace Hull.Core.Geometry;

/// <summary>
/// Incremental construction of the lower convex hull over the composition simplex, furthest point first.
/// </summary>
/// <remarks>
/// The hull starts as the single facet through the pure component points. Its boundary ridges are closed by
/// "walls": vertical facets through a ridge on a face x_k = 0 and a vertex at infinite energy. A point is added by
/// removing the facets it lies below (and, when it lies on face k, the walls on that face above the removed facets),
/// then joining it to every ridge of the removed region. Energies decide visibility with a tolerance; whether a new
/// facet is a proper simplex of the composition simplex is decided exactly from the integer amounts, and when it is
/// not, the removed region grows across that ridge. That keeps the projected facets a true triangulation of the
/// composition simplex whatever the rounding, which is what degenerate thermodynamic data needs: compositions on
/// rational lattices, many points on one plane, subsystem points exactly on faces.
///
/// Most new facets need no factorisation: their plane lies in the pencil through their ridge and follows from the
/// two neighbouring planes, which also tell on which side of the ridge the new point falls (see TryPencil). Only close
/// calls go through a floating-point factorisation, and, when that is also too close, the exact integer determinant.
/// </remarks>
internal sealed class LowerHullBuilder
{
    private const int Infinity = -1;

    // Inside the builder a point is a composition id (its representative stands for it): fractions, amounts and
    // energies are read from tables per composition, and ids are turned back into points on the way out.
    private readonly int _n;
    private readonly HullInput _input;
    private readonly double[] _fractions;
    private readonly double[] _energies;

    // Facet storage, n slots per facet. Slot i holds a vertex (Infinity for a wall's vertex at infinite energy) and
    // the neighbour across the ridge opposite that vertex.
    private int _facetCount;
    private readonly Stack<int> _freeFacets = new();
    private int[] _vertices = [];
    private int[] _neighbors = [];
    private double[] _mu = [];
    private byte[] _generation = [];
    private int[] _wallFace = [];
    private bool[] _alive = [];
    // Outside sets: the points below each facet, as a list threaded through the points (head and tail per facet,
    // -1 when empty; the next point per point), so moving points between sets allocates nothing.
    private int[] _outsideHead = [];
    private int[] _outsideTail = [];
    private readonly int[] _nextOutside;
    private int[] _visitStamp = [];
    private int _stamp;

    private readonly Queue<int> _pending = new();

    // Scratch buffers, reused for every facet.
    private readonly double[] _matrix;
    private readonly int[] _pivots;
    private readonly long[] _exact;

    /// <summary>Facets made so far, removed ones included: the construction's work.</summary>
    public long FacetsMade { get; private set; }

    /// <summary>Points added so far (each removes the facets it lies below and builds its star).</summary>
    public long PointsAdded { get; private set; }

    /// <summary>
    /// The facet rate is judged as if at least this many points had been added: the first stars, built on the few
    /// facets of the start, are not representative, and this allowance (the rate limit times this many facets, a
    /// few milliseconds of work) is about all an exploding hull costs before it is given up.
    /// </summary>
    public const int JudgeRateFromPoints = 50;

    // Construction stops with FacetBudgetExceededException beyond either limit (see FacetLimits).
    private readonly FacetLimits _limits;

    public LowerHullBuilder(HullInput input, FacetLimits limits)
    {
        _limits = limits;
        _n = input.ComponentCount;
        _input = input;
        _fractions = input.CompositionFractions;
        _energies = new double[input.CompositionCount];
        _nextOutside = new int[input.CompositionCount];
        for (int c = 0; c < _energies.Length; c++) _energies[c] = input.Energies[input.CandidatesInInputOrder[c]];
        _matrix = new double[_n * _n];
        _pivots = new int[_n];
        _exact = new long[_n * _n];
    }

    /// <summary>
    /// Builds the hull of the candidates (representative points, in canonical order) and returns its lower facets
    /// (corners as points).
    /// </summary>
    public List<int[]> Build(int[] pureComponentPoints, IReadOnlyList<int> candidatePoints)
    {
        int[] compositionOf = _input.CompositionOf;
        int[] pureComponents = Array.ConvertAll(pureComponentPoints, p => compositionOf[p]);
        var candidates = new int[candidatePoints.Count];
        for (int i = 0; i < candidates.Length; i++) candidates[i] = compositionOf[candidatePoints[i]];

        // Start near the size small hulls need (a few facets per point and component), so the many small hulls of a
        // dataset do not grow their storage step by step; large hulls still double as they go.
        EnsureCapacity(Math.Min(1 << 16, 1 + _n + 2 * _n * candidates.Length));
        int first = NewFacet(pureComponents, wallFace: -1);
        if (first < 0) throw new InvalidOperationException("The pure component points do not span the composition simplex.");
        for (int k = 0; k < _n; k++)
        {
            var wall = (int[])pureComponents.Clone();
            wall[k] = Infinity;
            NewFacet(wall, wallFace: k);
        }
        // Facet 0 is the lower facet, facet 1 + k the wall on face k.
        for (int k = 0; k < _n; k++)
        {
            _neighbors[0 * _n + k] = 1 + k;
            for (int j = 0; j < _n; j++) _neighbors[(1 + k) * _n + j] = j == k ? 0 : 1 + j;
        }

        var pure = new HashSet<int>(pureComponents);
        foreach (int q in candidates)
        {
            if (!pure.Contains(q) && Depth(0, q) > HullTolerances.EnergyEvPerAtom) AppendOutside(0, q);
        }
        if (_outsideHead[0] >= 0) _pending.Enqueue(0);
        Run();
        return LowerFacets();
    }

    /// <summary>Adds points found below the hull after construction (only rounding can leave any) and rebuilds.</summary>
    public List<int[]> Repair(IReadOnlyList<(int Point, int Facet)> below)
    {
        foreach (var (representative, facet) in below)
        {
            int point = _input.CompositionOf[representative];
            int f = FindAliveLowerFacetBelow(point, facet);
            if (f < 0) continue;
            AppendOutside(f, point);
            _pending.Enqueue(f);
        }
        Run();
        return LowerFacets();
    }

    private int FindAliveLowerFacetBelow(int point, int hint)
    {
        if (hint >= 0 && hint < _facetCount && _alive[hint] && _wallFace[hint] < 0 && Depth(hint, point) > HullTolerances.EnergyEvPerAtom) return hint;
        int best = -1;
        double bestDepth = HullTolerances.EnergyEvPerAtom;
        for (int f = 0; f < _facetCount; f++)
        {
            if (!_alive[f] || _wallFace[f] >= 0) continue;
            double d = Depth(f, point);
            if (d > bestDepth) { bestDepth = d; best = f; }
        }
        return best;
    }

    private void Run()
    {
        var visible = new List<int>();
        var horizon = new List<(int Facet, int Slot)>();
        var created = new List<int>();
        while (_pending.Count > 0)
        {
            int f = _pending.Dequeue();
            int head = _outsideHead[f];
            if (!_alive[f] || head < 0) continue;
            int apex = head;
            double deepest = Depth(f, apex);
            for (int q = _nextOutside[head]; q >= 0; q = _nextOutside[q])
            {
                double d = Depth(f, q);
                if (d > deepest) { deepest = d; apex = q; }
            }
            AddPoint(f, apex, visible, horizon, created);
        }
    }

    private void AddPoint(int start, int apex, List<int> visible, List<(int, int)> horizon, List<int> created)
    {
        if (FacetsMade > _limits.FacetsPerPointAdded * Math.Max(++PointsAdded, JudgeRateFromPoints) || FacetsMade > _limits.TotalFacets)
        {
            throw new FacetBudgetExceededException(FacetsMade, PointsAdded);
        }
        _stamp++;
        visible.Clear();
        MarkVisibleRegion(start, apex, visible);
        FindValidHorizon(apex, visible, horizon);

        created.Clear();
        _ridges.Clear();
        var slotBuffer = new int[_n];
        for (int h = 0; h < horizon.Count; h++)
        {
            var (f, slot) = horizon[h];
            Array.Copy(_vertices, f * _n, slotBuffer, 0, _n);
            slotBuffer[slot] = apex;
            int nf = NewFacet(slotBuffer, _wallFace[f], _wallFace[f] < 0 ? _horizonMu.AsSpan(h * _n, _n) : default);
            _generation[nf] = _wallFace[f] < 0 ? _horizonGeneration[h] : (byte)0;
            int outsideNeighbor = _neighbors[f * _n + slot];
            _neighbors[nf * _n + slot] = outsideNeighbor;
            ReplaceNeighbor(outsideNeighbor, f, nf);
            created.Add(nf);
            for (int i = 0; i < _n; i++)
            {
                if (i == slot) continue;
                ulong key = RidgeHash(nf, skipSlot: i);
                if (_ridges.Remove(key, out var other))
                {
                    if (!SameRidge(nf, i, other.Facet, other.Slot))
                    {
                        throw new InvalidOperationException($"Internal error: ridge hash collision while adding point {PointOf(apex)}.");
                    }
                    _neighbors[nf * _n + i] = other.Facet;
                    _neighbors[other.Facet * _n + other.Slot] = nf;
                }
                else
                {
                    _ridges.Add(key, (nf, i));
                }
            }
        }
        if (_ridges.Count != 0)
        {
            throw new InvalidOperationException($"Internal error: {_ridges.Count} unmatched ridges while adding point {PointOf(apex)}.");
        }

        foreach (int f in visible) _alive[f] = false;
        int climbFrom = created[0];
        foreach (int nf in created)
        {
            if (_wallFace[nf] < 0) { climbFrom = nf; break; }
        }
        foreach (int f in visible)
        {
            int q = _outsideHead[f];
            _outsideHead[f] = -1;
            // The points of one removed facet lie close together: each climb starts where the previous one ended.
            int from = climbFrom;
            while (q >= 0)
            {
                int next = _nextOutside[q];
                if (q != apex)
                {
                    int best = Ascend(from, q, out double bestDepth);
                    from = best;
                    if (bestDepth > HullTolerances.EnergyEvPerAtom)
                    {
                        if (_outsideHead[best] < 0) _pending.Enqueue(best);
                        AppendOutside(best, q);
                    }
                }
                q = next;
            }
        }
        foreach (int f in visible) _freeFacets.Push(f);
    }

    private void AppendOutside(int facet, int point)
    {
        _nextOutside[point] = -1;
        if (_outsideHead[facet] < 0) _outsideHead[facet] = point;
        else _nextOutside[_outsideTail[facet]] = point;
        _outsideTail[facet] = point;
    }

    private readonly Dictionary<ulong, (int Facet, int Slot)> _ridges = new();
    private double[] _horizonMu = [];
    private byte[] _horizonGeneration = [];

    /// <summary>
    /// Plane differences below this (eV/atom) are too close to decide a side from: ten times the energy tolerance,
    /// far above the rounding of planes kept accurate by refactorising every <see cref="MaxPencilGeneration"/> steps.
    /// </summary>
    private const double PencilMarginEv = 10 * HullTolerances.EnergyEvPerAtom;

    /// <summary>
    /// Interpolated planes inherit their parents' rounding; after this many interpolations in a row a plane is solved
    /// afresh, and so is one that would need a step beyond <see cref="MaxPencilStep"/> (extrapolation amplifies error).
    /// </summary>
    private const int MaxPencilGeneration = 48;
    private const double MaxPencilStep = 4.0;

    /// <summary>Order-free 64-bit hash of a ridge's vertex set (a facet less one slot).</summary>
    private ulong RidgeHash(int facet, int skipSlot)
    {
        ulong h = 0;
        for (int i = 0; i < _n; i++)
        {
            if (i == skipSlot) continue;
            // SplitMix64 finaliser per vertex, summed: the sum does not depend on slot order.
            ulong z = (ulong)(uint)(_vertices[facet * _n + i] + 2) * 0x9E3779B97F4A7C15UL;
            z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
            z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
            h += z ^ (z >> 31);
        }
        return h;
    }

    private bool SameRidge(int a, int skipA, int b, int skipB)
    {
        for (int i = 0; i < _n; i++)
        {
            if (i == skipA) continue;
            int v = _vertices[a * _n + i];
            bool found = false;
            for (int j = 0; j < _n && !found; j++) found = j != skipB && _vertices[b * _n + j] == v;
            if (!found) return false;
        }
        return true;
    }

    /// <summary>
    /// Climbs from a lower facet to the lower facet whose plane is highest at the point's composition, stepping to
    /// the best strictly higher neighbour. The facets' planes are the vertices of the chemical-potential polyhedron
    /// and the climb is the simplex method on it, so a facet with no higher neighbour holds the hull energy there;
    /// on exactly coplanar facets it may stop early, which the final check after construction catches.
    /// </summary>
    private int Ascend(int start, int point, out double depth)
    {
        int f = start;
        depth = Depth(f, point);
        while (true)
        {
            int next = -1;
            double nextDepth = depth;
            for (int i = 0; i < _n; i++)
            {
                int g = _neighbors[f * _n + i];
                if (_wallFace[g] >= 0) continue;
                double d = Depth(g, point);
                if (d > nextDepth) { nextDepth = d; next = g; }
            }
            if (next < 0) return f;
            f = next;
            depth = nextDepth;
        }
    }

    /// <summary>Breadth-first search from a lower facet the apex lies below, over lower facets it also lies below.</summary>
    private void MarkVisibleRegion(int start, int apex, List<int> visible)
    {
        var queue = new Queue<int>();
        MarkLowerVisible(start, apex, visible, queue);
        while (queue.Count > 0)
        {
            int f = queue.Dequeue();
            for (int i = 0; i < _n; i++)
            {
                int g = _neighbors[f * _n + i];
                if (_visitStamp[g] == _stamp || _wallFace[g] >= 0) continue;
                if (Depth(g, apex) > HullTolerances.EnergyEvPerAtom) MarkLowerVisible(g, apex, visible, queue);
            }
        }
    }

    /// <summary>
    /// Marks a lower facet removed, and with it its walls on faces that contain the apex: a wall is passed only when
    /// the apex lies on its face and below the facet that carries it.
    /// </summary>
    private void MarkLowerVisible(int f, int apex, List<int> visible, Queue<int> queue)
    {
        if (_visitStamp[f] == _stamp) return;
        _visitStamp[f] = _stamp;
        visible.Add(f);
        queue.Enqueue(f);
        for (int i = 0; i < _n; i++)
        {
            int w = _neighbors[f * _n + i];
            int face = _wallFace[w];
            if (face >= 0 && _input.CompositionAmount(apex, face) == 0 && _visitStamp[w] != _stamp)
            {
                _visitStamp[w] = _stamp;
                visible.Add(w);
            }
        }
    }

    /// <summary>
    /// Collects the ridges between removed and kept facets, growing the removed region across every ridge whose new
    /// facet would not be a proper, positively oriented simplex, until the region is star-shaped from the apex.
    /// </summary>
    private void FindValidHorizon(int apex, List<int> visible, List<(int Facet, int Slot)> horizon)
    {
        var scratch = new int[_n];
        while (true)
        {
            horizon.Clear();
            int grownFrom = -1, grownTo = -1;
            foreach (int f in visible)
            {
                for (int i = 0; i < _n; i++)
                {
                    int g = _neighbors[f * _n + i];
                    if (_visitStamp[g] == _stamp) continue;
                    int decided = _wallFace[f] < 0 ? TryPencil(f, i, g, apex, horizon.Count) : TryWallPencil(f, i, g, apex);
                    if (decided > 0) { horizon.Add((f, i)); continue; }
                    if (decided == 0)
                    {
                        Array.Copy(_vertices, f * _n, scratch, 0, _n);
                        scratch[i] = apex;
                        if (OrientationSign(scratch, _wallFace[f]) > 0)
                        {
                            // The orientation test left the factorised vertex matrix in _matrix: reuse it for the plane.
                            if (_wallFace[f] < 0) SolveFromFactorization(scratch, horizon.Count);
                            horizon.Add((f, i));
                            continue;
                        }
                    }
                    grownFrom = f; grownTo = g;
                    break;
                }
                if (grownTo >= 0) break;
            }
            if (grownTo < 0) return;
            // The apex sits on or beyond this ridge in projection, so it lies below the neighbour too (up to rounding).
            int lower = _wallFace[grownTo] >= 0 ? LowerFacetOfWall(grownTo) : grownTo;
            if (_visitStamp[lower] != _stamp)
            {
                var queue = new Queue<int>();
                MarkLowerVisible(lower, apex, visible, queue);
            }
            if (_visitStamp[grownTo] != _stamp)
            {
                // A wall whose face does not hold the apex cannot be removed: the new facet there is a lower facet
                // and is always proper, so reaching this means the facet data are inconsistent.
                throw new InvalidOperationException($"Internal error: cannot remove wall {grownTo} (from facet {grownFrom}) for point {PointOf(apex)}.");
            }
        }
    }

    /// <summary>
    /// Decides the facet joining the apex to the ridge r between removed lower facet f (opposite slot) and kept
    /// facet g without factorising, from the pencil of planes through r. Returns 1 (proper; its plane is stored for
    /// horizon index h), -1 (improper: the apex is on g's side of r) or 0 (too close to call; factorise instead).
    /// </summary>
    /// <remarks>
    /// Every plane through r is mu_f + t (mu_g - mu_f) (a wall's: mu_f + t e_k). The difference phi = (mu_g - mu_f).x
    /// vanishes on r, so the apex lies on f's side exactly when phi at the apex and phi at g's far vertex differ in
    /// sign, and t = depth_f / (depth_f - depth_g) puts the apex on the plane.
    /// </remarks>
    private int TryPencil(int f, int slot, int g, int apex, int h)
    {
        EnsureHorizonCapacity(h);
        var mu = _horizonMu.AsSpan(h * _n, _n);
        var muF = _mu.AsSpan(f * _n, _n);
        double depthF = Depth(f, apex);
        int face = _wallFace[g];
        if (face >= 0)
        {
            // The apex is off this wall's face (else the wall would be removed), so the facet is proper.
            double xk = _fractions[apex * _n + face];
            muF.CopyTo(mu);
            mu[face] -= depthF / xk;
            _horizonGeneration[h] = (byte)(_generation[f] + 1);
            return _horizonGeneration[h] > MaxPencilGeneration ? 0 : 1;
        }
        int far = -1;
        for (int j = 0; j < _n; j++)
        {
            if (_neighbors[g * _n + j] == f) { far = _vertices[g * _n + j]; break; }
        }
        double phiApex = Depth(g, apex) - depthF;
        double phiFar = -Depth(f, far);
        if (Math.Abs(phiApex) <= PencilMarginEv || Math.Abs(phiFar) <= PencilMarginEv) return 0;
        if ((phiApex > 0) == (phiFar > 0)) return -1;
        double t = -depthF / phiApex;
        // Interpolation (t <= 1) cannot amplify the parents' rounding; extrapolation can, so it counts more.
        int generation = Math.Max(_generation[f], _generation[g]) + (t <= 1.0 ? 1 : 8);
        if (t > MaxPencilStep || generation > MaxPencilGeneration) return 0;
        var muG = _mu.AsSpan(g * _n, _n);
        for (int k = 0; k < _n; k++) mu[k] = muF[k] + t * (muG[k] - muF[k]);
        _horizonGeneration[h] = (byte)generation;
        return 1;
    }

    /// <summary>
    /// The same side test for a removed wall w on face k and a kept facet g across one of its ridges, inside face k:
    /// the lower facets carrying w and g agree on the shared vertices, so their plane difference vanishes on the
    /// ridge within the face. Returns 1, -1 or 0 as <see cref="TryPencil"/>; walls need no plane.
    /// </summary>
    private int TryWallPencil(int w, int slot, int g, int apex)
    {
        int face = _wallFace[w];
        int gFace = _wallFace[g];
        if (gFace < 0) return 0;
        if (gFace != face) return _input.CompositionAmount(apex, gFace) > 0 ? 1 : 0;
        int lowerW = LowerFacetOfWall(w), lowerG = LowerFacetOfWall(g);
        int far = -1;
        for (int j = 0; j < _n; j++)
        {
            if (_neighbors[g * _n + j] == w) { far = _vertices[g * _n + j]; break; }
        }
        if (far < 0) return 0;
        double phiApex = Depth(lowerG, apex) - Depth(lowerW, apex);
        double phiFar = Depth(lowerG, far) - Depth(lowerW, far);
        if (Math.Abs(phiApex) <= PencilMarginEv || Math.Abs(phiFar) <= PencilMarginEv) return 0;
        return (phiApex > 0) == (phiFar > 0) ? -1 : 1;
    }

    private int LowerFacetOfWall(int wall)
    {
        int infinitySlot = Array.IndexOf(_vertices, Infinity, wall * _n, _n) - wall * _n;
        return _neighbors[wall * _n + infinitySlot];
    }

    private void EnsureHorizonCapacity(int h)
    {
        if (_horizonMu.Length >= (h + 1) * _n) return;
        int capacity = Math.Max(64, 2 * (h + 1));
        Array.Resize(ref _horizonMu, capacity * _n);
        Array.Resize(ref _horizonGeneration, capacity);
    }

    private void SolveFromFactorization(int[] vertices, int horizonIndex)
    {
        EnsureHorizonCapacity(horizonIndex);
        _horizonGeneration[horizonIndex] = 0;
        var mu = _horizonMu.AsSpan(horizonIndex * _n, _n);
        if (_lastOrientationWasExact)
        {
            SolveChemicalPotentials(vertices, mu);
            return;
        }
        for (int i = 0; i < _n; i++) mu[i] = _energies[vertices[i]];
        SmallLinearSolver.Solve(_matrix, _n, _pivots, mu);
    }

    private void ReplaceNeighbor(int facet, int oldNeighbor, int newNeighbor)
    {
        for (int i = 0; i < _n; i++)
        {
            if (_neighbors[facet * _n + i] == oldNeighbor) { _neighbors[facet * _n + i] = newNeighbor; return; }
        }
        throw new InvalidOperationException("Internal error: neighbour links are not symmetric.");
    }

    private double Depth(int facet, int point)
    {
        double s = -_energies[point];
        int fo = facet * _n, po = point * _n;
        for (int k = 0; k < _n; k++) s += _mu[fo + k] * _fractions[po + k];
        return s;
    }

    /// <summary>
    /// Sign of the orientation of a candidate facet in the composition simplex: the determinant of its vertices'
    /// amounts (a wall: of its finite vertices without the wall's own component). Rows scaled by positive numbers
    /// keep the sign, so fractions give it in floating point and amounts give it exactly when that is too close to call.
    /// </summary>
    private bool _lastOrientationWasExact;

    private int OrientationSign(int[] vertices, int wallFace)
    {
        int size = wallFace >= 0 ? _n - 1 : _n;
        int r = 0;
        double hadamard = 1.0;
        for (int i = 0; i < _n; i++)
        {
            int v = vertices[i];
            if (v == Infinity) continue;
            int c = 0;
            double norm2 = 0.0;
            for (int k = 0; k < _n; k++)
            {
                if (k == wallFace) continue;
                double x = _fractions[v * _n + k];
                _matrix[r * size + c] = x;
                _exact[r * size + c] = _input.CompositionAmount(v, k);
                norm2 += x * x;
                c++;
            }
            hadamard *= Math.Sqrt(norm2);
            r++;
        }
        if (hadamard == 0.0) return 0;
        double det = SmallLinearSolver.Factorize(_matrix.AsSpan(0, size * size), size, _pivots);
        _lastOrientationWasExact = false;
        if (Math.Abs(det) > HullTolerances.RelativeDeterminantFilter * hadamard) return Math.Sign(det);
        _lastOrientationWasExact = true;
        return ExactDeterminant.Sign(_exact.AsSpan(0, size * size), size);
    }

    /// <summary>
    /// Stores a facet (reusing a removed one's storage); a lower facet gets its chemical potentials, from
    /// <paramref name="mu"/> when the caller solved them already. Returns -1 for a degenerate lower facet.
    /// </summary>
    private int NewFacet(int[] vertices, int wallFace, ReadOnlySpan<double> mu = default)
    {
        Span<double> solved = stackalloc double[_n];
        if (wallFace < 0)
        {
            if (mu.IsEmpty)
            {
                if (OrientationSign(vertices, -1) <= 0) return -1;
                SolveChemicalPotentials(vertices, solved);
            }
            else
            {
                mu.CopyTo(solved);
            }
        }
        FacetsMade++;
        int f;
        if (_freeFacets.Count > 0)
        {
            f = _freeFacets.Pop();
        }
        else
        {
            EnsureCapacity(_facetCount + 1);
            f = _facetCount++;
        }
        if (wallFace < 0) solved.CopyTo(_mu.AsSpan(f * _n, _n));
        Array.Copy(vertices, 0, _vertices, f * _n, _n);
        _wallFace[f] = wallFace;
        _alive[f] = true;
        _outsideHead[f] = -1;
        _visitStamp[f] = 0;
        return f;
    }

    /// <summary>Plane through the vertices' (fraction, energy) points: solves X mu = E.</summary>
    private void SolveChemicalPotentials(int[] vertices, Span<double> mu)
    {
        for (int i = 0; i < _n; i++)
        {
            Array.Copy(_fractions, vertices[i] * _n, _matrix, i * _n, _n);
            mu[i] = _energies[vertices[i]];
        }
        SmallLinearSolver.Factorize(_matrix, _n, _pivots);
        SmallLinearSolver.Solve(_matrix, _n, _pivots, mu);
    }

    private void EnsureCapacity(int facets)
    {
        if (facets <= _alive.Length) return;
        int capacity = Math.Max(Math.Max(facets, 16), _alive.Length * 2);
        Array.Resize(ref _vertices, capacity * _n);
        Array.Resize(ref _neighbors, capacity * _n);
        Array.Resize(ref _mu, capacity * _n);
        Array.Resize(ref _generation, capacity);
        Array.Resize(ref _wallFace, capacity);
        Array.Resize(ref _alive, capacity);
        Array.Resize(ref _outsideHead, capacity);
        Array.Resize(ref _outsideTail, capacity);
        Array.Resize(ref _visitStamp, capacity);
    }

    /// <summary>The alive lower facets' vertices, and (through <see cref="LowerNeighbors"/>) their adjacency.</summary>
    private List<int[]> LowerFacets()
    {
        var result = new List<int[]>();
        _internalIds.Clear();
        if (_finalIndex.Length < _facetCount) _finalIndex = new int[_facetCount];
        Array.Fill(_finalIndex, -1);
        for (int f = 0; f < _facetCount; f++)
        {
            if (!_alive[f] || _wallFace[f] >= 0) continue;
            _finalIndex[f] = result.Count;
            _internalIds.Add(f);
            var corners = new int[_n];
            for (int i = 0; i < _n; i++) corners[i] = PointOf(_vertices[f * _n + i]);
            result.Add(corners);
        }
        return result;
    }

    // Both directions between internal facet ids and the indices of the list LowerFacets returned last.
    private int[] _finalIndex = [];
    private readonly List<int> _internalIds = new();

    /// <summary>The representative point of a composition id.</summary>
    private int PointOf(int composition) => _input.CandidatesInInputOrder[composition];

    /// <summary>Neighbour of each final lower facet across each slot, as final indices; -1 across the domain boundary.</summary>
    public int[] LowerNeighbors()
    {
        var result = new int[_internalIds.Count * _n];
        for (int index = 0; index < _internalIds.Count; index++)
        {
            int f = _internalIds[index];
            for (int i = 0; i < _n; i++) result[index * _n + i] = _finalIndex[_neighbors[f * _n + i]];
        }
        return result;
    }

    /// <summary>The internal facet id of a final lower facet, for handing back points in <see cref="Repair"/>.</summary>
    public int InternalId(int finalIndex) => _internalIds[finalIndex];
}
