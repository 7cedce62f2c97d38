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
    [InlineData(3, 300, 301)]
    [InlineData(4, 300, 302)]
    [InlineData(6, 300, 303)]
    [InlineData(8, 300, 304)]
    [InlineData(10, 250, 305)]
    public void Shuffled_input_gives_the_same_hull(int components, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var clock = Stopwatch.StartNew();
        var hull = LowerHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        output.WriteLine($"input order: build {clock.ElapsedMilliseconds} ms, {hull.Facets.Count} facets");
        var stable = StableSet(set, hull);
        for (int shuffle = 0; shuffle < 2; shuffle++)
        {
            var shuffled = set.Shuffled(seed * 10 + shuffle, out var order);
            clock.Restart();
            var other = LowerHull.Build(shuffled.Amounts, shuffled.EnergiesEvPerAtom);
            output.WriteLine($"shuffle {shuffle}: build {clock.ElapsedMilliseconds} ms, {other.Facets.Count} facets");
            clock.Restart();
            Assert.Equal(stable, StableSet(shuffled, other));
            for (int j = 0; j < shuffled.Count; j++)
            {
                double before = hull.EnergyAboveHull(order[j]), after = other.EnergyAboveHull(j);
                Assert.True(Math.Abs(before - after) <= SameEnergyEvPerAtom,
                    $"{set.Describe(order[j])}: energy above hull {before:R} in input order, {after:R} after shuffle {shuffle}");
            }
            output.WriteLine($"shuffle {shuffle}: comparison {clock.ElapsedMilliseconds} ms");
        }
    }

    /// <summary>Hull vertices as (reduced composition, energy), sorted: independent of indices and amount scale.</summary>
    private static List<string> StableSet(PointSet set, LowerHull hull) =>
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
