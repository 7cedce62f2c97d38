using Hull.Core.Geometry;

namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// One sample's hull, read at every composition by the programs of <see cref="LocalPrograms"/>: each starts from
/// the plain optimum over the points near the plain plane, and is solved over its whole face only when the bound
/// there cannot show that no other point lies below the sample's plane. The answers are those of the hull of the
/// sample's kept points (the columns the plain way rebuilds over), within the solver's entering threshold. One
/// instance per thread: it owns its scratch space, and nothing of one sample carries over to the next.
/// </summary>
internal sealed class SampleSolver
{
    private readonly LocalPrograms _local;
    private readonly ColumnBlock _near;
    private readonly ColumnBlock _face;
    private readonly BlockSimplex _solver;
    private readonly int[] _columnBuffer;
    private readonly bool[] _isColumn;
    private readonly int[] _basis;
    private readonly double[] _weights;
    private readonly double[] _x;
    private readonly int[] _start;
    private readonly bool[] _inBlock;
    private readonly int _nearCapacity;
    private readonly Dictionary<ulong, FaceBlock> _faces = [];
    private readonly int[] _decomposition;
    private readonly int[] _decompositionLength;
    private readonly int[][] _facePoints;
    private readonly int[] _faceOf;
    private readonly double[] _faceLowestShift;
    private long _sample;

    public SampleSolver(LocalPrograms local)
    {
        _local = local;
        int n = local.Input.Energies.Length;
        int rows = local.MaxRows;
        _nearCapacity = LocalPrograms.NearPoints + 2 * rows + LocalPrograms.RankedPoints;
        _near = ColumnBlock.Scratch(rows, _nearCapacity);
        _inBlock = new bool[n];
        _face = ColumnBlock.Scratch(rows, n);
        _solver = new BlockSimplex(rows);
        _columnBuffer = new int[n];
        _isColumn = new bool[n];
        _basis = new int[rows];
        _weights = new double[rows];
        _x = new double[rows];
        _start = new int[rows];
        Representative = new int[local.CompositionCount];
        IsVertexComposition = new bool[local.CompositionCount];
        HullEnergy = new double[local.CompositionCount];
        _decomposition = new int[local.CompositionCount * rows];
        _decompositionLength = new int[local.CompositionCount];
        ulong[] faces = [.. local.FacePoints.Keys.Order()];
        _facePoints = [.. faces.Select(f => local.FacePoints[f])];
        _faceOf = [.. local.Masks.Select(mask => Array.IndexOf(faces, mask))];
        _faceLowestShift = new double[faces.Length];
    }

    /// <summary>Per composition, the sample's representative (its lowest kept point, lowest index among equals), or -1.</summary>
    public int[] Representative { get; }

    /// <summary>Per composition, whether its representative is a vertex of the sample's hull.</summary>
    public bool[] IsVertexComposition { get; }

    /// <summary>Per composition, the hull energy there (eV/atom; the representative's energy at a vertex).</summary>
    public double[] HullEnergy { get; }

    /// <summary>Composition <paramref name="c"/>'s decomposition into hull vertices (points, ascending; empty at a vertex).</summary>
    public ReadOnlySpan<int> DecompositionOf(int c) => _decomposition.AsSpan(c * _local.MaxRows, _decompositionLength[c]);

    /// <summary>Compositions of the last sample shown to be vertices by the lower bound alone, with no program solved.</summary>
    public int BoundVertices { get; private set; }

    /// <summary>Programs of the last sample solved over their whole face (the bound did not settle them).</summary>
    public int WholeFacePrograms { get; private set; }

    /// <summary>
    /// Reads the hull of the points flagged <paramref name="kept"/> at <paramref name="energy"/> (by point), which
    /// lie <paramref name="shift"/> from their plain energies, at every composition.
    /// </summary>
    public void Solve(double[] energy, double[] shift, bool[] kept)
    {
        LocalPrograms local = _local;
        HullInput input = local.Input;
        int m = local.CompositionCount;
        // The lowest error of each face's points (and never above zero): the bounds below need it only over the
        // points a composition's program can use, and a face of few components holds few points.
        for (int f = 0; f < _facePoints.Length; f++)
        {
            double lowest = 0;
            foreach (int p in _facePoints[f]) lowest = Math.Min(lowest, shift[p]);
            _faceLowestShift[f] = lowest;
        }

        for (int c = 0; c < m; c++)
        {
            int rep = -1;
            foreach (int p in local.PointsOf[c])
            {
                _isColumn[p] = false;
                if (kept[p] && (rep < 0 || energy[p] < energy[rep])) rep = p;
            }

            Representative[c] = rep;
            if (rep >= 0) _isColumn[rep] = true;
        }

        WholeFacePrograms = 0;
        BoundVertices = 0;
        _sample++;
        for (int c = 0; c < m; c++)
        {
            _decompositionLength[c] = 0;
            if (local.IsPure[c])
            {
                IsVertexComposition[c] = true;
                HullEnergy[c] = energy[Representative[c]];
                continue;
            }

            // The plane μ0 + min δ lies below every point at its sampled energy, so the program's optimum is at
            // least PlainValue + min δ (less the plain solve's entering threshold): a representative below that,
            // by a margin past the rounding, is a vertex whatever the program would find.
            double lowestShift = _faceLowestShift[_faceOf[c]];
            int own = Representative[c];
            if (own >= 0 && energy[own] < local.PlainValue[c] + lowestShift - StabilitySampling.CandidateMarginEvPerAtom - HullTolerances.EnergyEvPerAtom)
            {
                IsVertexComposition[c] = true;
                HullEnergy[c] = energy[own];
                BoundVertices++;
                continue;
            }

            int[] components = local.Components[c];
            int k = components.Length;
            int count = 0;
            foreach (int p in local.Near[c])
            {
                if (_isColumn[p])
                {
                    _columnBuffer[count++] = p;
                    _inBlock[p] = true;
                }
            }

            _near.Refill(components, _columnBuffer.AsSpan(0, count), input, energy);
            var x = _x.AsSpan(0, k);
            _near.Restrict(input.FractionsOf(local.PointsOf[c][0]), x);
            var basis = _basis.AsSpan(0, k);
            var weights = _weights.AsSpan(0, k);
            bool warm = FillBasis(local.PlainBasis[c], _near, basis);
            _solver.ForgetCandidates();
            double value = _solver.Solve(_near, x, excluded: -1, basis, weights, warm);
            ColumnBlock solvedOver = _near;
            bool settled;
            // Points of the ranked list that lie below the sample's plane join the columns and the program runs
            // again from its optimum, until none does and the bound covers every point past the last one checked.
            while (true)
            {
                int added = AddRankedBelow(c, lowestShift, energy, ref count, out settled);
                if (added == 0) break;
                for (int i = 0; i < k; i++) _start[i] = _near.Points[basis[i]];
                _near.Refill(components, _columnBuffer.AsSpan(0, count), input, energy);
                warm = FillBasis(_start.AsSpan(0, k), _near, basis);
                _solver.ForgetCandidates();
                value = _solver.Solve(_near, x, excluded: -1, basis, weights, warm);
            }

            for (int t = 0; t < count; t++) _inBlock[_columnBuffer[t]] = false;
            if (!settled)
            {
                WholeFacePrograms++;
                FaceBlock face = Face(c, energy);
                for (int i = 0; i < k; i++) basis[i] = face.ColumnOf[_near.Points[basis[i]]];
                int ownColumn = own >= 0 ? face.ColumnOf[own] : -1;
                _solver.ForgetCandidates();
                value = _solver.Solve(face.Block, x, ownColumn, basis, weights, warm: true);
                solvedOver = face.Block;
            }

            HullEnergy[c] = value;
            int r = Representative[c];
            IsVertexComposition[c] = r >= 0 && energy[r] < value - HullTolerances.EnergyEvPerAtom;
            if (IsVertexComposition[c])
            {
                HullEnergy[c] = energy[r];
            }
            else
            {
                _decompositionLength[c] = PositivePoints(solvedOver, basis, weights, DecompositionSpace(c));
            }
        }

        // A decomposition may name a point that lies on the hull without being a vertex (an exact mixture of
        // others): solved again over the vertices only, which gives the same energy into vertices.
        for (int c = 0; c < m; c++)
        {
            if (IsVertexComposition[c] || AllVertices(DecompositionOf(c))) continue;
            int[] components = local.Components[c];
            int k = components.Length;
            int count = 0;
            foreach (int p in local.FacePoints[local.Masks[c]])
            {
                if (IsVertexPoint(p) && local.CompositionOf[p] != c) _columnBuffer[count++] = p;
            }

            _face.Refill(components, _columnBuffer.AsSpan(0, count), input, energy);
            var x = _x.AsSpan(0, k);
            _face.Restrict(input.FractionsOf(local.PointsOf[c][0]), x);
            var basis = _basis.AsSpan(0, k);
            var weights = _weights.AsSpan(0, k);
            _solver.ForgetCandidates();
            _solver.Solve(_face, x, excluded: -1, basis, weights, warm: false);
            _decompositionLength[c] = PositivePoints(_face, basis, weights, DecompositionSpace(c));
        }
    }

    /// <summary>
    /// The block of every column of composition <paramref name="c"/>'s face in this sample (its own representative
    /// among them, to be excluded), filled once per face and sample.
    /// </summary>
    private FaceBlock Face(int c, double[] energy)
    {
        ulong mask = _local.Masks[c];
        if (!_faces.TryGetValue(mask, out FaceBlock? face))
        {
            int[] points = _local.FacePoints[mask];
            face = new FaceBlock(ColumnBlock.Scratch(_local.MaxRows, points.Length), new int[_isColumn.Length]);
            _faces[mask] = face;
        }

        if (face.Sample != _sample)
        {
            int count = 0;
            foreach (int p in _local.FacePoints[mask])
            {
                if (_isColumn[p])
                {
                    face.ColumnOf[p] = count;
                    _columnBuffer[count++] = p;
                }
            }

            face.Block.Refill(_local.Components[c], _columnBuffer.AsSpan(0, count), _local.Input, energy);
            face.Sample = _sample;
        }

        return face;
    }

    private sealed class FaceBlock(ColumnBlock block, int[] columnOf)
    {
        public ColumnBlock Block { get; } = block;

        /// <summary>The column of each point that is one in this sample (other entries are stale).</summary>
        public int[] ColumnOf { get; } = columnOf;

        public long Sample { get; set; } = -1;
    }

    /// <summary>Whether point <paramref name="p"/> is a vertex of the last sample's hull.</summary>
    public bool IsVertexPoint(int p)
    {
        int c = _local.CompositionOf[p];
        return IsVertexComposition[c] && Representative[c] == p;
    }

    /// <summary>
    /// Walks composition <paramref name="c"/>'s ranked points against the last solve's plane until the bound of
    /// <see cref="LocalPrograms"/> covers the rest, appending each column not yet in the block that lies below the
    /// plane (by more than the solver's entering threshold) to the column buffer. Returns how many were appended;
    /// <paramref name="settled"/> tells whether the bound covered every point of the face past those checked.
    /// </summary>
    private int AddRankedBelow(int c, double lowestShift, double[] energy, ref int count, out bool settled)
    {
        ReadOnlySpan<double> mu = _solver.Plane;
        double[] plain = _local.PlainPlane[c];
        int[] components = _local.Components[c];
        double largestRise = double.NegativeInfinity;
        for (int r = 0; r < mu.Length; r++) largestRise = Math.Max(largestRise, mu[r] - plain[r]);
        // A point of plain reduced cost r0 lies at least r0 + slack above the sample's plane.
        double slack = lowestShift - largestRise;
        const double below = -BlockSimplex.EnteringReducedCost;
        int[] ranked = _local.Ranked[c];
        double[] rankedCost = _local.RankedCost[c];
        int added = 0;
        settled = false;
        for (int t = 0; t < ranked.Length; t++)
        {
            if (rankedCost[t] + slack >= below)
            {
                settled = true;
                break;
            }

            int p = ranked[t];
            if (!_isColumn[p] || _inBlock[p]) continue;
            var xp = _local.Input.FractionsOf(p);
            double cost = energy[p];
            for (int r = 0; r < components.Length; r++) cost -= mu[r] * xp[components[r]];
            if (cost < below && count < _nearCapacity)
            {
                _columnBuffer[count++] = p;
                _inBlock[p] = true;
                added++;
            }
            else if (cost < below)
            {
                return added;
            }
        }

        settled = settled || _local.Threshold[c] + slack >= below;
        return added;
    }

    private bool AllVertices(ReadOnlySpan<int> points)
    {
        foreach (int p in points) if (!IsVertexPoint(p)) return false;
        return true;
    }

    // The columns of block holding the given points, in basis order; false (basis untouched) if one is missing.
    private static bool FillBasis(ReadOnlySpan<int> points, ColumnBlock block, Span<int> basis)
    {
        if (points.Length != basis.Length) return false;
        Span<int> columns = stackalloc int[points.Length];
        for (int i = 0; i < points.Length; i++)
        {
            int column = Array.IndexOf(block.Points, points[i], 0, block.Count);
            if (column < 0) return false;
            columns[i] = column;
        }

        columns.CopyTo(basis);
        return true;
    }

    private Span<int> DecompositionSpace(int c) => _decomposition.AsSpan(c * _local.MaxRows, _local.MaxRows);

    // The points of the basis with a positive weight, ascending, written to points; returns how many.
    private static int PositivePoints(ColumnBlock block, ReadOnlySpan<int> basis, ReadOnlySpan<double> weights, Span<int> points)
    {
        int kept = 0;
        for (int i = 0; i < basis.Length; i++)
        {
            if (weights[i] > HullTolerances.BarycentricWeight) points[kept++] = block.Points[basis[i]];
        }

        points[..kept].Sort();
        return kept;
    }
}
