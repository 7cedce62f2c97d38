using System.Diagnostics;
using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.References;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Geometry;

/// <summary>
/// The two hull engines on the same degenerate data: the same stable points and energies above the hull, and the
/// program engine's hull energy without a point's composition against a <see cref="LowerHull"/> rebuilt without
/// every point of that composition and against SciPy's LP with those points excluded (linprog HiGHS, Debian
/// python3-scipy). The same LP answers decide which points are vertices, and each engine's vertices are checked
/// against them.
/// </summary>
public sealed class EngineCrossCheckTests(ITestOutputHelper output)
{
    /// <summary>
    /// Two engines computing the same hull energy in double precision (facet planes against simplex bases, each
    /// losing about 1e-15 relative on energies of order 1 eV/atom) agree far closer than this.
    /// </summary>
    private const double SameEnergyEvPerAtom = 1e-12;

    /// <summary>
    /// Whole-hull rebuilds per case, vertices first: in 7–8 components one rebuild takes ~0.1 s, so checking every
    /// on-hull composition this way would cost seconds per case; SciPy below still checks all of them.
    /// </summary>
    private const int MaxRebuilds = 12;

    [Theory]
    [InlineData(3, 300, 401)]
    [InlineData(4, 300, 402)]
    [InlineData(5, 300, 403)]
    [InlineData(6, 300, 404)]
    [InlineData(7, 250, 405)]
    [InlineData(8, 250, 406)]
    public void Engines_agree_on_degenerate_data(int components, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(components, points, seed);
        var degeneracy = CheckEngines(set, seed);
        // The data must exercise both kinds: vertices (their removal raises the hull there) and on-hull non-vertices.
        Assert.True(degeneracy.Vertices >= components + 5 && degeneracy.OnHullNotVertex >= 5, $"generated data not degenerate enough: {degeneracy}");
    }

    /// <summary>
    /// The same checks on the benchmark's own families (bench/Hull.Bench/Data, compiled into this project), smaller:
    /// "pair" (independent amounts of every component, random pair interactions, few stable) and "faceted" (a
    /// piecewise-planar surface with many entries exactly on hull planes), and the engine the library picks for
    /// them, which must give the same answers as both.
    /// </summary>
    [Theory]
    [InlineData("pair", 3, 1000, 601)]
    [InlineData("pair", 4, 1000, 602)]
    [InlineData("pair", 5, 1000, 603)]
    [InlineData("pair", 6, 1000, 604)]
    [InlineData("pair", 7, 300, 605)]
    [InlineData("pair", 8, 300, 606)]
    [InlineData("faceted", 3, 1000, 611)]
    [InlineData("faceted", 4, 1000, 612)]
    [InlineData("faceted", 5, 1000, 613)]
    [InlineData("faceted", 6, 1000, 614)]
    [InlineData("faceted", 7, 300, 615)]
    [InlineData("faceted", 8, 200, 616)]
    public void Engines_agree_on_bench_families(string family, int components, int points, int seed)
    {
        var set = BenchFamilies.Generate(family, components, points, seed);
        // In 7–8 components a whole-hull rebuild of these data takes seconds: a few, SciPy checks every composition.
        var degeneracy = CheckEngines(set, seed, maxRebuilds: components >= 7 ? 2 : MaxRebuilds);
        var chosen = HullStability.Build(set.Amounts, set.EnergiesEvPerAtom);
        var programs = LinearProgramHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        Assert.Equal(programs.VertexPoints, chosen.VertexPoints);
        for (int i = 0; i < set.Count; i++)
        {
            Assert.True(Math.Abs(chosen.EnergyAboveHullEvPerAtom(i) - programs.EnergyAboveHullEvPerAtom(i)) <= SameEnergyEvPerAtom,
                $"{set.Describe(i)}: energy above hull {chosen.EnergyAboveHullEvPerAtom(i):R} (chosen engine {chosen.GetType().Name}), {programs.EnergyAboveHullEvPerAtom(i):R} ({nameof(LinearProgramHull)})");
        }
        // Faceted data put many entries exactly on hull planes without being vertices.
        if (family == "faceted") Assert.True(degeneracy.OnHullNotVertex >= 5, $"generated data not degenerate enough: {degeneracy}");
    }

    /// <summary>Every check of the engines against each other, LowerHull rebuilds and SciPy; returns how degenerate the data were.</summary>
    private DegeneracyCount CheckEngines(PointSet set, int seed, int maxRebuilds = MaxRebuilds)
    {
        int components = set.ComponentCount;
        var engines = BothEngines.Build(set);
        var (facets, programs) = (engines.Facets, engines.Programs);
        var failures = new List<string>();

        Assert.Equal(set.Count, programs.PointCount);
        Assert.Equal(components, programs.ComponentCount);
        var onlyFacets = facets.VertexPoints.Except(programs.VertexPoints).ToList();
        var onlyPrograms = programs.VertexPoints.Except(facets.VertexPoints).ToList();
        if (onlyFacets.Count + onlyPrograms.Count > 0)
        {
            failures.Add($"vertices differ: {onlyFacets.Count} only of {nameof(LowerHull)} ({string.Join(", ", onlyFacets.Take(5).Select(set.Describe))}), "
                + $"{onlyPrograms.Count} only of {nameof(LinearProgramHull)} ({string.Join(", ", onlyPrograms.Take(5).Select(set.Describe))})");
        }
        for (int i = 0; i < set.Count; i++)
        {
            double a = facets.EnergyAboveHullEvPerAtom(i), b = programs.EnergyAboveHullEvPerAtom(i);
            if (!(Math.Abs(a - b) <= SameEnergyEvPerAtom)) failures.Add($"{set.Describe(i)}: energy above hull {a:R} ({nameof(LowerHull)}), {b:R} ({nameof(LinearProgramHull)})");
            var p = programs.LocatePoint(i);
            double hf = facets.LocatePoint(i).HullEnergyEvPerAtom;
            if (!(Math.Abs(hf - p.HullEnergyEvPerAtom) <= SameEnergyEvPerAtom)) failures.Add($"{set.Describe(i)}: hull energy {hf:R} ({nameof(LowerHull)}), {p.HullEnergyEvPerAtom:R} ({nameof(LinearProgramHull)})");
            // That engine builds no facets, so a position names none.
            if (p.FacetIndex != -1) failures.Add($"{set.Describe(i)}: {nameof(LinearProgramHull)} position names facet {p.FacetIndex}");
        }
        foreach (var x in RandomCompositions.Generate(components, 100, seed + 3))
        {
            double hf = facets.Locate(x).HullEnergyEvPerAtom, hp = programs.Locate(x).HullEnergyEvPerAtom;
            if (!(Math.Abs(hf - hp) <= SameEnergyEvPerAtom)) failures.Add($"composition {{{string.Join(", ", x)}}}: hull energy {hf:R} ({nameof(LowerHull)}), {hp:R} ({nameof(LinearProgramHull)})");
        }

        // Hull energy without a composition. Pure components have none (nothing else makes them); for the points on
        // the hull, rebuild the hull without every point of their composition.
        (string Name, IHullStability Engine)[] bothEngines = [(nameof(LowerHull), facets), (nameof(LinearProgramHull), programs)];
        var byComposition = Enumerable.Range(0, set.Count).GroupBy(i => CompositionKey(set.Amounts[i])).ToDictionary(g => g.Key, g => g.ToArray());
        var onHull = new List<int>();
        for (int i = 0; i < set.Count; i++)
        {
            bool pure = set.Amounts[i].Count(a => a != 0) == 1;
            foreach (var (name, engine) in bothEngines)
            {
                double? without = engine.HullEnergyWithoutCompositionEvPerAtom(i);
                if (pure != (without is null)) failures.Add($"{set.Describe(i)}: hull energy without its composition {without?.ToString("R") ?? "null"} ({name})");
            }
            if (!pure && (programs.EnergyAboveHullEvPerAtom(i) == 0.0 || facets.EnergyAboveHullEvPerAtom(i) == 0.0)) onHull.Add(i);
        }
        var clock = Stopwatch.StartNew();
        var rebuilt = new Dictionary<string, double>();
        var vertexSet = programs.VertexPoints.Concat(facets.VertexPoints).ToHashSet();
        foreach (int i in onHull.OrderBy(i => vertexSet.Contains(i) ? 0 : 1).ThenBy(i => i))
        {
            string key = CompositionKey(set.Amounts[i]);
            if (!rebuilt.TryGetValue(key, out double expected))
            {
                if (rebuilt.Count == maxRebuilds) continue;
                var excluded = byComposition[key].ToHashSet();
                var keep = Enumerable.Range(0, set.Count).Where(j => !excluded.Contains(j)).ToArray();
                var subset = LowerHull.Build(keep.Select(j => set.Amounts[j]).ToList(), keep.Select(j => set.EnergiesEvPerAtom[j]).ToList());
                rebuilt[key] = expected = subset.Locate(set.Fractions(i)).HullEnergyEvPerAtom;
            }
            foreach (var (name, engine) in bothEngines)
            {
                double ours = engine.HullEnergyWithoutCompositionEvPerAtom(i)!.Value;
                if (!(Math.Abs(ours - expected) <= SameEnergyEvPerAtom))
                {
                    failures.Add($"{set.Describe(i)}: hull energy without its composition {ours:R} ({name}), {nameof(LowerHull)} rebuilt without it gives {expected:R}");
                }
            }
        }
        var rebuildTime = clock.Elapsed;

        // The same numbers from SciPy linprog HiGHS (Debian python3-scipy): the LP of the hull energy at the point's
        // composition with every point of that composition held at weight 0.
        clock.Restart();
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom,
            onHull.Select(set.Fractions).ToList(), onHull.Select(i => byComposition[CompositionKey(set.Amounts[i])]).ToList()));
        var referenceTime = clock.Elapsed;
        var referenceVertices = new SortedSet<int>();
        for (int k = 0; k < components; k++) referenceVertices.Add(PurePoint(set, k));
        for (int q = 0; q < onHull.Count; q++)
        {
            int i = onHull[q];
            double without = answers[q].HullEnergyEvPerAtom;
            foreach (var (name, engine) in bothEngines)
            {
                double ours = engine.HullEnergyWithoutCompositionEvPerAtom(i)!.Value;
                if (!(Math.Abs(ours - without) <= HullAgreement.EnergyToleranceEvPerAtom))
                {
                    failures.Add($"{set.Describe(i)}: hull energy without its composition {ours:R} ({name}), SciPy HiGHS LP without it gives {without:R}");
                }
            }
            // A point is a vertex (an extreme point of the lower hull) exactly when the other compositions cannot
            // make its composition as cheaply: its energy lies below the LP optimum without it (common practice).
            // A gap within the comparison tolerance is a tie, not a vertex; the data's energies are tabulated to
            // 1e-4 eV/atom or built exactly on planes, so real gaps are far larger and ties far smaller.
            // Of several points of one composition, the lowest in energy and then in index stands for it (the tie rule
            // both engines document).
            double gap = without - set.EnergiesEvPerAtom[i];
            if (gap > HullAgreement.EnergyToleranceEvPerAtom && i == Representative(set, byComposition[CompositionKey(set.Amounts[i])]))
            {
                referenceVertices.Add(i);
            }
        }
        foreach (var (name, engine) in engines.All)
        {
            var ours = engine.VertexPoints.ToHashSet();
            var missing = referenceVertices.Where(v => !ours.Contains(v)).ToList();
            var extra = ours.Where(v => !referenceVertices.Contains(v)).Order().ToList();
            if (missing.Count + extra.Count > 0)
            {
                failures.Add($"{name} vertices against SciPy HiGHS LP without each composition: {missing.Count} missing ({string.Join(", ", missing.Take(5).Select(set.Describe))}), "
                    + $"{extra.Count} extra, which the other compositions make at the same energy ({string.Join(", ", extra.Take(5).Select(v => Tie(set, v, onHull, answers)))})");
            }
        }

        var degeneracy = DegeneracyCount.Of(set, programs);
        output.WriteLine($"{components} components, {set.Count} points, {facets.Facets.Count} facets, {degeneracy}; {engines.Timings}; "
            + $"{referenceVertices.Count} vertices by SciPy, {onHull.Count} non-pure points on the hull, {rebuilt.Count} rebuilds {rebuildTime.TotalMilliseconds:F0} ms, "
            + $"SciPy {referenceTime.TotalMilliseconds:F0} ms");
        Assert.True(failures.Count == 0, $"{failures.Count} disagreement(s):\n" + string.Join("\n", failures.Take(25)));
        return degeneracy with { Vertices = referenceVertices.Count };
    }

    private static string Tie(PointSet set, int v, List<int> onHull, IReadOnlyList<HullLpAnswer> answers)
    {
        int q = onHull.IndexOf(v);
        return q < 0 ? set.Describe(v) : $"{set.Describe(v)} = {string.Join(" + ", answers[q].Phases.Select((p, k) => $"{answers[q].Weights[k]:G6}*#{p}"))}";
    }

    /// <summary>The point that stands for a composition: lowest energy, then lowest index.</summary>
    private static int Representative(PointSet set, int[] samePoints) =>
        samePoints.OrderBy(j => set.EnergiesEvPerAtom[j]).ThenBy(j => j).First();

    private static int PurePoint(PointSet set, int component) =>
        Representative(set, Enumerable.Range(0, set.Count).Where(j => set.Amounts[j].Count(a => a != 0) == 1 && set.Amounts[j][component] != 0).ToArray());

    /// <summary>Amounts reduced to lowest terms: the same key for every point of one composition.</summary>
    private static string CompositionKey(long[] amounts)
    {
        long g = 0;
        foreach (long v in amounts) g = Gcd(g, v);
        return string.Join(":", amounts.Select(v => v / g));
    }

    private static long Gcd(long a, long b)
    {
        while (b != 0) (a, b) = (b, a % b);
        return a;
    }
}
