using System.Diagnostics;
using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Energy above hull, hull energy and decompositions on degenerate thermodynamic data against two LP references:
/// SciPy's HiGHS (linprog, Debian python3-scipy) and glpsol (Debian glpk-utils). For every point and for random
/// compositions, the hull energy is min sum_j lambda_j E_j subject to sum_j lambda_j x_j = x, lambda >= 0.
/// </summary>
public sealed class LpReferenceTests(ITestOutputHelper output)
{
    [Theory]
    [InlineData(3, 300, 101)]
    [InlineData(4, 300, 102)]
    [InlineData(6, 400, 103)]
    [InlineData(8, 1000, 104)]
    [InlineData(10, 1200, 105)]
    public void Degenerate_data_agrees_with_scipy_highs_lp(int components, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var clock = Stopwatch.StartNew();
        var hull = LowerHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        var buildTime = clock.Elapsed;

        var hypothetical = RandomCompositions.Generate(components, 150, seed + 7);
        var queries = Enumerable.Range(0, set.Count).Select(set.Fractions).Concat(hypothetical).ToList();
        clock.Restart();
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries));
        var referenceTime = clock.Elapsed;

        clock.Restart();
        var check = new HullAgreement(set, hull);
        // SciPy linprog(method="highs") on the LP above, primal/dual feasibility tolerance 1e-10.
        for (int i = 0; i < set.Count; i++) check.CheckPoint(i, answers[i], "SciPy HiGHS LP");
        for (int q = 0; q < hypothetical.Count; q++) check.CheckComposition(hypothetical[q], answers[set.Count + q], "SciPy HiGHS LP");
        var degeneracy = DegeneracyCount.Of(set, hull);
        output.WriteLine($"{components} components, {set.Count} points, {hull.Facets.Count} facets, {degeneracy}; "
            + $"build {buildTime.TotalMilliseconds:F0} ms, SciPy {referenceTime.TotalMilliseconds:F0} ms ({queries.Count} LPs), checks {clock.Elapsed.TotalMilliseconds:F0} ms");
        check.AssertNone($"{components} components, seed {seed}");
        // The data must exercise the degenerate cases: points exactly on the hull that are not vertices.
        Assert.True(degeneracy.OnHullNotVertex >= 5 && degeneracy.TwinsOnHull >= 1, $"generated data not degenerate enough: {degeneracy}");
    }

    [Theory]
    [InlineData(3, 200, 201)]
    [InlineData(4, 150, 202)]
    [InlineData(5, 120, 203)]
    public void Degenerate_data_agrees_with_glpk_lp(int components, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var hull = LowerHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        var hypothetical = RandomCompositions.Generate(components, 40, seed + 7);
        var queries = Enumerable.Range(0, set.Count).Select(set.Fractions).Concat(hypothetical).ToList();
        var clock = Stopwatch.StartNew();
        var answers = GlpkLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries));
        var referenceTime = clock.Elapsed;

        var check = new HullAgreement(set, hull);
        // glpsol --math hull_lp.mod --xcheck: simplex, final basis re-solved in exact rational arithmetic.
        for (int i = 0; i < set.Count; i++) check.CheckPoint(i, answers[i], "GLPK LP");
        for (int q = 0; q < hypothetical.Count; q++) check.CheckComposition(hypothetical[q], answers[set.Count + q], "GLPK LP");
        output.WriteLine($"{components} components, {set.Count} points, {DegeneracyCount.Of(set, hull)}; glpsol {referenceTime.TotalMilliseconds:F0} ms ({queries.Count} LP blocks)");
        check.AssertNone($"{components} components, seed {seed}");
    }
}
