using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// Inputs large enough (at least 16,384 points) that the input checks and the grouping by composition run on two
/// workers at once: the answers still match the outside references, and a refusal still names the first bad point.
/// </summary>
public sealed class LargeInputTests(ITestOutputHelper output)
{
    private const int LargePoints = 20_000;

    [Fact]
    public void Large_general_position_input_has_qconvex_lower_hull_vertices()
    {
        var set = GeneralPositionGenerator.Generate(3, LargePoints, 901);
        var hull = HullStability.Build(set.Amounts, set.EnergiesEvPerAtom);
        Assert.IsType<LowerHull>(hull);

        // qconvex (Debian qhull-bin) on the points lifted to (x_1, x_2, E); the lower facets are those whose
        // outward normal points down in energy (qconvex manual, 'n'), and their vertices are the lower-hull vertices.
        var lifted = Enumerable.Range(0, set.Count).Select(i => set.Fractions(i).Take(2).Append(set.EnergiesEvPerAtom[i]).ToArray()).ToList();
        var reference = QconvexRunner.Facets(lifted).Where(f => f.OutwardNormal[^1] < -1e-12).SelectMany(f => f.Vertices).ToHashSet();
        output.WriteLine($"{set.Count} points: {reference.Count} qconvex lower vertices, ours {hull.VertexPoints.Count}");
        Assert.True(reference.SetEquals(hull.VertexPoints),
            $"qconvex vertices we lack: {string.Join(", ", reference.Except(hull.VertexPoints).Take(10))}; ours qconvex lacks: {string.Join(", ", hull.VertexPoints.Except(reference).Take(10))}");
    }

    [Fact]
    public void Large_degenerate_input_agrees_with_scipy_highs_lp_on_a_sample()
    {
        // Lattice compositions (denominators <= 12): a few hundred compositions shared by many points each, with
        // equal-energy polymorphs, so the grouping decides representatives among many duplicates.
        var set = DegenerateDataGenerator.Generate(4, LargePoints, 902);
        var engines = BothEngines.Build(set);
        var sample = Enumerable.Range(0, set.Count).Where(i => i % 97 == 0).ToArray();
        var hypothetical = RandomCompositions.Generate(4, 30, 909);
        var queries = sample.Select(set.Fractions).Concat(hypothetical).ToList();
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries));

        var checks = engines.All.Select(e =>
        {
            var check = new HullAgreement(set, e.Hull);
            for (int s = 0; s < sample.Length; s++) check.CheckPoint(sample[s], answers[s], "SciPy HiGHS LP");
            for (int q = 0; q < hypothetical.Count; q++) check.CheckComposition(hypothetical[q], answers[sample.Length + q], "SciPy HiGHS LP");
            return (e.Name, check);
        }).ToArray();
        output.WriteLine($"{set.Count} points, {sample.Length} sampled, {engines.Timings}");
        HullAgreement.AssertNone("4 components, 20,000 points", checks);
    }

    [Fact]
    public void Large_input_refusal_names_the_first_bad_point_in_either_layout()
    {
        var set = DegenerateDataGenerator.Generate(3, LargePoints, 903);
        // Faults far apart, in both halves of the work: the first in point order is the one reported.
        AssertRefused(set, rows => { rows[19_000][1] = -4; rows[15_000][2] = -1; }, energies => { }, "Point 15000: amount of component 2 is negative (-1).");
        AssertRefused(set, rows => rows[18_000][0] = -1, energies => energies[16_500] = double.NaN, "Point 16500: energy is not a finite number (NaN).");
        AssertRefused(set, rows => { rows[3] = [0, 0, 0]; rows[19_999][0] = -1; }, energies => { }, "Point 3: every amount is zero.");
        AssertRefused(set, rows => rows[17_000] = [long.MaxValue, 1, 0], energies => energies[17_001] = double.PositiveInfinity,
            "Point 17000: the amounts add up past the 64-bit integer range");

        // Only one array per point can lack a row or have the wrong length.
        var rows = set.Amounts.Select(r => (long[])r.Clone()).ToArray();
        rows[17_500] = null!;
        rows[16_000][0] = -2;
        var e = Assert.Throws<ArgumentException>(() => HullStability.Build(rows, set.EnergiesEvPerAtom));
        Assert.StartsWith("Point 16000: amount of component 0 is negative (-2).", e.Message);
        rows[16_000][0] = 2;
        e = Assert.Throws<ArgumentException>(() => HullStability.Build(rows, set.EnergiesEvPerAtom));
        Assert.StartsWith("Point 17500 has no amounts.", e.Message);
        rows[17_500] = [1, 2];
        e = Assert.Throws<ArgumentException>(() => HullStability.Build(rows, set.EnergiesEvPerAtom));
        Assert.StartsWith("Point 17500 has 2 components; point 0 has 3.", e.Message);
    }

    /// <summary>Spoils a copy of the set and checks that one array per point and one array for all are refused alike.</summary>
    private static void AssertRefused(PointSet set, Action<long[][]> spoilRows, Action<double[]> spoilEnergies, string expectedStart)
    {
        var rows = set.Amounts.Select(r => (long[])r.Clone()).ToArray();
        var energies = set.EnergiesEvPerAtom.ToArray();
        spoilRows(rows);
        spoilEnergies(energies);
        var jagged = Assert.Throws<ArgumentException>(() => HullStability.Build(rows, energies));
        Assert.StartsWith(expectedStart, jagged.Message);
        var flat = Assert.Throws<ArgumentException>(() => HullStability.Build(rows.SelectMany(r => r).ToArray(), 3, energies));
        Assert.Equal(jagged.Message, flat.Message);
    }
}
