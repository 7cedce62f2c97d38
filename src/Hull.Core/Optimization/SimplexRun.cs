using System.Collections.Immutable;

namespace Hull.Core.Optimization;

/// <summary>
/// One solve of <see cref="DenseSimplex"/>: the working state of the bounded primal simplex method over the
/// structural columns 0..n−1 and the row logicals n..n+m−1 (logical i has column −e_i and row i's bounds).
/// </summary>
internal sealed class SimplexRun
{
    /// <summary>
    /// A step that changes the phase's objective by no more than this counts as degenerate (towards Bland's rule):
    /// the objective is of order 1–100 in this project's programs, and 1e-13 is rounding there, not progress.
    /// </summary>
    private const double NegligibleImprovement = 1e-13;

    private readonly LinearProgram _program;
    private readonly int _limit;
    private readonly int _m;
    private readonly int _n;
    private readonly double[] _a;
    private readonly double[] _lower;
    private readonly double[] _upper;
    private readonly double[] _cost;
    private readonly double[] _x;
    private readonly int[] _head;
    private readonly BasisStatus[] _status;
    private readonly BasisInverse _inverse;
    private readonly double[] _basicCost;
    private readonly double[] _y;
    private readonly double[] _d;
    private readonly double[] _alpha;
    private readonly double[] _rhs;
    private int _degenerateIterations;
    private int _blandIterations;

    public SimplexRun(LinearProgram program, int limit)
    {
        _program = program;
        _limit = limit;
        _m = program.RowCount;
        _n = program.ColumnCount;
        _a = program.MatrixRowMajor;
        int total = _n + _m;
        _lower = new double[total];
        _upper = new double[total];
        _cost = new double[total];
        program.ColumnLower.CopyTo(_lower);
        program.ColumnUpper.CopyTo(_upper);
        program.RowLower.CopyTo(_lower.AsSpan(_n));
        program.RowUpper.CopyTo(_upper.AsSpan(_n));
        double sign = program.Sense == ObjectiveSense.Maximize ? -1.0 : 1.0;
        for (int j = 0; j < _n; j++) _cost[j] = sign * program.Objective[j];
        _x = new double[total];
        _head = new int[_m];
        _status = new BasisStatus[total];
        _inverse = new BasisInverse(_m);
        _basicCost = new double[_m];
        _y = new double[_m];
        _d = new double[total];
        _alpha = new double[_m];
        _rhs = new double[_m];
    }

    public LinearProgramResult Run(LinearProgramBasis? start)
    {
        bool warm = start is not null && TryWarmStart(start);
        if (!warm) ColdStart();

        int iterations = 0, feasibilityIterations = 0, degenerateSteps = 0;
        _degenerateIterations = _blandIterations = 0;
        while (true)
        {
            bool infeasible = SetPhaseCosts();
            PriceAll(infeasible);
            bool bland = degenerateSteps >= SimplexTolerances.DegenerateStepsBeforeBland;
            var (entering, direction) = ChooseEntering(bland);
            if (entering < 0)
            {
                // Verdicts are taken on a fresh factorisation only.
                if (_inverse.UpdatesSinceRefactor > 0)
                {
                    if (!Refactor()) return Failed(iterations, feasibilityIterations, warm);
                    continue;
                }
                return infeasible
                    ? Finish(LinearProgramStatus.Infeasible, SimplexStopReason.InfeasibilityCannotBeReduced, InfeasibleMessage(), iterations, feasibilityIterations, warm)
                    : Finish(LinearProgramStatus.Optimal, SimplexStopReason.NoImprovingColumn, $"Optimal after {iterations} iterations.", iterations, feasibilityIterations, warm);
            }
            if (iterations >= _limit)
            {
                return Finish(LinearProgramStatus.IterationLimit, SimplexStopReason.IterationLimitReached,
                    $"Stopped at the iteration limit ({_limit}) {(infeasible ? "before a feasible point was found" : "at a feasible, not yet optimal point")}.",
                    iterations, feasibilityIterations, warm);
            }

            ComputeAlpha(entering);
            var (leaving, step, flip, leavesAtUpper) = RatioTest(entering, direction, infeasible, bland);
            if (leaving < 0 && !flip)
            {
                if (_inverse.UpdatesSinceRefactor > 0)
                {
                    if (!Refactor()) return Failed(iterations, feasibilityIterations, warm);
                    continue;
                }
                if (!infeasible)
                {
                    return Finish(LinearProgramStatus.Unbounded, SimplexStopReason.NoBlockingBound,
                        $"The objective improves without limit as {VariableName(entering)} {(direction > 0 ? "increases" : "decreases")}.",
                        iterations, feasibilityIterations, warm, Ray(entering, direction));
                }
                // The sum of violations is bounded below, so an improving direction always meets a breakpoint unless
                // every pivot entry was below the pivot tolerance: the basis is too ill-conditioned to go on.
                return Failed(iterations, feasibilityIterations, warm);
            }

            double improvement = step * Math.Abs(_d[entering]);
            Apply(entering, direction, leaving, step, flip, leavesAtUpper);
            iterations++;
            if (infeasible) feasibilityIterations++;
            if (bland) _blandIterations++;
            bool degenerate = improvement <= NegligibleImprovement;
            if (degenerate) _degenerateIterations++;
            degenerateSteps = degenerate ? degenerateSteps + 1 : 0;
            if (_inverse.UpdatesSinceRefactor >= SimplexTolerances.RefactorInterval && !Refactor())
            {
                return Failed(iterations, feasibilityIterations, warm);
            }
        }
    }

    private bool IsFixed(int v) => _lower[v] == _upper[v];

    private string VariableName(int v) => v < _n ? $"column {v}" : $"the activity of row {v - _n}";

    /// <summary>Every logical basic (B = −I), every column at a finite bound or, if free, at zero.</summary>
    private void ColdStart()
    {
        for (int j = 0; j < _n; j++) SetNonbasic(j, double.IsFinite(_lower[j]) ? BasisStatus.AtLower : BasisStatus.AtUpper);
        for (int i = 0; i < _m; i++)
        {
            _head[i] = _n + i;
            _status[_n + i] = BasisStatus.Basic;
        }
        if (!Refactor()) throw new InvalidOperationException("The all-logical basis −I did not factorise.");
    }

    private bool TryWarmStart(LinearProgramBasis start)
    {
        int basic = 0;
        for (int v = 0; v < _n + _m; v++)
        {
            var s = v < _n ? start.ColumnStatuses[v] : start.RowStatuses[v - _n];
            if (s == BasisStatus.Basic)
            {
                if (basic == _m) return false;
                _head[basic++] = v;
                _status[v] = BasisStatus.Basic;
            }
            else
            {
                SetNonbasic(v, s);
            }
        }
        return basic == _m && Refactor();
    }

    /// <summary>Makes v nonbasic with the status asked for where its bounds allow it, else the nearest that they do.</summary>
    private void SetNonbasic(int v, BasisStatus wanted)
    {
        double l = _lower[v], u = _upper[v];
        bool hasLower = double.IsFinite(l), hasUpper = double.IsFinite(u);
        var status = wanted switch
        {
            _ when IsFixed(v) => BasisStatus.AtLower,
            BasisStatus.AtUpper when hasUpper => BasisStatus.AtUpper,
            BasisStatus.AtLower when hasLower => BasisStatus.AtLower,
            _ when hasLower => BasisStatus.AtLower,
            _ when hasUpper => BasisStatus.AtUpper,
            _ => BasisStatus.FreeAtZero,
        };
        _status[v] = status;
        _x[v] = status switch { BasisStatus.AtLower => l, BasisStatus.AtUpper => u, _ => 0.0 };
    }

    /// <summary>A fresh inverse and basic values recomputed from the nonbasic ones; false if the basis is singular.</summary>
    private bool Refactor()
    {
        if (!_inverse.Refactor(FillColumn)) return false;
        // B x_B = −N x_N, from [A −I](x, s) = 0.
        for (int i = 0; i < _m; i++) _rhs[i] = 0;
        for (int j = 0; j < _n; j++)
        {
            if (_status[j] == BasisStatus.Basic || _x[j] == 0) continue;
            double xj = _x[j];
            for (int i = 0; i < _m; i++) _rhs[i] -= _a[i * _n + j] * xj;
        }
        for (int i = 0; i < _m; i++)
        {
            if (_status[_n + i] != BasisStatus.Basic) _rhs[i] += _x[_n + i];
        }
        for (int r = 0; r < _m; r++)
        {
            var row = _inverse.Row(r);
            double s = 0;
            for (int i = 0; i < _m; i++) s += row[i] * _rhs[i];
            _x[_head[r]] = s;
        }
        return true;
    }

    private void FillColumn(int position, Span<double> column)
    {
        int v = _head[position];
        if (v < _n)
        {
            for (int i = 0; i < _m; i++) column[i] = _a[i * _n + v];
        }
        else
        {
            column.Clear();
            column[v - _n] = -1.0;
        }
    }

    /// <summary>
    /// Costs of the basic variables for this iteration: with any bound violated beyond the tolerance, the
    /// feasibility phase's ±1 per violation (returns true); else the objective's.
    /// </summary>
    private bool SetPhaseCosts()
    {
        bool infeasible = false;
        for (int r = 0; r < _m; r++)
        {
            int v = _head[r];
            double value = _x[v];
            if (value < _lower[v] - SimplexTolerances.PrimalFeasibility) { _basicCost[r] = -1.0; infeasible = true; }
            else if (value > _upper[v] + SimplexTolerances.PrimalFeasibility) { _basicCost[r] = 1.0; infeasible = true; }
            else _basicCost[r] = 0.0;
        }
        if (!infeasible)
        {
            for (int r = 0; r < _m; r++) _basicCost[r] = _cost[_head[r]];
        }
        return infeasible;
    }

    /// <summary>y = c_B B⁻¹ and the reduced costs d of every variable (0 for basic ones) under this phase's costs.</summary>
    private void PriceAll(bool feasibilityPhase)
    {
        Array.Clear(_y);
        for (int r = 0; r < _m; r++)
        {
            double c = _basicCost[r];
            if (c == 0) continue;
            var row = _inverse.Row(r);
            for (int i = 0; i < _m; i++) _y[i] += c * row[i];
        }
        for (int j = 0; j < _n; j++) _d[j] = feasibilityPhase ? 0.0 : _cost[j];
        for (int i = 0; i < _m; i++)
        {
            double yi = _y[i];
            // Logical i: cost 0, column −e_i.
            _d[_n + i] = yi;
            if (yi == 0) continue;
            int offset = i * _n;
            for (int j = 0; j < _n; j++) _d[j] -= yi * _a[offset + j];
        }
        for (int r = 0; r < _m; r++) _d[_head[r]] = 0;
    }

    /// <summary>
    /// The entering variable and its direction (+1 up, −1 down): the largest improving reduced cost, or with
    /// <paramref name="bland"/> the lowest-index improving variable; (-1, 0) at an optimum of this phase.
    /// </summary>
    private (int Variable, int Direction) ChooseEntering(bool bland)
    {
        int best = -1, bestDirection = 0;
        double bestGain = 0;
        for (int v = 0; v < _n + _m; v++)
        {
            var s = _status[v];
            if (s == BasisStatus.Basic || IsFixed(v)) continue;
            double d = _d[v];
            int direction = s switch
            {
                BasisStatus.AtLower => d < -SimplexTolerances.DualFeasibility ? 1 : 0,
                BasisStatus.AtUpper => d > SimplexTolerances.DualFeasibility ? -1 : 0,
                _ => d < -SimplexTolerances.DualFeasibility ? 1 : d > SimplexTolerances.DualFeasibility ? -1 : 0,
            };
            if (direction == 0) continue;
            if (bland) return (v, direction);
            if (Math.Abs(d) > bestGain)
            {
                bestGain = Math.Abs(d);
                best = v;
                bestDirection = direction;
            }
        }
        return (best, bestDirection);
    }

    /// <summary>α = B⁻¹ a_q, the entering column in the basis's coordinates.</summary>
    private void ComputeAlpha(int q)
    {
        if (q < _n)
        {
            for (int r = 0; r < _m; r++)
            {
                var row = _inverse.Row(r);
                double s = 0;
                for (int i = 0; i < _m; i++) s += row[i] * _a[i * _n + q];
                _alpha[r] = s;
            }
        }
        else
        {
            int i = q - _n;
            for (int r = 0; r < _m; r++) _alpha[r] = -_inverse[r, i];
        }
    }

    /// <summary>
    /// How far the entering variable moves: the leaving basis position (or -1), the step, and whether the entering
    /// variable reaches its own other bound first (a bound flip, no basis change), and whether the leaving
    /// variable rests at its upper bound.
    /// </summary>
    private (int Leaving, double Step, bool Flip, bool LeavesAtUpper) RatioTest(int q, int direction, bool feasibilityPhase, bool bland)
    {
        double flipRange = _upper[q] - _lower[q]; // +∞ unless both bounds are finite
        // Pass 1: the largest step that leaves no basic variable beyond its bound by more than the tolerance
        // (Harris), or with Bland's rule the exact smallest ratio.
        double limit = double.PositiveInfinity;
        for (int r = 0; r < _m; r++)
        {
            if (!Blocks(r, direction, feasibilityPhase, out double ratio, out double relaxed, out _)) continue;
            limit = Math.Min(limit, bland ? ratio : relaxed);
        }
        if (double.IsPositiveInfinity(limit)) return double.IsFinite(flipRange) ? (-1, flipRange, true, false) : (-1, 0, false, false);

        // Pass 2: among the rows blocking within that step, the largest pivot (Bland: the lowest variable index).
        int leaving = -1;
        double step = 0, bestPivot = 0;
        bool leavesAtUpper = false;
        for (int r = 0; r < _m; r++)
        {
            if (!Blocks(r, direction, feasibilityPhase, out double ratio, out _, out bool atUpper) || ratio > limit) continue;
            double pivot = Math.Abs(_alpha[r]);
            bool better = leaving < 0 || (bland ? _head[r] < _head[leaving] : pivot > bestPivot);
            if (better)
            {
                leaving = r;
                step = ratio;
                bestPivot = pivot;
                leavesAtUpper = atUpper;
            }
        }
        if (flipRange <= step) return (-1, flipRange, true, false);
        return (leaving, step, false, leavesAtUpper);
    }

    /// <summary>
    /// Whether basic position r stops the entering variable, and at which step (exact, clamped at zero, and relaxed
    /// by the feasibility tolerance), and whether that bound is its upper one. Feasible variables stop at the bound
    /// they move towards; in the feasibility phase a violated one stops where it becomes feasible (the first
    /// breakpoint of the sum of violations).
    /// </summary>
    private bool Blocks(int r, int direction, bool feasibilityPhase, out double ratio, out double relaxed, out bool atUpper)
    {
        const double tol = SimplexTolerances.PrimalFeasibility;
        ratio = relaxed = 0;
        atUpper = false;
        double rate = -direction * _alpha[r];
        if (Math.Abs(rate) <= SimplexTolerances.PivotEntry) return false;
        int v = _head[r];
        double value = _x[v], l = _lower[v], u = _upper[v];
        bool below = feasibilityPhase && value < l - tol;
        bool above = feasibilityPhase && value > u + tol;
        double distance;
        if (rate < 0)
        {
            // Decreasing: blocked by the lower bound if feasible, by the upper bound if above it, never if below.
            if (below) return false;
            atUpper = above;
            double bound = above ? u : l;
            if (!double.IsFinite(bound)) return false;
            distance = value - bound;
        }
        else
        {
            if (above) return false;
            atUpper = !below;
            double bound = below ? l : u;
            if (!double.IsFinite(bound)) return false;
            distance = bound - value;
        }
        double speed = Math.Abs(rate);
        ratio = Math.Max(distance, 0) / speed;
        relaxed = (Math.Max(distance, 0) + tol) / speed;
        return true;
    }

    private void Apply(int q, int direction, int leaving, double step, bool flip, bool leavesAtUpper)
    {
        for (int r = 0; r < _m; r++) _x[_head[r]] -= direction * _alpha[r] * step;
        if (flip)
        {
            bool toUpper = _status[q] != BasisStatus.AtUpper;
            _status[q] = toUpper ? BasisStatus.AtUpper : BasisStatus.AtLower;
            _x[q] = toUpper ? _upper[q] : _lower[q];
            return;
        }
        _x[q] += direction * step;
        // The leaving variable rests exactly on the bound that stopped it.
        SetNonbasic(_head[leaving], leavesAtUpper ? BasisStatus.AtUpper : BasisStatus.AtLower);
        _head[leaving] = q;
        _status[q] = BasisStatus.Basic;
        _inverse.Replace(leaving, _alpha);
    }

    private string InfeasibleMessage()
    {
        int worst = -1;
        double worstViolation = 0;
        for (int r = 0; r < _m; r++)
        {
            int v = _head[r];
            double violation = Math.Max(_lower[v] - _x[v], _x[v] - _upper[v]);
            if (violation > worstViolation) { worstViolation = violation; worst = v; }
        }
        return worst < 0
            ? "No point satisfies every bound."
            : $"No point satisfies every bound: the least total violation still leaves {VariableName(worst)} {worstViolation:G6} outside its bounds.";
    }

    private LinearProgramResult Failed(int iterations, int feasibilityIterations, bool warm) =>
        Finish(LinearProgramStatus.NumericalFailure, SimplexStopReason.SingularBasis,
            "The basis became numerically singular; the program may be badly scaled or nearly degenerate in its coefficients.",
            iterations, feasibilityIterations, warm);

    /// <summary>The improving direction of the structural columns when entering variable q moves without limit.</summary>
    private ImmutableArray<double> Ray(int q, int direction)
    {
        var ray = new double[_n];
        if (q < _n) ray[q] = direction;
        for (int r = 0; r < _m; r++)
        {
            if (_head[r] < _n) ray[_head[r]] = -direction * _alpha[r];
        }
        return [.. ray];
    }

    private LinearProgramResult Finish(LinearProgramStatus status, SimplexStopReason reason, string message,
        int iterations, int feasibilityIterations, bool warm, ImmutableArray<double> ray = default)
    {
        var values = new double[_n];
        Array.Copy(_x, values, _n);
        var activities = new double[_m];
        double objective = 0, primalViolation = 0;
        for (int j = 0; j < _n; j++)
        {
            objective += _program.Objective[j] * values[j];
            primalViolation = Math.Max(primalViolation, Math.Max(_lower[j] - values[j], values[j] - _upper[j]));
        }
        for (int i = 0; i < _m; i++)
        {
            double s = 0;
            for (int j = 0; j < _n; j++) s += _a[i * _n + j] * values[j];
            activities[i] = s;
            primalViolation = Math.Max(primalViolation, Math.Max(_lower[_n + i] - s, s - _upper[_n + i]));
        }

        bool optimal = status == LinearProgramStatus.Optimal;
        // Duals of the final basis under the objective's costs (the phase costs are already those when optimal).
        var rowDuals = new double[_m];
        var reducedCosts = new double[_n];
        double dualViolation = double.NaN;
        if (optimal)
        {
            double sign = _program.Sense == ObjectiveSense.Maximize ? -1.0 : 1.0;
            dualViolation = 0;
            for (int v = 0; v < _n + _m; v++)
            {
                double d = _d[v];
                if (v < _n) reducedCosts[v] = sign * d;
                else rowDuals[v - _n] = sign * d;
                if (IsFixed(v)) continue;
                double wrong = _status[v] switch
                {
                    BasisStatus.AtLower => -d,
                    BasisStatus.AtUpper => d,
                    _ => Math.Abs(d),
                };
                dualViolation = Math.Max(dualViolation, wrong);
            }
        }
        var basis = new LinearProgramBasis(_status.AsSpan(0, _n).ToArray(), _status.AsSpan(_n, _m).ToArray());
        return new LinearProgramResult(status, reason, message)
        {
            ObjectiveValue = objective,
            ColumnValues = [.. values],
            RowActivities = [.. activities],
            RowDuals = [.. rowDuals],
            ReducedCosts = [.. reducedCosts],
            IsPrimalFeasible = primalViolation <= SimplexTolerances.PrimalFeasibility,
            AreDualsValid = optimal,
            Iterations = iterations,
            FeasibilityIterations = feasibilityIterations,
            DegenerateIterations = _degenerateIterations,
            BlandIterations = _blandIterations,
            WarmStartUsed = warm,
            Basis = basis,
            MaxPrimalViolation = primalViolation,
            MaxDualViolation = dualViolation,
            UnboundedRay = ray.IsDefault ? [] : ray,
        };
    }
}
