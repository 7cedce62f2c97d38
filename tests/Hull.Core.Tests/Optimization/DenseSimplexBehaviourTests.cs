using Hull.Core.Optimization;

namespace Hull.Core.Tests.Optimization;

/// <summary>Small programs solved by hand, the sign convention of the duals, limits and starts that go wrong.</summary>
public sealed class DenseSimplexBehaviourTests
{
    private const double Inf = double.PositiveInfinity;

    /// <summary>
    /// max 3x + 5y subject to x ≤ 4, 2y ≤ 12, 3x + 2y ≤ 18, x, y ≥ 0: optimum 36 at (2, 6) with duals (0, 3/2, 1)
    /// (from memory: the classic two-variable textbook example, re-derived: at (2, 6) rows 2 and 3 bind and
    /// 3/2·(0, 2) + 1·(3, 2) = (3, 5)).
    /// </summary>
    [Fact]
    public void Textbook_maximisation_gives_its_optimum_and_duals()
    {
        var b = new LinearProgramBuilder(ObjectiveSense.Maximize);
        int x = b.AddColumn(3), y = b.AddColumn(5);
        b.AddRow([(x, 1.0)], double.NegativeInfinity, 4);
        b.AddRow([(y, 2.0)], double.NegativeInfinity, 12);
        b.AddRow([(x, 3.0), (y, 2.0)], double.NegativeInfinity, 18);
        var r = DenseSimplex.Solve(b.Build());
        Assert.Equal(LinearProgramStatus.Optimal, r.Status);
        Assert.Equal(36, r.ObjectiveValue, 12);
        Assert.Equal([2.0, 6.0], r.ColumnValues.Select(v => Math.Round(v, 12)));
        // Maximisation at upper bounds: duals are the objective's gain per unit of bound, so positive.
        Assert.Equal([0.0, 1.5, 1.0], r.RowDuals.Select(v => Math.Round(v, 12)));
        Assert.Equal([0.0, 0.0], r.ReducedCosts.Select(v => Math.Round(v, 12)));
        Assert.Equal([BasisStatus.Basic, BasisStatus.AtUpper, BasisStatus.AtUpper], r.Basis!.RowStatuses.ToArray());
    }

    /// <summary>
    /// The example of DEVELOPERS.md, solved by hand: x − y = 1/2 and x + y ≥ 1 leave obj = x + 2y = 3y + 1/2 with
    /// y ≥ 1/4, so (x, y) = (3/4, 1/4) and 5/4; in general x = (b0 + e)/2, y = (b0 − e)/2 and obj = 3/2 b0 − 1/2 e,
    /// so the duals are 3/2 (row at its lower bound) and −1/2 (the equality).
    /// </summary>
    [Fact]
    public void Documented_example_gives_the_hand_solution()
    {
        var b = new LinearProgramBuilder(ObjectiveSense.Minimize);
        int x = b.AddColumn(cost: 1.0);
        int y = b.AddColumn(cost: 2.0, lower: double.NegativeInfinity);
        b.AddRow([(x, 1.0), (y, 1.0)], lower: 1.0, upper: double.PositiveInfinity);
        b.AddEquality([(x, 1.0), (y, -1.0)], rhs: 0.5);
        var r = DenseSimplex.Solve(b.Build());
        Assert.Equal(LinearProgramStatus.Optimal, r.Status);
        Assert.Equal(1.25, r.ObjectiveValue, 12);
        Assert.Equal([0.75, 0.25], r.ColumnValues.Select(v => Math.Round(v, 12)));
        Assert.Equal([1.5, -0.5], r.RowDuals.Select(v => Math.Round(v, 12)));
    }

    [Fact]
    public void Beales_cycling_example_terminates_at_its_optimum()
    {
        var r = DenseSimplex.Solve(ProgramGenerator.BealeCycling());
        Assert.Equal(LinearProgramStatus.Optimal, r.Status);
        Assert.Equal(-1.25, r.ObjectiveValue, 12); // from memory; SciPy HiGHS agrees in DenseSimplexReferenceTests
        Assert.Empty(OptimalityCheck.Problems(ProgramGenerator.BealeCycling(), r));
    }

    [Fact]
    public void Iteration_limit_is_reported_with_a_basis_that_finishes_the_solve()
    {
        var p = ProgramGenerator.Random(12, 20, 4242);
        var full = DenseSimplex.Solve(p);
        Assert.True(full.Iterations > 5, $"only {full.Iterations} iterations");
        var stopped = DenseSimplex.Solve(p, options: new SimplexOptions { IterationLimit = 3 });
        Assert.Equal(LinearProgramStatus.IterationLimit, stopped.Status);
        Assert.Equal(SimplexStopReason.IterationLimitReached, stopped.StopReason);
        Assert.Equal(3, stopped.Iterations);
        Assert.False(stopped.AreDualsValid);
        var resumed = DenseSimplex.Solve(p, stopped.Basis);
        Assert.Equal(LinearProgramStatus.Optimal, resumed.Status);
        Assert.True(resumed.WarmStartUsed);
        Assert.Equal(full.ObjectiveValue, resumed.ObjectiveValue, 9);
    }

    [Fact]
    public void A_singular_or_unsquare_starting_basis_is_set_aside()
    {
        var p = ProgramGenerator.Random(4, 6, 99);
        var cold = DenseSimplex.Solve(p);
        // Too many basic variables.
        var tooMany = new LinearProgramBasis(Enumerable.Repeat(BasisStatus.Basic, 6), Enumerable.Repeat(BasisStatus.Basic, 4));
        // Four basic columns, two of them equal: a dependent basis.
        var a = new double[4, 6];
        for (int i = 0; i < 4; i++) for (int j = 0; j < 6; j++) a[i, j] = p.Coefficient(i, j == 1 ? 0 : j);
        var twin = new LinearProgram(p.Sense, p.Objective.ToArray(), a, p.RowLower.ToArray(), p.RowUpper.ToArray(), p.ColumnLower.ToArray(), p.ColumnUpper.ToArray());
        var dependent = new LinearProgramBasis(
            [BasisStatus.Basic, BasisStatus.Basic, BasisStatus.Basic, BasisStatus.Basic, BasisStatus.AtLower, BasisStatus.AtLower],
            Enumerable.Repeat(BasisStatus.AtLower, 4));
        foreach (var (program, basis) in new[] { (p, tooMany), (twin, dependent) })
        {
            var r = DenseSimplex.Solve(program, basis);
            Assert.False(r.WarmStartUsed);
            Assert.Equal(DenseSimplex.Solve(program).Status, r.Status);
        }
        Assert.Equal(cold.ObjectiveValue, DenseSimplex.Solve(p, tooMany).ObjectiveValue, 12);
    }

    [Fact]
    public void Program_without_rows_puts_each_column_at_its_best_bound()
    {
        var p = new LinearProgram(ObjectiveSense.Minimize, [1, -2, 0], new double[0, 3], [], [], [-1, 0, -Inf], [3, 5, Inf]);
        var r = DenseSimplex.Solve(p);
        Assert.Equal(LinearProgramStatus.Optimal, r.Status);
        Assert.Equal([-1.0, 5.0, 0.0], r.ColumnValues.ToArray());
        Assert.Equal(-11, r.ObjectiveValue);
        Assert.Equal([1.0, -2.0, 0.0], r.ReducedCosts.ToArray());
    }

    [Fact]
    public void Free_column_unbounded_below_is_reported_with_its_ray()
    {
        // min −y subject to x − y ≥ −1, x ≥ 0, y free: y ≤ x + 1 grows with x without limit.
        var p = new LinearProgram(ObjectiveSense.Minimize, [0, -1], new double[,] { { 1, -1 } }, [-1], [Inf], [0, -Inf], [Inf, Inf]);
        var r = DenseSimplex.Solve(p);
        Assert.Equal(LinearProgramStatus.Unbounded, r.Status);
        Assert.Equal(SimplexStopReason.NoBlockingBound, r.StopReason);
        Assert.True(r.IsPrimalFeasible);
        var d = r.UnboundedRay;
        Assert.True(d[0] >= 0 && d[0] - d[1] >= -1e-12 && -d[1] < 0, $"ray ({d[0]}, {d[1]})");
    }

    [Fact]
    public void Infeasible_bounds_are_reported_naming_what_is_violated()
    {
        // x + y ≥ 5 with x, y in [0, 2].
        var p = new LinearProgram(ObjectiveSense.Minimize, [1, 1], new double[,] { { 1, 1 } }, [5], [Inf], [0, 0], [2, 2]);
        var r = DenseSimplex.Solve(p);
        Assert.Equal(LinearProgramStatus.Infeasible, r.Status);
        Assert.Equal(SimplexStopReason.InfeasibilityCannotBeReduced, r.StopReason);
        Assert.Contains("row 0", r.Message);
        Assert.False(r.IsPrimalFeasible || r.AreDualsValid);
    }
}
