using Hull.Core.Optimization;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Optimization;

/// <summary>
/// A basis from one solve starts the next solve of a changed program: the same optimum (verified by the
/// optimality conditions and against the cold solve) in fewer iterations. Iteration counts, never times.
/// </summary>
public sealed class WarmStartTests(ITestOutputHelper output)
{
    private static IEnumerable<LinearProgram> Programs() =>
        Enumerable.Range(0, 12).Select(s => ProgramGenerator.Random(10 + s % 5, 16 + s % 7, 7000 + s))
            .Where(p => DenseSimplex.Solve(p).Status == LinearProgramStatus.Optimal);

    [Fact]
    public void Shifted_row_bound_resolves_from_the_last_basis_in_fewer_iterations()
    {
        Check("row bound", p =>
        {
            // The first row with a finite bound moves by half its size: the old optimal basis becomes infeasible or
            // suboptimal in most programs, and a few pivots repair it.
            int i = Enumerable.Range(0, p.RowCount).First(r => double.IsFinite(p.RowLower[r]) || double.IsFinite(p.RowUpper[r]));
            double l = p.RowLower[i], u = p.RowUpper[i];
            double shift = 0.5 * (1 + Math.Abs(double.IsFinite(u) ? u : l));
            return p.WithRowBounds(i, l + shift, u + shift);
        });
    }

    [Fact]
    public void Changed_objective_resolves_from_the_last_basis_in_fewer_iterations()
    {
        Check("objective", p =>
        {
            var c = p.Objective.ToArray();
            for (int j = 0; j < c.Length; j++) c[j] *= 1 + 0.3 * Math.Sin(j + 1);
            return p.WithObjective(p.Sense, c);
        });
    }

    [Fact]
    public void Appended_row_cutting_off_the_optimum_resolves_from_the_extended_basis_in_fewer_iterations()
    {
        Check("appended row", p =>
        {
            // A cut through the old optimum: Σ x_j ≤ Σ x*_j − 0.1 (or ≥ … + 0.1 when maximising the sum would not bind).
            var x = DenseSimplex.Solve(p).ColumnValues;
            var row = Enumerable.Repeat(1.0, p.ColumnCount).ToArray();
            double sum = x.Sum();
            return p.WithRowAppended(row, double.NegativeInfinity, sum - 0.1);
        }, basis => basis.WithRowsAppended(1));
    }

    private void Check(string change, Func<LinearProgram, LinearProgram> modify, Func<LinearProgramBasis, LinearProgramBasis>? adapt = null)
    {
        int cases = 0, coldTotal = 0, warmTotal = 0;
        var problems = new List<string>();
        foreach (var p in Programs())
        {
            var first = DenseSimplex.Solve(p);
            var changed = modify(p);
            var cold = DenseSimplex.Solve(changed);
            if (cold.Status != LinearProgramStatus.Optimal) continue;
            var start = adapt is null ? first.Basis! : adapt(first.Basis!);
            var warm = DenseSimplex.Solve(changed, start);
            cases++;
            coldTotal += cold.Iterations;
            warmTotal += warm.Iterations;
            if (!warm.WarmStartUsed) problems.Add($"case {cases}: the basis was set aside");
            if (warm.Status != LinearProgramStatus.Optimal) { problems.Add($"case {cases}: warm {warm}"); continue; }
            if (Math.Abs(warm.ObjectiveValue - cold.ObjectiveValue) > OptimalityCheck.Tolerance * (1 + Math.Abs(cold.ObjectiveValue)))
            {
                problems.Add($"case {cases}: warm optimum {warm.ObjectiveValue:R}, cold {cold.ObjectiveValue:R}");
            }
            problems.AddRange(OptimalityCheck.Problems(changed, warm).Select(s => $"case {cases}: {s}"));
            if (warm.Iterations >= cold.Iterations) problems.Add($"case {cases}: warm start took {warm.Iterations} iterations, cold {cold.Iterations}");
        }
        output.WriteLine($"{change}: {cases} programs, cold {coldTotal} iterations, warm {warmTotal}");
        Assert.True(cases >= 8, $"only {cases} programs stayed optimal after the change");
        Assert.True(problems.Count == 0, string.Join("\n", problems));
    }
}
