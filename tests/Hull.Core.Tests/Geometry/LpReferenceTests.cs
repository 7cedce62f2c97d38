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
/// Each reference is solved once per case and both hull engines (<see cref="LowerHull"/> and
/// <see cref="LinearProgramHull"/>) are checked against the same answers.
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
        var engines = BothEngines.Build(set);

        var hypothetical = RandomCompositions.Generate(components, 150, seed + 7);
        var queries = Enumerable.Range(0, set.Count).Select(set.Fractions).Concat(hypothetical).ToList();
        var clock = Stopwatch.StartNew();
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries));
        var referenceTime = clock.Elapsed;

        clock.Restart();
        var checks = engines.All.Select(e => (e.Name, Check(set, e.Hull, hypothetical, answers, "SciPy HiGHS LP"))).ToArray();
        var degeneracy = DegeneracyCount.Of(set, engines.Facets);
        output.WriteLine($"{components} components, {set.Count} points, {engines.Facets.Facets.Count} facets, {degeneracy}; {engines.Timings}, "
            + $"SciPy {referenceTime.TotalMilliseconds:F0} ms ({queries.Count} LPs), checks {clock.Elapsed.TotalMilliseconds:F0} ms");
        HullAgreement.AssertNone($"{components} components, seed {seed}", checks);
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
        var engines = BothEngines.Build(set);
        var hypothetical = RandomCompositions.Generate(components, 40, seed + 7);
        var queries = Enumerable.Range(0, set.Count).Select(set.Fractions).Concat(hypothetical).ToList();
        var clock = Stopwatch.StartNew();
        var answers = GlpkLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries));
        var referenceTime = clock.Elapsed;

        var checks = engines.All.Select(e => (e.Name, Check(set, e.Hull, hypothetical, answers, "GLPK LP"))).ToArray();
        output.WriteLine($"{components} components, {set.Count} points, {DegeneracyCount.Of(set, engines.Facets)}; {engines.Timings}, "
            + $"glpsol {referenceTime.TotalMilliseconds:F0} ms ({queries.Count} LP blocks)");
        HullAgreement.AssertNone($"{components} components, seed {seed}", checks);
    }

    /// <summary>
    /// One engine against the reference answers: the set's points first, then the hypothetical compositions.
    /// </summary>
    private static HullAgreement Check(PointSet set, IHullStability hull, List<double[]> hypothetical, IReadOnlyList<HullLpAnswer> answers, string source)
    {
        var check = new HullAgreement(set, hull);
        // SciPy: linprog(method="highs") on the LP above, primal/dual feasibility tolerance 1e-10 (Debian python3-scipy).
        // GLPK: glpsol --math hull_lp.mod --xcheck, simplex with the final basis re-solved in exact rational
        // arithmetic (Debian glpk-utils).
        for (int i = 0; i < set.Count; i++) check.CheckPoint(i, answers[i], source);
        for (int q = 0; q < hypothetical.Count; q++) check.CheckComposition(hypothetical[q], answers[set.Count + q], source);
        return check;
    }
}
