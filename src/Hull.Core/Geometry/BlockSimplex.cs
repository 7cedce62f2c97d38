using System.Numerics;

namespace Hull.Core.Geometry;

/// <summary>
/// The hull energy at one composition as a linear program over the columns of a <see cref="ColumnBlock"/>:
/// minimise Σ w_j E_j subject to Σ w_j x_j = x, w ≥ 0 (Σ w_j = 1 follows, since every column's fractions sum to
/// 1). Solved by the primal simplex method on the k × k basis, refactorised from scratch at every step (k is the
/// number of components, at most a few dozen, so this costs far less than pricing the columns and never lets
/// rounding accumulate). One instance per thread: it owns its scratch space.
/// </summary>
internal sealed class BlockSimplex
{
    /// <summary>
    /// A column enters the basis only when it lies this far below the current plane (eV/atom). The plane and the
    /// reduced costs are computed from energies of order 1–10 eV/atom with rounding near 1e-15 relative; 1e-12 is
    /// well above that noise and far below <see cref="HullTolerances.EnergyEvPerAtom"/>, so a skipped column can
    /// change the optimum by no more than 1e-12 eV/atom.
    /// </summary>
    private const double EnteringReducedCost = 1e-12;

    /// <summary>
    /// Pivot entries of the entering direction at or below this are treated as zero in the ratio test: the
    /// direction solves a well-conditioned system of fractions in [0, 1], so genuine entries are far larger.
    /// </summary>
    private const double PivotEntry = 1e-11;

    /// <summary>
    /// After this many steps without a decrease of the objective (a degenerate stretch: the composition lies on a
    /// face shared by several bases), entering and leaving columns are chosen by Bland's smallest-index rule, which
    /// cannot cycle.
    /// </summary>
    private const int StallStepsBeforeBland = 8;

    /// <summary>
    /// Basis weights at or below this are zero in the ratio test. Weights are fractions of atoms computed through a
    /// well-conditioned solve, so rounding leaves them within about 1e-15 of their exact value.
    /// </summary>
    private const double ZeroWeight = 1e-13;

    private readonly int _maxRows;
    private readonly double[] _lu;
    private readonly int[] _pivots;
    private readonly double[] _weights;
    private readonly double[] _plane;
    private readonly double[] _direction;
    private int _rows;

    public BlockSimplex(int maxRows)
    {
        _maxRows = maxRows;
        _lu = new double[maxRows * maxRows];
        _pivots = new int[maxRows];
        _weights = new double[maxRows];
        _plane = new double[maxRows];
        _direction = new double[maxRows];
    }

    /// <summary>
    /// Solves the program at fractions <paramref name="x"/> (one value per row of the block, all positive or zero,
    /// summing to 1) without column <paramref name="excluded"/> (-1 for none) and without the columns flagged in
    /// <paramref name="excludedColumns"/> (if given; never a pure corner). <paramref name="basis"/> holds k
    /// columns: on entry a starting basis (if <paramref name="warm"/>, else overwritten by the pure corners), on
    /// exit the optimal one; <paramref name="weights"/> receives their weights. Returns the hull energy, eV/atom.
    /// </summary>
    public double Solve(ColumnBlock block, ReadOnlySpan<double> x, int excluded, Span<int> basis, Span<double> weights, bool warm,
        bool[]? excludedColumns = null)
    {
        int k = block.Components.Length;
        if (k > _maxRows) throw new ArgumentException($"The block has {k} rows; this solver was sized for {_maxRows}.");
        _rows = k;
        if (warm && !(TryFactor(block, basis, k) && PrimalFeasible(x, k) && !Contains(basis, k, excluded)
            && (excludedColumns is null || !ContainsFlagged(basis, k, excludedColumns))))
        {
            warm = false;
        }
        if (!warm)
        {
            block.CornerColumns.AsSpan().CopyTo(basis);
            // The pure corners form the identity matrix: always a feasible basis, with the fractions as weights.
            if (!TryFactor(block, basis, k) || !PrimalFeasible(x, k))
            {
                throw new InvalidOperationException("The pure corner points do not form a feasible basis.");
            }
        }

        double best = Objective(block, basis, k);
        int stall = 0;
        // A safety net against a loop, not a budget: Bland's rule terminates, but a long degenerate stretch on a
        // fine lattice can take thousands of steps.
        int limit = 1000 + 100 * k + 10 * block.Count;
        for (int step = 0; ; step++)
        {
            if (step > limit) throw new InvalidOperationException($"The hull program did not converge in {limit} simplex steps.");
            // Plane through the basis columns: solve B^T mu = E_B.
            var mu = _plane.AsSpan(0, k);
            for (int i = 0; i < k; i++) mu[i] = block.Energies[basis[i]];
            SmallLinearSolver.SolveTransposed(_lu.AsSpan(0, k * k), k, _pivots.AsSpan(0, k), mu);

            bool bland = stall >= StallStepsBeforeBland;
            int entering = bland || excludedColumns is not null
                ? FirstOrLowestBelow(block, mu, excluded, excludedColumns, lowest: !bland)
                : LowestBelow(block, mu, excluded);
            if (entering < 0) break;

            // Direction: B d = a_entering; the leaving column is the first weight to reach 0 along it.
            var d = _direction.AsSpan(0, k);
            for (int r = 0; r < k; r++) d[r] = block.Rows[r * block.Stride + entering];
            SmallLinearSolver.Solve(_lu.AsSpan(0, k * k), k, _pivots.AsSpan(0, k), d);
            int leaving = -1;
            double ratio = double.PositiveInfinity;
            for (int i = 0; i < k; i++)
            {
                if (d[i] <= PivotEntry) continue;
                // A weight within rounding of zero is zero: degenerate steps then tie exactly, as Bland's rule needs.
                double t = _weights[i] <= ZeroWeight ? 0.0 : _weights[i] / d[i];
                bool better = t < ratio
                    || (t == ratio && (bland ? basis[i] < basis[leaving] : d[i] > d[leaving]));
                if (better) { ratio = t; leaving = i; }
            }
            // Columns sum to 1 and so does B^-1 a: some entry of d is positive.
            if (leaving < 0) throw new InvalidOperationException("The hull program found no leaving column.");
            int previous = basis[leaving];
            basis[leaving] = entering;
            if (!TryFactor(block, basis, k))
            {
                basis[leaving] = previous;
                TryFactor(block, basis, k);
                throw new InvalidOperationException("The hull program reached a singular basis.");
            }
            PrimalFeasible(x, k);
            double objective = Objective(block, basis, k);
            if (objective < best - EnteringReducedCost * 1e-3) { best = objective; stall = 0; }
            else stall++;
        }

        double value = 0;
        for (int i = 0; i < k; i++)
        {
            weights[i] = _weights[i];
            value += _weights[i] * block.Energies[basis[i]];
        }
        return value;
    }

    /// <summary>
    /// The dual solution of the last <see cref="Solve"/>: the plane through its optimal basis, mu per row of the
    /// block (E = mu·x on the plane, eV/atom), computed from the final factorisation when optimality was
    /// established. Every column lies on or above it (to <see cref="EnteringReducedCost"/>), so it is the plane of a
    /// lower-hull facet holding the composition solved for.
    /// </summary>
    public ReadOnlySpan<double> Plane => _plane.AsSpan(0, _rows);

    private static bool Contains(Span<int> basis, int k, int column)
    {
        for (int i = 0; i < k; i++) if (basis[i] == column) return true;
        return false;
    }

    private static bool ContainsFlagged(Span<int> basis, int k, bool[] flagged)
    {
        for (int i = 0; i < k; i++) if (flagged[basis[i]]) return true;
        return false;
    }

    /// <summary>Factorises the basis matrix (row r, column i = fraction r of basis column i); false if singular.</summary>
    private bool TryFactor(ColumnBlock block, Span<int> basis, int k)
    {
        var lu = _lu.AsSpan(0, k * k);
        for (int r = 0; r < k; r++)
        {
            for (int i = 0; i < k; i++) lu[r * k + i] = block.Rows[r * block.Stride + basis[i]];
        }
        double det = SmallLinearSolver.Factorize(lu, k, _pivots.AsSpan(0, k));
        // Fractions in [0, 1]: a determinant this small means a basis of dependent columns.
        return Math.Abs(det) > 1e-300 && double.IsFinite(det) && MinPivot(lu, k) > 1e-13;
    }

    private static double MinPivot(Span<double> lu, int k)
    {
        double min = double.PositiveInfinity;
        for (int i = 0; i < k; i++) min = Math.Min(min, Math.Abs(lu[i * k + i]));
        return min;
    }

    /// <summary>Weights of the current factorised basis at x; true if none is negative beyond rounding.</summary>
    private bool PrimalFeasible(ReadOnlySpan<double> x, int k)
    {
        var w = _weights.AsSpan(0, k);
        x.Slice(0, k).CopyTo(w);
        SmallLinearSolver.Solve(_lu.AsSpan(0, k * k), k, _pivots.AsSpan(0, k), w);
        for (int i = 0; i < k; i++) if (w[i] < -HullTolerances.BarycentricWeight) return false;
        return true;
    }

    private double Objective(ColumnBlock block, Span<int> basis, int k)
    {
        double value = 0;
        for (int i = 0; i < k; i++) value += _weights[i] * block.Energies[basis[i]];
        return value;
    }

    /// <summary>
    /// Whether some column other than <paramref name="excluded"/> lies below the plane <paramref name="mu"/> (over the
    /// block's rows) by more than the entering threshold: false means the plane is optimal over the whole block.
    /// </summary>
    public static bool AnyColumnBelow(ColumnBlock block, ReadOnlySpan<double> mu, int excluded) => LowestBelow(block, mu, excluded) >= 0;

    /// <summary>The column with the most negative reduced cost E_j − mu·x_j below −threshold, or -1 (Dantzig's rule).</summary>
    private static int LowestBelow(ColumnBlock block, ReadOnlySpan<double> mu, int excluded)
    {
        int best = -1;
        double bestCost = -EnteringReducedCost;
        if (excluded < 0)
        {
            Scan(block, mu, 0, block.Count, ref best, ref bestCost);
        }
        else
        {
            Scan(block, mu, 0, excluded, ref best, ref bestCost);
            Scan(block, mu, excluded + 1, block.Count, ref best, ref bestCost);
        }
        return best;
    }

    private static void Scan(ColumnBlock block, ReadOnlySpan<double> mu, int from, int to, ref int best, ref double bestCost)
    {
        int k = mu.Length;
        int stride = block.Stride;
        double[] rows = block.Rows;
        double[] energies = block.Energies;
        int j = from;
        int width = Vector<double>.Count;
        if (Vector.IsHardwareAccelerated && to - from >= width)
        {
            var bestVec = new Vector<double>(bestCost);
            var bestIdx = new Vector<long>(-1);
            Span<long> lane = stackalloc long[width];
            for (int t = 0; t < width; t++) lane[t] = t;
            var offsets = new Vector<long>(lane);
            for (; j + width <= to; j += width)
            {
                var cost = new Vector<double>(energies, j);
                for (int r = 0; r < k; r++) cost -= new Vector<double>(mu[r]) * new Vector<double>(rows, r * stride + j);
                var lower = Vector.LessThan(cost, bestVec);
                if (lower != Vector<long>.Zero)
                {
                    bestVec = Vector.ConditionalSelect(lower, cost, bestVec);
                    bestIdx = Vector.ConditionalSelect(lower, new Vector<long>(j) + offsets, bestIdx);
                }
            }
            for (int t = 0; t < width; t++)
            {
                double c = bestVec[t];
                int idx = (int)bestIdx[t];
                if (idx >= 0 && (c < bestCost || (c == bestCost && idx < best))) { bestCost = c; best = idx; }
            }
        }
        for (; j < to; j++)
        {
            double cost = energies[j];
            for (int r = 0; r < k; r++) cost -= mu[r] * rows[r * stride + j];
            if (cost < bestCost) { bestCost = cost; best = j; }
        }
    }

    /// <summary>
    /// With <paramref name="lowest"/>, the column of most negative reduced cost (Dantzig's rule), else the
    /// lowest-index column (Bland's rule), below −threshold and not excluded; -1 if none. A plain scan: this path
    /// serves the rare solves with excluded columns and the degenerate stretches.
    /// </summary>
    private static int FirstOrLowestBelow(ColumnBlock block, ReadOnlySpan<double> mu, int excluded, bool[]? excludedColumns, bool lowest)
    {
        int k = mu.Length;
        int best = -1;
        double bestCost = -EnteringReducedCost;
        for (int j = 0; j < block.Count; j++)
        {
            if (j == excluded || (excludedColumns is not null && excludedColumns[j])) continue;
            double cost = block.Energies[j];
            for (int r = 0; r < k; r++) cost -= mu[r] * block.Rows[r * block.Stride + j];
            if (cost < bestCost)
            {
                if (!lowest) return j;
                bestCost = cost;
                best = j;
            }
        }
        return best;
    }
}

