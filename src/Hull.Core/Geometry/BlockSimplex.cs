using System.Numerics;

namespace Hull.Core.Geometry;

/// <summary>
/// The hull energy at one composition as a linear program over the columns of a <see cref="ColumnBlock"/>:
/// minimise Σ w_j E_j subject to Σ w_j x_j = x, w ≥ 0 (Σ w_j = 1 follows, since every column's fractions sum to
/// 1). Solved by the primal simplex method on the k × k basis (k is the number of components, at most a few dozen).
/// The basis inverse is kept explicitly and updated at each step by one elimination (k² operations instead of a
/// fresh k³ factorisation); it is computed afresh every <see cref="StepsBetweenFactorisations"/> steps and before
/// optimality is accepted, so rounding cannot accumulate into the answer. One instance per thread: it owns its
/// scratch space.
/// </summary>
internal sealed class BlockSimplex
{
    /// <summary>
    /// A column enters the basis only when it lies this far below the current plane (eV/atom). The plane and the
    /// reduced costs are computed from energies of order 1–10 eV/atom with rounding near 1e-15 relative; 1e-12 is
    /// well above that noise and far below <see cref="HullTolerances.EnergyEvPerAtom"/>, so a skipped column can
    /// change the optimum by no more than 1e-12 eV/atom.
    /// </summary>
    internal const double EnteringReducedCost = 1e-12;

    /// <summary>
    /// Pivot entries of the entering direction at or below this are treated as zero in the ratio test: the
    /// direction solves a well-conditioned system of fractions in [0, 1], so genuine entries are far larger.
    /// </summary>
    private const double PivotEntry = 1e-11;

    /// <summary>
    /// After this many steps without a decrease of the objective (a degenerate stretch: the composition lies on a
    /// face shared by several bases), entering and leaving columns are chosen by Bland's smallest-index rule, which
    /// cannot cycle (over the candidate list first, see <see cref="StallStepsBeforeBlandOverBlock"/>). Lattice data
    /// are full of such faces; a later switch costs fewer steps than an early one (measured on 8-component data).
    /// </summary>
    private const int StallStepsBeforeBland = 24;

    /// <summary>
    /// Basis weights at or below this are zero in the ratio test. Weights are fractions of atoms computed through a
    /// well-conditioned solve, so rounding leaves them within about 1e-15 of their exact value.
    /// </summary>
    private const double ZeroWeight = 1e-13;

    /// <summary>
    /// How many of the most negative columns a pricing pass over the whole block keeps as candidates for the next
    /// steps (multiple pricing). Steps price the candidates only, until none of them lies below the plane; a
    /// composition then costs a few passes over the block instead of one per step.
    /// </summary>
    private const int CandidateCount = 16;

    /// <summary>
    /// Blocks of fewer columns are priced in full at every step: the list would save little over one vectorised
    /// pass and costs its refills.
    /// </summary>
    private const int CandidateListFromColumns = 4 * CandidateCount;

    /// <summary>A pricing pass over a large block goes in this many sections at least (partial pricing).</summary>
    private const int PricingSections = 8;

    /// <summary>A pricing pass stops after a section once it has found this many candidates.</summary>
    private const int CandidatesToStopPricing = CandidateCount / 4;

    /// <summary>
    /// After this many steps without a decrease, Bland's rule runs over the whole block rather than the candidate
    /// list: slower per step, but it cannot cycle whatever the lists held.
    /// </summary>
    private const int StallStepsBeforeBlandOverBlock = 32 * StallStepsBeforeBland;

    /// <summary>
    /// Steps between fresh factorisations of the basis. Each update divides by a pivot entry above
    /// <see cref="PivotEntry"/> of a well-conditioned basis of fractions, so a few dozen updates lose a few digits at
    /// most; the final check below catches any drift that matters.
    /// </summary>
    private const int StepsBetweenFactorisations = 32;

    /// <summary>
    /// Optimality found with an updated inverse is accepted when the plane from a fresh factorisation differs from
    /// the updated one by at most this (eV/atom) per row: a column's reduced cost then moves by less than this
    /// (fractions sum to 1), a hundredth of <see cref="EnteringReducedCost"/>. Otherwise the block is priced again
    /// with the fresh plane.
    /// </summary>
    private const double PlaneDrift = 1e-14;

    private readonly int _maxRows;
    private readonly double[] _inverse;
    private readonly double[] _updatedPlane;
    private readonly double[] _lu;
    private readonly int[] _pivots;
    private readonly double[] _weights;
    private readonly double[] _plane;
    private readonly double[] _direction;
    private readonly int[] _candidates = new int[2 * CandidateCount];
    private readonly double[] _candidateCosts = new double[2 * CandidateCount];
    private readonly double[] _candidateEnergies = new double[2 * CandidateCount];
    private readonly double[] _candidateRows;
    private int _candidateCount;
    private int _priceFrom;
    private ColumnBlock? _candidatesOf;
    private int _rows;

    public BlockSimplex(int maxRows)
    {
        _maxRows = maxRows;
        _lu = new double[maxRows * maxRows];
        _inverse = new double[maxRows * maxRows];
        _updatedPlane = new double[maxRows];
        _pivots = new int[maxRows];
        _weights = new double[maxRows];
        _plane = new double[maxRows];
        _direction = new double[maxRows];
        _candidateRows = new double[maxRows * 2 * CandidateCount];
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
        bool seed = warm;
        if (warm && !(TryFactor(block, basis, k) && PrimalFeasible(x, k) && !Contains(basis, k, excluded)
            && (excludedColumns is null || !ContainsFlagged(basis, k, excludedColumns))))
        {
            warm = false;
        }
        // A starting basis that does not hold x still names the columns a nearby optimum is made of: they become
        // the candidate list, so that the first steps bring them in before the block is priced.
        if (seed && !warm) SeedCandidates(block, basis, k);
        if (!warm)
        {
            block.CornerColumns.AsSpan().CopyTo(basis);
            // The pure corners form the identity matrix, its own inverse: always a feasible basis, with the
            // fractions as weights.
            var inverse = _inverse.AsSpan(0, k * k);
            inverse.Clear();
            for (int i = 0; i < k; i++) inverse[i * k + i] = 1.0;
            if (!PrimalFeasible(x, k))
            {
                throw new InvalidOperationException("The pure corner points do not form a feasible basis.");
            }
        }

        if (!ReferenceEquals(_candidatesOf, block))
        {
            // Candidates are column indices of one block; a solve over another starts with none.
            _candidatesOf = block;
            _candidateCount = 0;
            _priceFrom = 0;
        }
        double best = Objective(block, basis, k);
        int stall = 0;
        // A safety net against a loop, not a budget: Bland's rule terminates, but a long degenerate stretch on a
        // fine lattice can take thousands of steps.
        int limit = 1000 + 100 * k + 10 * block.Count;
        int sinceFactorisation = 0;
        for (int step = 0; ; step++)
        {
            if (step > limit) throw new InvalidOperationException($"The hull program did not converge in {limit} simplex steps.");
            // Plane through the basis columns: mu = B^-T E_B.
            var mu = _plane.AsSpan(0, k);
            PlaneOfBasis(block, basis, k, mu);

            bool bland = stall >= StallStepsBeforeBland;
            int entering = Entering(block, mu, excluded, excludedColumns, bland, stall >= StallStepsBeforeBlandOverBlock);
            if (entering < 0)
            {
                if (sinceFactorisation == 0) break;
                // Optimal with an updated inverse: confirm with a fresh factorisation (weights and plane from it).
                var updated = _updatedPlane.AsSpan(0, k);
                mu.CopyTo(updated);
                if (!TryFactor(block, basis, k)) throw new InvalidOperationException("The hull program reached a singular basis.");
                sinceFactorisation = 0;
                PrimalFeasible(x, k);
                PlaneOfBasis(block, basis, k, mu);
                double drift = 0;
                for (int r = 0; r < k; r++) drift = Math.Max(drift, Math.Abs(mu[r] - updated[r]));
                if (drift <= PlaneDrift) break;
                continue;
            }

            // Direction: d = B^-1 a_entering; the leaving column is the first weight to reach 0 along it.
            var d = _direction.AsSpan(0, k);
            var inverse = _inverse.AsSpan(0, k * k);
            for (int i = 0; i < k; i++)
            {
                double sum = 0;
                var row = inverse.Slice(i * k, k);
                for (int r = 0; r < k; r++) sum += row[r] * block.Rows[r * block.Stride + entering];
                d[i] = sum;
            }
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
            if (++sinceFactorisation >= StepsBetweenFactorisations)
            {
                if (!TryFactor(block, basis, k))
                {
                    basis[leaving] = previous;
                    TryFactor(block, basis, k);
                    throw new InvalidOperationException("The hull program reached a singular basis.");
                }
                sinceFactorisation = 0;
            }
            else
            {
                UpdateInverse(k, leaving, d);
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
    /// Drops the candidate list: the next solve prices its block afresh. For a scratch block whose columns were
    /// filled again (see <see cref="ColumnBlock.Refill"/>), where the list would name columns of the old content.
    /// </summary>
    public void ForgetCandidates()
    {
        _candidatesOf = null;
        _candidateCount = 0;
        _priceFrom = 0;
    }

    /// <summary>
    /// The dual solution of the last <see cref="Solve"/>: the plane through its optimal basis, mu per row of the
    /// block (E = mu·x on the plane, eV/atom), computed from the final factorisation when optimality was
    /// established. Every column lies on or above it (to <see cref="EnteringReducedCost"/>), so it is the plane of a
    /// lower-hull facet holding the composition solved for.
    /// </summary>
    public ReadOnlySpan<double> Plane => _plane.AsSpan(0, _rows);

    private void SeedCandidates(ColumnBlock block, ReadOnlySpan<int> columns, int k)
    {
        if (block.Count < CandidateListFromColumns) return;
        if (!ReferenceEquals(_candidatesOf, block)) _priceFrom = 0;
        _candidatesOf = block;
        _candidateCount = 0;
        int listStride = 2 * CandidateCount;
        for (int i = 0; i < k && _candidateCount < listStride; i++)
        {
            int column = columns[i];
            if ((uint)column >= (uint)block.Count) continue;
            int slot = _candidateCount++;
            _candidates[slot] = column;
            _candidateEnergies[slot] = block.Energies[column];
            for (int r = 0; r < k; r++) _candidateRows[r * listStride + slot] = block.Rows[r * block.Stride + column];
        }
    }

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

    /// <summary>
    /// Factorises the basis matrix (row r, column i = fraction r of basis column i) and forms its inverse from the
    /// factors; false if singular.
    /// </summary>
    private bool TryFactor(ColumnBlock block, Span<int> basis, int k)
    {
        var lu = _lu.AsSpan(0, k * k);
        for (int r = 0; r < k; r++)
        {
            for (int i = 0; i < k; i++) lu[r * k + i] = block.Rows[r * block.Stride + basis[i]];
        }
        var pivots = _pivots.AsSpan(0, k);
        double det = SmallLinearSolver.Factorize(lu, k, pivots);
        // Fractions in [0, 1]: a determinant this small means a basis of dependent columns.
        if (!(Math.Abs(det) > 1e-300 && double.IsFinite(det) && MinPivot(lu, k) > 1e-13)) return false;
        var inverse = _inverse.AsSpan(0, k * k);
        var unit = _direction.AsSpan(0, k);
        for (int c = 0; c < k; c++)
        {
            unit.Clear();
            unit[c] = 1.0;
            SmallLinearSolver.Solve(lu, k, pivots, unit);
            for (int i = 0; i < k; i++) inverse[i * k + c] = unit[i];
        }
        return true;
    }

    /// <summary>
    /// The inverse after basis position <paramref name="leaving"/> takes the column whose direction is
    /// <paramref name="d"/> (= old B^-1 times that column): the pivot row is divided by d[leaving] and eliminated
    /// from the others.
    /// </summary>
    private void UpdateInverse(int k, int leaving, ReadOnlySpan<double> d)
    {
        var inverse = _inverse.AsSpan(0, k * k);
        var pivotRow = inverse.Slice(leaving * k, k);
        double scale = 1.0 / d[leaving];
        for (int r = 0; r < k; r++) pivotRow[r] *= scale;
        for (int i = 0; i < k; i++)
        {
            double factor = d[i];
            if (i == leaving || factor == 0.0) continue;
            var row = inverse.Slice(i * k, k);
            for (int r = 0; r < k; r++) row[r] -= factor * pivotRow[r];
        }
    }

    /// <summary>The plane through the basis columns, mu = B^-T E_B, from the current inverse.</summary>
    private void PlaneOfBasis(ColumnBlock block, Span<int> basis, int k, Span<double> mu)
    {
        var inverse = _inverse.AsSpan(0, k * k);
        mu.Clear();
        for (int i = 0; i < k; i++)
        {
            double energy = block.Energies[basis[i]];
            var row = inverse.Slice(i * k, k);
            for (int r = 0; r < k; r++) mu[r] += energy * row[r];
        }
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
        var inverse = _inverse.AsSpan(0, k * k);
        for (int i = 0; i < k; i++)
        {
            double sum = 0;
            var row = inverse.Slice(i * k, k);
            for (int r = 0; r < k; r++) sum += row[r] * x[r];
            w[i] = sum;
        }
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
    public static bool AnyColumnBelow(ColumnBlock block, ReadOnlySpan<double> mu, int excluded) => FirstBelow(block, mu, excluded, null) >= 0;

    /// <summary>Whether some column in [<paramref name="from"/>, <paramref name="to"/>) lies below the plane by more than the entering threshold.</summary>
    public static bool AnyColumnBelow(ColumnBlock block, ReadOnlySpan<double> mu, int from, int to)
    {
        int k = mu.Length;
        int stride = block.Stride;
        double[] rows = block.Rows;
        double[] energies = block.Energies;
        for (int j = from; j < to; j++)
        {
            double cost = energies[j];
            for (int r = 0; r < k; r++) cost -= mu[r] * rows[r * stride + j];
            if (cost < -EnteringReducedCost) return true;
        }
        return false;
    }

    /// <summary>
    /// The entering column, -1 when the plane is optimal over the whole block. Small blocks are priced in full at
    /// every step (Dantzig's rule: most negative reduced cost). Large ones price the candidate list first and the
    /// whole block only when no candidate lies below the plane, which refills the list and is also the optimality
    /// test over every column. In a degenerate stretch the rule is Bland's (lowest index), over the list at first
    /// and over the whole block when the stretch goes on, which cannot cycle.
    /// </summary>
    private int Entering(ColumnBlock block, ReadOnlySpan<double> mu, int excluded, bool[]? excludedColumns, bool bland, bool blandOverBlock)
    {
        if (blandOverBlock || (bland && block.Count < CandidateListFromColumns)) return FirstBelow(block, mu, excluded, excludedColumns);
        if (block.Count < CandidateListFromColumns)
        {
            return excludedColumns is null ? LowestBelow(block, mu, excluded) : PriceAll(block, mu, excluded, excludedColumns);
        }
        int entering = CandidateBelow(mu, excluded, excludedColumns, bland);
        if (entering >= 0) return entering;
        entering = PriceAll(block, mu, excluded, excludedColumns);
        // The list now holds the most negative columns; Bland's rule takes the lowest index among them.
        return entering >= 0 && bland ? CandidateBelow(mu, excluded, excludedColumns, bland: true) : entering;
    }

    /// <summary>
    /// Among the candidates below −threshold (not excluded): the most negative (lowest index among equals), or with
    /// <paramref name="bland"/> the lowest index; -1 if none. Candidates are hints only: a column found here lies
    /// below the plane whichever solve put it on the list.
    /// </summary>
    private int CandidateBelow(ReadOnlySpan<double> mu, int excluded, bool[]? excludedColumns, bool bland)
    {
        int count = _candidateCount;
        if (count == 0) return -1;
        int k = mu.Length;
        int stride = 2 * CandidateCount;
        var costs = _candidateCosts;
        int width = Vector<double>.Count;
        int i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            // The list's capacity is a multiple of the vector width, so the last vector stays inside the arrays.
            for (; i < count; i += width)
            {
                var cost = ReducedCosts(_candidateEnergies, _candidateRows, stride, mu, i);
                cost.CopyTo(costs, i);
            }
        }
        else
        {
            for (; i < count; i++)
            {
                double cost = _candidateEnergies[i];
                for (int r = 0; r < k; r++) cost -= mu[r] * _candidateRows[r * stride + i];
                costs[i] = cost;
            }
        }
        int best = -1;
        double bestCost = -EnteringReducedCost;
        for (i = 0; i < count; i++)
        {
            double cost = costs[i];
            int j = _candidates[i];
            if (!(cost < -EnteringReducedCost) || j == excluded || (excludedColumns is not null && excludedColumns[j])) continue;
            bool better = bland
                ? best < 0 || j < best
                : cost < bestCost || (cost == bestCost && j < best);
            if (better) { bestCost = cost; best = j; }
        }
        return best;
    }

    /// <summary>E_j − mu·x_j for the vector of columns from <paramref name="j"/> on, rows <paramref name="stride"/> apart.</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static Vector<double> ReducedCosts(double[] energies, double[] rows, int stride, ReadOnlySpan<double> mu, int j)
    {
        var cost = new Vector<double>(energies, j);
        for (int r = 0; r < mu.Length; r++) cost -= new Vector<double>(mu[r]) * new Vector<double>(rows, r * stride + j);
        return cost;
    }

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
                var cost = ReducedCosts(energies, rows, stride, mu, j);
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
    /// Prices every column of the block: returns the column of most negative reduced cost below −threshold (lowest
    /// index among equals; -1 if none, i.e. the plane is optimal over the whole block) and keeps the
    /// <see cref="CandidateCount"/> most negative as the candidate list.
    /// </summary>
    private int PriceAll(ColumnBlock block, ReadOnlySpan<double> mu, int excluded, bool[]? excludedColumns)
    {
        int k = mu.Length;
        int stride = block.Stride;
        int count = block.Count;
        double[] rows = block.Rows;
        double[] energies = block.Energies;
        _candidateCount = 0;
        // Costs below this enter the list: the threshold while the list has room, then the largest cost kept.
        double admit = -EnteringReducedCost;
        // Partial pricing: sections from where the last pass stopped, until enough candidates are found or every
        // column has been priced (which a pass without a candidate always does: that is the optimality test).
        int width = Vector<double>.Count;
        int section = Math.Max(CandidateListFromColumns, count / PricingSections) / width * width;
        if (_priceFrom >= count) _priceFrom = 0;
        for (int priced = 0; priced < count && _candidateCount < CandidatesToStopPricing;)
        {
            int from = _priceFrom;
            int to = Math.Min(count, from + section);
            PriceRange(block, mu, from, to, excluded, excludedColumns, ref admit);
            priced += to - from;
            _priceFrom = to == count ? 0 : to;
        }
        int best = -1;
        double bestCost = double.PositiveInfinity;
        int listStride = 2 * CandidateCount;
        for (int i = 0; i < _candidateCount; i++)
        {
            double c = _candidateCosts[i];
            int column = _candidates[i];
            if (c < bestCost || (c == bestCost && column < best)) { bestCost = c; best = column; }
            // The list keeps its own copy of the columns, contiguous, so that pricing it is a run of vector operations.
            _candidateEnergies[i] = energies[column];
            for (int r = 0; r < k; r++) _candidateRows[r * listStride + i] = rows[r * stride + column];
        }
        return best;
    }

    private void PriceRange(ColumnBlock block, ReadOnlySpan<double> mu, int from, int to, int excluded, bool[]? excludedColumns, ref double admit)
    {
        int k = mu.Length;
        int stride = block.Stride;
        double[] rows = block.Rows;
        double[] energies = block.Energies;
        int j = from;
        int width = Vector<double>.Count;
        if (Vector.IsHardwareAccelerated)
        {
            var admitVec = new Vector<double>(admit);
            for (; j + width <= to; j += width)
            {
                var cost = ReducedCosts(energies, rows, stride, mu, j);
                if (!Vector.LessThanAny(cost, admitVec)) continue;
                for (int t = 0; t < width; t++)
                {
                    if (cost[t] < admit && Admit(j + t, cost[t], excluded, excludedColumns, ref admit)) admitVec = new Vector<double>(admit);
                }
            }
        }
        for (; j < to; j++)
        {
            double cost = energies[j];
            for (int r = 0; r < k; r++) cost -= mu[r] * rows[r * stride + j];
            if (cost < admit) Admit(j, cost, excluded, excludedColumns, ref admit);
        }
    }

    /// <summary>
    /// Puts a column below the admission cost on the candidate list. The list holds up to twice
    /// <see cref="CandidateCount"/>; when full, it keeps the <see cref="CandidateCount"/> lowest and raises the
    /// admission cost to the largest of those (amortised constant time per column). Returns whether it changed.
    /// </summary>
    private bool Admit(int column, double cost, int excluded, bool[]? excludedColumns, ref double admit)
    {
        if (column == excluded || (excludedColumns is not null && excludedColumns[column])) return false;
        _candidates[_candidateCount] = column;
        _candidateCosts[_candidateCount++] = cost;
        if (_candidateCount < 2 * CandidateCount) return false;
        KeepLowest(CandidateCount);
        _candidateCount = CandidateCount;
        double largest = double.NegativeInfinity;
        for (int i = 0; i < CandidateCount; i++) largest = Math.Max(largest, _candidateCosts[i]);
        admit = largest;
        return true;
    }

    /// <summary>Reorders the list so that its first <paramref name="keep"/> entries have the lowest costs (quickselect).</summary>
    private void KeepLowest(int keep)
    {
        int lo = 0, hi = _candidateCount - 1;
        while (lo < hi)
        {
            double pivot = _candidateCosts[(lo + hi) >>> 1];
            int i = lo, j = hi;
            while (i <= j)
            {
                while (_candidateCosts[i] < pivot) i++;
                while (_candidateCosts[j] > pivot) j--;
                if (i > j) break;
                (_candidateCosts[i], _candidateCosts[j]) = (_candidateCosts[j], _candidateCosts[i]);
                (_candidates[i], _candidates[j]) = (_candidates[j], _candidates[i]);
                i++;
                j--;
            }
            // [lo, j] ≤ pivot ≤ [i, hi]: continue in the part that holds position keep - 1.
            if (keep - 1 <= j) hi = j;
            else if (keep - 1 >= i) lo = i;
            else return;
        }
    }

    /// <summary>
    /// The lowest-index column below −threshold that is not excluded, or -1 (Bland's rule; also the plain question
    /// whether any column lies below the plane). Stops at the first such column.
    /// </summary>
    private static int FirstBelow(ColumnBlock block, ReadOnlySpan<double> mu, int excluded, bool[]? excludedColumns)
    {
        int k = mu.Length;
        int stride = block.Stride;
        int count = block.Count;
        double[] rows = block.Rows;
        double[] energies = block.Energies;
        const double below = -EnteringReducedCost;
        int j = 0;
        int width = Vector<double>.Count;
        if (Vector.IsHardwareAccelerated && count >= width)
        {
            var belowVec = new Vector<double>(below);
            for (; j + width <= count; j += width)
            {
                var cost = ReducedCosts(energies, rows, stride, mu, j);
                if (!Vector.LessThanAny(cost, belowVec)) continue;
                for (int t = 0; t < width; t++)
                {
                    int column = j + t;
                    if (cost[t] < below && column != excluded && (excludedColumns is null || !excludedColumns[column])) return column;
                }
            }
        }
        for (; j < count; j++)
        {
            if (j == excluded || (excludedColumns is not null && excludedColumns[j])) continue;
            double cost = energies[j];
            for (int r = 0; r < k; r++) cost -= mu[r] * rows[r * stride + j];
            if (cost < below) return j;
        }
        return -1;
    }
}

