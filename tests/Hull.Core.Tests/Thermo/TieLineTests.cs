using Hull.Core.Tests.Generators;
using Hull.Core.Tests.Geometry;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Tie-lines where stable phases lie exactly on one plane of the hull. Two stable phases coexist when the segment
/// between them lies on the lower hull, i.e. when the hull energy at their mid-composition equals the mean of their
/// energies (common practice: both sit on one supporting plane of common chemical potentials). Checked against
/// SciPy's HiGHS LP (Debian python3-scipy) at every pair's mid-composition.
/// </summary>
public sealed class TieLineTests(ITestOutputHelper output)
{
    private static readonly string[] Elements = ["Cu", "Fe", "S", "Zn"];

    [Theory]
    [InlineData(3, 12, 4, 801)]
    [InlineData(3, 10, 3, 802)]
    [InlineData(4, 6, 5, 803)]
    public void Tie_lines_are_exactly_the_pairs_whose_segment_lies_on_the_hull(int components, int maxAtoms, int planes, int seed)
    {
        var set = PiecewisePlanarSet(components, maxAtoms, planes, seed);
        var entries = set.AsFormationEntries(Elements.Take(components).ToArray(), i => $"p{i:D3}");
        var hull = SystemHull.OverElements(entries);
        var index = entries.Select((e, i) => (e.Id, i)).ToDictionary(p => p.Id, p => p.i);
        var stable = hull.StablePhases.Select(p => index[p.Id]).Order().ToArray();

        var pairs = new List<(int A, int B)>();
        for (int a = 0; a < stable.Length; a++)
        for (int b = a + 1; b < stable.Length; b++) pairs.Add((stable[a], stable[b]));
        var mid = pairs.Select(p => set.Fractions(p.A).Zip(set.Fractions(p.B), (x, y) => (x + y) / 2).ToArray()).ToList();
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, mid));

        var expected = new HashSet<(string, string)>();
        for (int q = 0; q < pairs.Count; q++)
        {
            var (a, b) = pairs[q];
            double mean = (set.EnergiesEvPerAtom[a] + set.EnergiesEvPerAtom[b]) / 2;
            // The hull lies on or below the segment; it touches the whole segment exactly when it touches the middle.
            if (mean - answers[q].HullEnergyEvPerAtom <= HullAgreement.EnergyToleranceEvPerAtom) expected.Add((entries[a].Id, entries[b].Id));
        }
        var listed = hull.TieLines.Select(t => (t.First.Id, t.Second.Id)).ToHashSet();
        var facetPairs = hull.Facets.SelectMany(f => f.Phases.SelectMany(a => f.Phases.Where(b => string.CompareOrdinal(a.Id, b.Id) < 0).Select(b => (a.Id, b.Id)))).ToHashSet();
        output.WriteLine($"{components} components, {set.Count} points, {stable.Length} stable phases, {pairs.Count} pairs checked: "
            + $"{expected.Count} coexist by the LP, {facetPairs.Count} share a facet, {listed.Count} tie-lines listed");

        Assert.True(expected.SetEquals(listed),
            $"tie-lines the LP does not confirm: {string.Join(", ", listed.Except(expected).Take(10))}; coexisting pairs not listed: {string.Join(", ", expected.Except(listed).Take(10))}");
        // The data must hold coplanar stable phases, so that a face has more corners than a facet.
        Assert.True(listed.Count > facetPairs.Count, $"no face with more corners than a facet: {listed.Count} tie-lines, {facetPairs.Count} facet pairs");
    }

    [Fact]
    public void Coplanar_phases_give_the_same_tie_lines_in_any_input_order()
    {
        var set = PiecewisePlanarSet(3, 12, 4, 801);
        var symbols = Elements.Take(3).ToArray();
        var reference = SystemHull.OverElements(set.AsFormationEntries(symbols, i => $"p{i:D3}"));
        for (int seed = 1; seed <= 3; seed++)
        {
            var shuffled = set.Shuffled(seed, out int[] order);
            // Ids follow the original index, so the same phase keeps its id in every order.
            var hull = SystemHull.OverElements(shuffled.AsFormationEntries(symbols, i => $"p{order[i]:D3}"));
            Assert.Equal(reference.TieLines.Select(t => t.ToString()), hull.TieLines.Select(t => t.ToString()));
        }
    }

    /// <summary>
    /// Lattice compositions (at most <paramref name="maxAtoms"/> atoms, every face of the simplex) with the energy
    /// max_j mu_j · x of a few random planes (pure components at 0): a convex piecewise-planar energy, so each
    /// plane's region holds many lattice points and its stable corners form polygons with more than n corners.
    /// Some points are lifted off the hull so that not every point is on it.
    /// </summary>
    private static PointSet PiecewisePlanarSet(int components, int maxAtoms, int planes, int seed)
    {
        var rng = new Random(seed);
        // Chemical potentials in sixteenths of an eV: binary fractions keep the plane values well rounded.
        var mu = new double[planes][];
        for (int j = 0; j < planes; j++)
        {
            mu[j] = new double[components];
            for (int k = 0; k < components; k++) mu[j][k] = -rng.Next(0, 33) / 16.0;
        }
        var amounts = new List<long[]>();
        var energies = new List<double>();
        var kinds = new List<string>();
        void Enumerate(long[] row, int k, int left)
        {
            if (k == components - 1)
            {
                row[k] = left;
                long total = row.Sum();
                var copy = (long[])row.Clone();
                long g = copy.Aggregate(0L, (a, v) => (long)System.Numerics.BigInteger.GreatestCommonDivisor(a, v));
                if (g != 1) return;
                bool pure = copy.Count(v => v != 0) == 1;
                double e = pure ? 0.0 : mu.Max(m => m.Select((v, c) => v * copy[c] / (double)total).Sum());
                amounts.Add(copy);
                energies.Add(e);
                kinds.Add(pure ? "pure" : "plane");
                return;
            }
            for (int a = 0; a <= left; a++)
            {
                row[k] = a;
                Enumerate(row, k + 1, left - a);
            }
        }
        for (int total = 1; total <= maxAtoms; total++) Enumerate(new long[components], 0, total);
        // Pure points sit at 0, on or above every plane there (all mu <= 0), so they stay vertices; a fifth of the
        // others is lifted off the hull.
        for (int i = 0; i < amounts.Count; i++)
        {
            if (kinds[i] == "plane" && rng.NextDouble() < 0.2)
            {
                energies[i] += 0.01 + 0.05 * rng.NextDouble();
                kinds[i] = "above";
            }
        }
        return new PointSet(components, amounts, energies, kinds);
    }
}
