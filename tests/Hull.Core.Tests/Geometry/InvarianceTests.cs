using System.Diagnostics;
using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// The lower hull is a property of the point set, not of its order (common practice): shuffling the input must
/// give the same stable compositions and energies and the same energy above hull for every point.
/// </summary>
public sealed class InvarianceTests(ITestOutputHelper output)
{
    /// <summary>
    /// Energy above hull may be computed through a different facet (or a different equal-energy twin) after a
    /// shuffle; rounding then differs by ~1e-15 eV/atom, far below this.
    /// </summary>
    private const double SameEnergyEvPerAtom = 1e-12;

    [Theory]
    [InlineData(3, 300, 301, HullEngine.Facets)]
    [InlineData(4, 300, 302, HullEngine.Facets)]
    [InlineData(6, 300, 303, HullEngine.Facets)]
    [InlineData(8, 300, 304, HullEngine.Facets)]
    [InlineData(10, 250, 305, HullEngine.Facets)]
    [InlineData(3, 300, 301, HullEngine.Programs)]
    [InlineData(4, 300, 302, HullEngine.Programs)]
    [InlineData(6, 300, 303, HullEngine.Programs)]
    [InlineData(8, 300, 304, HullEngine.Programs)]
    [InlineData(10, 250, 305, HullEngine.Programs)]
    public void Shuffled_input_gives_the_same_hull(int components, int points, int seed, string engine)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var clock = Stopwatch.StartNew();
        var hull = HullEngine.Build(engine, set.Amounts, set.EnergiesEvPerAtom);
        output.WriteLine($"{engine}, input order: build {clock.ElapsedMilliseconds} ms{FacetCount(hull)}");
        var stable = StableSet(set, hull);
        for (int shuffle = 0; shuffle < 2; shuffle++)
        {
            var shuffled = set.Shuffled(seed * 10 + shuffle, out var order);
            clock.Restart();
            var other = HullEngine.Build(engine, shuffled.Amounts, shuffled.EnergiesEvPerAtom);
            output.WriteLine($"shuffle {shuffle}: build {clock.ElapsedMilliseconds} ms{FacetCount(other)}");
            clock.Restart();
            Assert.Equal(stable, StableSet(shuffled, other));
            for (int j = 0; j < shuffled.Count; j++)
            {
                double before = hull.EnergyAboveHullEvPerAtom(order[j]), after = other.EnergyAboveHullEvPerAtom(j);
                Assert.True(Math.Abs(before - after) <= SameEnergyEvPerAtom,
                    $"{set.Describe(order[j])}: energy above hull {before:R} in input order, {after:R} after shuffle {shuffle}");
            }
            output.WriteLine($"shuffle {shuffle}: comparison {clock.ElapsedMilliseconds} ms");
        }
    }

    /// <summary>
    /// The program engine solves groups of compositions in parallel, each chunk warm-started from its own previous
    /// optimum. Where several decompositions tie, which one is reported must still not depend on how threads
    /// share the chunks: builds run alone and side by side on the same input must agree bit for bit. The general-
    /// position set puts all its interior points in one group of compositions, so that group spans many chunks.
    /// </summary>
    [Theory]
    [InlineData("degenerate", 8, 1000, 311)]
    [InlineData("general position", 6, 1500, 312)]
    public void Program_engine_results_do_not_depend_on_thread_scheduling(string kind, int components, int points, int seed)
    {
        var set = kind == "degenerate"
            ? DegenerateDataGenerator.Generate(components, points, seed)
            : GeneralPositionGenerator.Generate(components, points, seed);
        var queries = RandomCompositions.Generate(components, 50, seed + 1);
        var clock = Stopwatch.StartNew();
        var alone = LinearProgramHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        output.WriteLine($"{kind}, {components} components, {set.Count} points: build alone {clock.ElapsedMilliseconds} ms");
        clock.Restart();
        // Three builds at once compete for the thread pool, so their chunks are scheduled differently from the first.
        var together = Enumerable.Range(0, 3).AsParallel().WithDegreeOfParallelism(3)
            .Select(_ => LinearProgramHull.Build(set.Amounts, set.EnergiesEvPerAtom)).ToArray();
        output.WriteLine($"three builds side by side {clock.ElapsedMilliseconds} ms");
        foreach (var other in together)
        {
            Assert.Equal(alone.VertexPoints, other.VertexPoints);
            for (int i = 0; i < set.Count; i++)
            {
                AssertSame(alone.LocatePoint(i), other.LocatePoint(i), set.Describe(i));
                Assert.Equal(alone.EnergyAboveHullEvPerAtom(i), other.EnergyAboveHullEvPerAtom(i));
                Assert.Equal(alone.HullEnergyWithoutCompositionEvPerAtom(i), other.HullEnergyWithoutCompositionEvPerAtom(i));
            }
            foreach (var x in queries) AssertSame(alone.Locate(x), other.Locate(x), "a random composition");
        }
    }

    private static void AssertSame(HullPosition expected, HullPosition actual, string where)
    {
        Assert.True(expected.VertexPoints.SequenceEqual(actual.VertexPoints)
            && expected.AtomFractions.SequenceEqual(actual.AtomFractions)
            && expected.HullEnergyEvPerAtom.Equals(actual.HullEnergyEvPerAtom),
            $"{where}: {Describe(expected)} in one build, {Describe(actual)} in another");
    }

    private static string Describe(HullPosition p) =>
        $"{p.HullEnergyEvPerAtom:R} = " + string.Join(" + ", p.VertexPoints.Select((v, i) => $"{p.AtomFractions[i]:R}*#{v}"));

    private static string FacetCount(IHullStability hull) => hull is LowerHull facets ? $", {facets.Facets.Count} facets" : "";

    /// <summary>Hull vertices as (reduced composition, energy), sorted: independent of indices and amount scale.</summary>
    private static List<string> StableSet(PointSet set, IHullStability hull) =>
        hull.VertexPoints.Select(i => $"{string.Join(":", Reduced(set.Amounts[i]))} {set.EnergiesEvPerAtom[i]:R}").Order(StringComparer.Ordinal).ToList();

    private static long[] Reduced(long[] a)
    {
        long g = 0;
        foreach (long v in a) g = Gcd(g, v);
        return a.Select(v => v / g).ToArray();
    }

    private static long Gcd(long a, long b)
    {
        while (b != 0) (a, b) = (b, a % b);
        return a;
    }
}
