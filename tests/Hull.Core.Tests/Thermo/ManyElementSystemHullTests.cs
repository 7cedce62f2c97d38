using System.Diagnostics;
using Hull.Core.Chemistry;
using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;
using Hull.Core.Tests.Geometry;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Xunit.Abstractions;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// A chemical system with enough elements that <see cref="SystemHull"/> computes stability with
/// <see cref="LinearProgramHull"/> and builds facets only when asked. Entries' energies above hull, decomposition
/// energies and vertex flags are checked against the slow full rebuild and against SciPy's LP (linprog HiGHS,
/// Debian python3-scipy); facets and tie-lines against the definition of the lower hull.
/// </summary>
public sealed class ManyElementSystemHullTests(ITestOutputHelper output)
{
    /// <summary>The slow path rebuilds the hull with the other engine; both lose about 1e-15 on energies near 1 eV/atom.</summary>
    private const double SameEnergyEvPerAtom = 1e-12;

    private static readonly string[] Elements = ["Co", "Fe", "Li", "Mn", "Ni", "O", "S"];

    [Theory]
    [InlineData(6, 200, 601)]
    [InlineData(7, 150, 602)]
    public void Entries_agree_with_full_rebuild_and_scipy_lp(int elements, int points, int seed)
    {
        Assert.True(elements >= HullStability.OnDemandProgramsFromComponents, "the system must be as large as the hulls a dataset solves by programs");
        var (entries, set) = Entries(elements, points, seed);
        var clock = Stopwatch.StartNew();
        var hull = SystemHull.OverElements(entries);
        var stabilities = hull.Entries;
        var buildTime = clock.Elapsed;
        Assert.Equal(entries.Length, stabilities.Count);
        var failures = new List<string>();

        // Points by reduced composition: the decomposition energy leaves all of them out.
        var sameComposition = Enumerable.Range(0, entries.Length).GroupBy(i => entries[i].Composition.Reduced).ToDictionary(g => g.Key, g => g.ToArray());
        var onHull = Enumerable.Range(0, entries.Length).Where(i => stabilities[i].DecompositionEnergyEvPerAtom is not null).ToList();
        var queries = Enumerable.Range(0, entries.Length).Select(set.Fractions)
            .Concat(onHull.Select(set.Fractions)).ToList();
        var excluded = Enumerable.Range(0, entries.Length).Select(_ => Array.Empty<int>())
            .Concat(onHull.Select(i => sameComposition[entries[i].Composition.Reduced])).ToList();
        clock.Restart();
        var answers = ScipyLpRunner.Solve(new HullLpProblem(set.Amounts, set.EnergiesEvPerAtom, queries, excluded));
        var referenceTime = clock.Elapsed;

        for (int i = 0; i < entries.Length; i++)
        {
            var s = stabilities[i];
            Assert.Equal(entries[i].Id, s.Id);
            // SciPy linprog HiGHS: energy above hull = E - (LP optimum over all points), at least 0.
            double expected = Math.Max(0.0, s.AxisEnergyEvPerAtom - answers[i].HullEnergyEvPerAtom);
            if (!(Math.Abs(s.EnergyAboveHullEvPerAtom - expected) <= HullAgreement.EnergyToleranceEvPerAtom))
            {
                failures.Add($"{s.Id} {s.Composition}: energy above hull {s.EnergyAboveHullEvPerAtom:R}, SciPy HiGHS LP gives {expected:R}");
            }
            bool pure = s.Composition.Elements.Count == 1;
            if (s.IsOnHull && !pure && s.DecompositionEnergyEvPerAtom is null) failures.Add($"{s.Id}: on the hull but no decomposition energy");
            if ((!s.IsOnHull || pure) && s.DecompositionEnergyEvPerAtom is not null) failures.Add($"{s.Id}: decomposition energy where none is defined");
        }

        var rebuildClock = Stopwatch.StartNew();
        for (int q = 0; q < onHull.Count; q++)
        {
            var s = stabilities[onHull[q]];
            double ours = s.DecompositionEnergyEvPerAtom!.Value;
            // The slow path: the whole hull rebuilt without the entry's reduced composition.
            double? slow = hull.DecompositionEnergyByFullRebuild(s.Id);
            if (slow is null || !(Math.Abs(ours - slow.Value) <= SameEnergyEvPerAtom))
            {
                failures.Add($"{s.Id} {s.Composition}: decomposition energy {ours:R}, full rebuild gives {slow?.ToString("R") ?? "null"}");
            }
            // SciPy linprog HiGHS with every entry of that reduced composition held at weight 0: the decomposition
            // energy is E minus that optimum for the vertex, and 0 for an entry that only touches the hull (a tie
            // of the vertex, or an entry inside a face): the margin is counted once, on the vertex.
            double without = answers[entries.Length + q].HullEnergyEvPerAtom;
            double expected = s.IsHullVertex ? Math.Min(0.0, s.AxisEnergyEvPerAtom - without) : 0.0;
            if (!(Math.Abs(ours - expected) <= HullAgreement.EnergyToleranceEvPerAtom))
            {
                failures.Add($"{s.Id} {s.Composition}: decomposition energy {ours:R}, SciPy HiGHS LP without its composition gives {expected:R}");
            }
            // A vertex is the lowest entry of a composition the others cannot make as cheaply (common practice).
            bool vertex = s.AxisEnergyEvPerAtom < without - HullAgreement.EnergyToleranceEvPerAtom
                && sameComposition[s.Composition.Reduced].All(j => entries[j].EnergyEv >= s.AxisEnergyEvPerAtom);
            bool tiedVertex = vertex && sameComposition[s.Composition.Reduced].Count(j => entries[j].EnergyEv == s.AxisEnergyEvPerAtom) > 1;
            if (!tiedVertex && s.IsHullVertex != vertex)
            {
                failures.Add($"{s.Id} {s.Composition}: {(s.IsHullVertex ? "a" : "not a")} hull vertex, SciPy HiGHS LP without its composition gives {without:R} against {s.AxisEnergyEvPerAtom:R}");
            }
        }
        var rebuildTime = rebuildClock.Elapsed;

        // Equal-energy polymorphs: exactly one of a vertex composition's tied entries is the vertex.
        foreach (var group in sameComposition.Values)
        {
            var lowest = group.Where(j => entries[j].EnergyEv == group.Min(k => entries[k].EnergyEv)).ToArray();
            if (lowest.Length > 1 && lowest.Any(j => stabilities[j].IsHullVertex) && lowest.Count(j => stabilities[j].IsHullVertex) != 1)
            {
                failures.Add($"{string.Join(", ", lowest.Select(j => entries[j].Id))}: tied polymorphs with {lowest.Count(j => stabilities[j].IsHullVertex)} vertices");
            }
        }

        output.WriteLine($"{elements} elements, {entries.Length} entries: SystemHull {buildTime.TotalMilliseconds:F0} ms, {hull.StablePhases.Count} stable phases, "
            + $"{onHull.Count} non-pure entries on the hull; SciPy {referenceTime.TotalMilliseconds:F0} ms ({queries.Count} LPs), full rebuilds {rebuildTime.TotalMilliseconds:F0} ms");
        Assert.True(failures.Count == 0, $"{failures.Count} disagreement(s):\n" + string.Join("\n", failures.Take(25)));
        Assert.True(onHull.Count(i => stabilities[i].IsHullVertex) >= 10 && onHull.Count(i => !stabilities[i].IsHullVertex) >= 3,
            "the data must have stable compounds and entries that only touch the hull");
    }

    [Theory]
    [InlineData(6, 200, 601)]
    [InlineData(7, 150, 602)]
    public void Decompositions_name_stable_phases_and_balance(int elements, int points, int seed)
    {
        var (entries, _) = Entries(elements, points, seed);
        var hull = SystemHull.OverElements(entries);
        var stable = hull.StablePhases.Select(p => p.Id).ToHashSet();
        var failures = new List<string>();
        foreach (var s in hull.Entries)
        {
            // A decomposition is into stable phases (hull vertices), balanced atom for atom, its energy the hull
            // energy (lever rule; common practice).
            ThermoTestData.AssertBalanced(s.Decomposition);
            double energy = s.Decomposition.Products.Sum(p => p.AtomFraction * p.Phase.AxisEnergyEvPerAtom);
            if (!(Math.Abs(energy - s.Decomposition.HullEnergyEvPerAtom) <= HullAgreement.EnergyToleranceEvPerAtom))
            {
                failures.Add($"{s.Id}: products' energy {energy:R}, hull energy {s.Decomposition.HullEnergyEvPerAtom:R}");
            }
            var unstable = s.Decomposition.Products.Where(p => !stable.Contains(p.Phase.Id)).ToList();
            if (unstable.Count > 0)
            {
                failures.Add($"{s.Id} {s.Composition}: decomposes into {string.Join(", ", unstable.Select(p => p.Phase.Id))}, not among the stable phases ({s.Decomposition})");
            }
        }
        Assert.True(failures.Count == 0, $"{failures.Count} disagreement(s):\n" + string.Join("\n", failures.Take(25)));
    }

    [Fact]
    public void Facets_and_tie_lines_are_built_on_demand_and_bound_every_entry()
    {
        var (entries, _) = Entries(6, 200, 601);
        var hull = SystemHull.OverElements(entries);
        // Stability first, as a service asks for it; facets only afterwards. The facet engine sits behind a Lazy
        // (found by its type, whatever the field is called) that stability queries must not touch.
        var facetEngine = typeof(SystemHull).GetFields(System.Reflection.BindingFlags.Instance | System.Reflection.BindingFlags.NonPublic)
            .SingleOrDefault(f => f.FieldType == typeof(Lazy<LowerHull>));
        Assert.True(facetEngine is not null, $"{nameof(SystemHull)} no longer holds its facet engine in a Lazy<{nameof(LowerHull)}>; update this check");
        bool Built() => ((Lazy<LowerHull>)facetEngine!.GetValue(hull)!).IsValueCreated;
        Assert.NotEmpty(hull.Entries);
        Assert.NotEmpty(hull.StablePhases);
        hull.HullEnergyEvPerAtomAt(Composition.Parse("CoFeLiMnNiO"));
        Assert.False(Built(), "stability queries built the facets");
        var clock = Stopwatch.StartNew();
        var facets = hull.Facets;
        var tieLines = hull.TieLines;
        Assert.True(Built());
        output.WriteLine($"{facets.Count} facets, {tieLines.Count} tie-lines, built on demand in {clock.ElapsedMilliseconds} ms");
        Assert.NotEmpty(facets);
        var stable = hull.StablePhases.Select(p => p.Id).ToHashSet();
        var failures = new List<string>();
        foreach (var facet in facets)
        {
            Assert.Equal(hull.Components, facet.Components);
            Assert.Equal(hull.Components.Count, facet.Phases.Count);
            // The facet plane E = sum_k mu_k x_k passes through its corners and lies on or below every entry: the
            // lower hull as the lower envelope of supporting planes (common practice).
            double Plane(Composition c) => hull.Components.Select((el, k) => facet.ChemicalPotentialsEvPerAtom[k] * c.AtomicFraction(el)).Sum();
            foreach (var corner in facet.Phases)
            {
                double at = Plane(corner.Composition);
                if (!(Math.Abs(at - corner.AxisEnergyEvPerAtom) <= HullAgreement.EnergyToleranceEvPerAtom))
                {
                    failures.Add($"facet {string.Join("-", facet.Phases.Select(p => p.Id))}: plane gives {at:R} at corner {corner.Id}, whose energy is {corner.AxisEnergyEvPerAtom:R}");
                }
                if (!stable.Contains(corner.Id)) failures.Add($"facet {string.Join("-", facet.Phases.Select(p => p.Id))}: corner {corner.Id} is not among the stable phases");
            }
            foreach (var s in hull.Entries)
            {
                double below = s.AxisEnergyEvPerAtom - Plane(s.Composition);
                if (below < -HullAgreement.EnergyToleranceEvPerAtom) failures.Add($"facet {string.Join("-", facet.Phases.Select(p => p.Id))}: entry {s.Id} lies {-below:R} below its plane");
            }
        }
        // Every pair of phases that share a facet is a tie-line, each listed once (phases exactly coplanar add the
        // pairs of their face; TieLineTests checks the exact set against an LP).
        var pairs = facets.SelectMany(f => f.Phases.SelectMany(a => f.Phases.Where(b => string.CompareOrdinal(a.Id, b.Id) < 0).Select(b => (a.Id, b.Id)))).ToHashSet();
        var listed = tieLines.Select(t => (t.First.Id, t.Second.Id)).ToList();
        Assert.Equal(listed.Count, listed.Distinct().Count());
        Assert.True(pairs.IsSubsetOf(listed), $"{pairs.Except(listed).Count()} facet pairs missing from the tie-lines");
        Assert.True(failures.Count == 0, $"{failures.Count} disagreement(s):\n" + string.Join("\n", failures.Take(25)));
    }

    /// <summary>
    /// Degenerate generated data (tied polymorphs, points exactly on planes of others) as formation energies per atom
    /// over the first <paramref name="elements"/> of <see cref="Elements"/>, ids in input order.
    /// </summary>
    private static (PhaseEntry[] Entries, PointSet Set) Entries(int elements, int points, int seed)
    {
        var set = DegenerateDataGenerator.Generate(elements, points, seed);
        return (set.AsFormationEntries(Elements.Take(elements).ToArray(), i => $"p{i:D3}"), set);
    }
}
