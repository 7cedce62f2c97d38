using Hull.Core.Optimization;
using Hull.Core.Tests.References;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Optimization;

/// <summary>
/// <see cref="DenseSimplex"/> against two outside LP solvers on random, degenerate, infeasible and unbounded
/// programs: SciPy's HiGHS (<c>linprog(method="highs")</c>, Debian python3-scipy) and glpsol (Debian glpk-utils,
/// final basis re-solved exactly with --xcheck).
/// </summary>
public sealed class DenseSimplexReferenceTests(ITestOutputHelper output)
{
    private static List<(string Name, LinearProgram Program)> RandomSet() =>
        Enumerable.Range(0, 40).Select(s => ($"random {s}", ProgramGenerator.Random(2 + s % 11, 2 + (s * 7) % 19, 1000 + s)))
            // Larger ones take more pivots than the refactorisation interval, so drift and refreshes are exercised.
            .Concat(Enumerable.Range(0, 4).Select(s => ($"random large {s}", ProgramGenerator.Random(30 + 5 * s, 60 + 10 * s, 1100 + s))))
            .ToList();

    private static List<(string Name, LinearProgram Program)> DegenerateSet() =>
        Enumerable.Range(0, 30).Select(s => ($"degenerate {s}", ProgramGenerator.Degenerate(3 + s % 10, 3 + (s * 5) % 17, 2000 + s)))
            .Concat(Enumerable.Range(0, 8).Select(s => ($"transportation {s}", ProgramGenerator.Transportation(2 + s % 4, 2 + (s * 3) % 5, 3000 + s))))
            .Concat(Enumerable.Range(0, 4).Select(s => ($"degenerate large {s}", ProgramGenerator.Degenerate(30 + 5 * s, 60 + 10 * s, 2100 + s))))
            .Concat(Enumerable.Range(0, 2).Select(s => ($"transportation large {s}", ProgramGenerator.Transportation(8 + s, 10 + s, 3100 + s))))
            .Concat(Enumerable.Range(0, 4).Select(s => ($"stalling {s}", ProgramGenerator.Stalling(40 + 10 * s, 30 + 5 * s, 3200 + s))))
            .Append(("Beale's cycling example", ProgramGenerator.BealeCycling()))
            .ToList();

    private static List<(string Name, LinearProgram Program)> InfeasibleAndUnboundedSet() =>
        Enumerable.Range(0, 9).Select(s => ($"infeasible {s}", ProgramGenerator.Infeasible(3 + s % 6, 3 + s % 7, 4000 + s)))
            .Concat(Enumerable.Range(0, 9).Select(s => ($"unbounded {s}", ProgramGenerator.Unbounded(2 + s % 6, 3 + s % 8, 5000 + s))))
            .ToList();

    [Fact]
    public void Random_programs_agree_with_scipy_highs()
    {
        var comparison = CompareWithScipy(RandomSet());
        // Random data in general position: most optima are unique, so the vectors are compared, not just objectives.
        Assert.True(comparison.UniquePrimalCompared >= 20 && comparison.UniqueDualCompared >= 20,
            $"too few unique optima to compare vectors: {comparison.UniquePrimalCompared} primal, {comparison.UniqueDualCompared} dual");
    }

    [Fact]
    public void Degenerate_programs_agree_with_scipy_highs()
    {
        var comparison = CompareWithScipy(DegenerateSet());
        Assert.True(comparison.Optimal >= 25, $"only {comparison.Optimal} optimal degenerate programs");
        // The set must exercise degenerate optima: most have several optimal dual solutions.
        Assert.True(comparison.Optimal - comparison.UniqueDualCompared >= 15, $"only {comparison.Optimal - comparison.UniqueDualCompared} degenerate optima");
    }

    [Fact]
    public void Infeasible_and_unbounded_programs_agree_with_scipy_highs()
    {
        var set = InfeasibleAndUnboundedSet();
        CompareWithScipy(set);
    }

    [Fact]
    public void Programs_agree_with_glpsol()
    {
        var set = RandomSet().Take(10).Concat(DegenerateSet().Where((_, k) => k % 4 == 0)).Concat(InfeasibleAndUnboundedSet().Where((_, k) => k % 3 == 0)).ToList();
        var comparison = new ReferenceComparison();
        foreach (var (name, program) in set)
        {
            // glpsol --math MODEL -w SOLUTION --xcheck --nopresol (Debian glpk-utils, GLPK 5.0).
            comparison.Compare(name, program, DenseSimplex.Solve(program), GlpkGeneralLpRunner.Solve(program), "glpsol");
        }
        output.WriteLine($"{set.Count} programs, {comparison.Optimal} optimal; vectors compared on {comparison.UniquePrimalCompared} unique primal and {comparison.UniqueDualCompared} unique dual optima");
        Assert.True(comparison.Problems.Count == 0, string.Join("\n", comparison.Problems));
    }

    private ReferenceComparison CompareWithScipy(List<(string Name, LinearProgram Program)> set)
    {
        // scipy.optimize.linprog(method="highs"), primal/dual feasibility tolerances 1e-10 (Debian python3-scipy).
        var answers = ScipyGeneralLpRunner.Solve(set.Select(s => s.Program).ToList());
        var comparison = new ReferenceComparison();
        var statuses = new Dictionary<LinearProgramStatus, int>();
        int iterations = 0, most = 0, degenerate = 0, bland = 0;
        for (int k = 0; k < set.Count; k++)
        {
            var result = DenseSimplex.Solve(set[k].Program);
            statuses[result.Status] = statuses.GetValueOrDefault(result.Status) + 1;
            iterations += result.Iterations;
            most = Math.Max(most, result.Iterations);
            degenerate += result.DegenerateIterations;
            bland += result.BlandIterations;
            if (set[k].Name.StartsWith("stalling", StringComparison.Ordinal) && result.BlandIterations == 0)
            {
                comparison.Problems.Add($"{set[k].Name}: built to stall, but Bland's rule never took over ({result.DegenerateIterations} degenerate of {result.Iterations})");
            }
            comparison.Compare(set[k].Name, set[k].Program, result, answers[k], "SciPy HiGHS");
        }
        output.WriteLine($"{set.Count} programs ({string.Join(", ", statuses.Select(s => $"{s.Value} {s.Key}"))}), {iterations} iterations (at most {most}; {degenerate} degenerate, {bland} by Bland's rule); vectors compared on "
            + $"{comparison.UniquePrimalCompared} unique primal and {comparison.UniqueDualCompared} unique dual optima");
        Assert.True(comparison.Problems.Count == 0, string.Join("\n", comparison.Problems));
        return comparison;
    }
}
