using System.Diagnostics;
using System.Globalization;
using System.Text;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Bench.References;
#if HAS_THERMO
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Electrochemistry;
using Hull.Core.Thermo.Reactions;
#endif

namespace Hull.Bench.Suites;

/// <summary>
/// Electrochemistry beside SciPy HiGHS in one run: (a) the voltage profile of Li into a host in a 1e4-entry
/// Li-Co-Mn-O system (ours: exact facet crossings on the built hull; reference: the hull LP's dual for Li at each
/// plateau's mid-composition); (b) two-phase reaction profiles in the 1e5-entry 60-element dataset (reference: the
/// hull LP at every breakpoint). Times in milliseconds; hulls are built beforehand (the service caches them).
/// </summary>
public static class ElectrochemistrySuite
{
    public const string Name = "electrochemistry";

    public static string Run(BenchOptions o, string work)
    {
        var sb = new StringBuilder();
#if HAS_THERMO
        int reps = o.Quick ? 3 : o.InProcessReps ?? 21;

        // (a) 1e4 entries over Li-Co-Mn-O on a convex bowl with noise: many stable phases, many facets.
        string[] elements = ["Co", "Li", "Mn", "O"];
        var rng = new Random(o.Seed + 13_000);
        var entries = elements.Select(e => new PhaseEntry($"el-{e}", Composition.OfElement(e), 0, EnergyBasis.FormationPerAtom)).ToList();
        int target = o.Scale(10_000);
        while (entries.Count < target)
        {
            long[] a = elements.Select(_ => (long)rng.Next(0, 9)).ToArray();
            if (a.Count(v => v > 0) < 2) continue;
            double total = a.Sum();
            double squares = a.Sum(v => (v / total) * (v / total));
            var c = Composition.FromAmounts(elements.Zip(a).Where(p => p.Second > 0).Select(p => (p.First, (Rational)p.Second)).ToArray());
            entries.Add(new PhaseEntry($"p{entries.Count}", c, (-2.2 * (1 - squares)) + (0.25 * rng.NextDouble()), EnergyBasis.FormationPerAtom));
        }

        var buildClock = Stopwatch.StartNew();
        SystemHull hull = SystemHull.OverElements(entries, elements: elements);
        _ = hull.StablePhases;
        double buildMs = buildClock.Elapsed.TotalMilliseconds;
        Composition host = Composition.Parse("CoMnO4");
        var firstClock = Stopwatch.StartNew();
        VoltageProfile profile = InsertionVoltages.Profile(hull, host, "Li");
        double firstMs = firstClock.Elapsed.TotalMilliseconds; // includes building the facets on first use
        var times = new List<double>();
        for (int r = 0; r < reps; r++)
        {
            var sw = Stopwatch.StartNew();
            profile = InsertionVoltages.Profile(hull, host, "Li");
            times.Add(sw.Elapsed.TotalMilliseconds);
        }

        string[] components = [.. hull.Components];
        double[][] fractions = hull.Entries.Select(e => e.ComponentAtomFractions.ToArray()).ToArray();
        double[] energies = hull.Entries.Select(e => e.AxisEnergyEvPerAtom).ToArray();
        double[][] mids = profile.Plateaus.Select(p =>
        {
            double x = (p.IonsPerHostFrom + p.IonsPerHostTo) / 2;
            double[] amounts = components.Select(c => host.AmountOf(c).ToDouble() + (c == "Li" ? x : 0)).ToArray();
            return amounts.Select(v => v / amounts.Sum()).ToArray();
        }).ToArray();
        HullAtReference.Answer lp = HullAtReference.Solve(fractions, energies, mids, work);
        int li = Array.IndexOf(components, "Li");
        double worstVolts = profile.Plateaus.Select((p, k) => Math.Abs(p.VoltsAgainstMetal + lp.ChemicalPotentialsEvPerAtom[k][li])).Max();
        double median = Stats.Median(times);
        Console.WriteLine($"-- voltage: {entries.Count} entries, {hull.StablePhases.Count} stable, {hull.Facets.Count} facets, {profile.Plateaus.Count} plateaus; ours median {median:F2} ms (first {firstMs:F0} ms); SciPy {lp.SolveMilliseconds:F0} ms solving, {lp.ProcessMilliseconds:F0} ms process; max |ΔV| {worstVolts:E1}");
        sb.AppendLine();
        sb.AppendLine($"(a) Voltage profile of Li into CoMnO4 in a {entries.Count}-entry Li-Co-Mn-O system ({hull.StablePhases.Count} stable phases, {hull.Facets.Count} facets; hull built in {buildMs:F0} ms, not timed). Ours: `InsertionVoltages.Profile`, warm, median of {reps} (the first call also builds the facets). Reference: SciPy HiGHS, the hull LP at each plateau's mid-composition (its dual for Li is −V), one process.");
        sb.AppendLine();
        sb.AppendLine("| case | plateaus | ours median [ms] | min | max | ours first call [ms] | SciPy solves [ms] | SciPy process [ms] | ratio SciPy solves/ours | max abs(V − (−y_Li)) [V] |");
        sb.AppendLine("|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|");
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture,
            $"| Li-Co-Mn-O, {entries.Count} entries | {profile.Plateaus.Count} | {median:F2} | {times.Min():F2} | {times.Max():F2} | {firstMs:F0} | {lp.SolveMilliseconds:F0} | {lp.ProcessMilliseconds:F0} | {lp.SolveMilliseconds / median:F1} | {worstVolts:0.0E+0} |"));

        // (b) reaction profiles between pairs of compounds of the 60-element dataset.
        var rows = DatasetGenerator.Generate(60, o.Scale(100_000), EnergyDistribution.Dense, o.Seed + 60_000);
        var all = rows.Select(r => new PhaseEntry(r.Id,
            Composition.FromAmounts(r.Elements.Select((e, j) => (e, Rational.FromInteger(r.Amounts[j]))).ToArray()),
            r.TotalEnergyEvPerFormulaUnit, EnergyBasis.TotalPerFormulaUnit)).ToArray();
        string[] symbols = all.SelectMany(e => e.Composition.Elements).Distinct().Order(StringComparer.Ordinal).ToArray();
        var bit = symbols.Select((s, i) => (s, i)).ToDictionary(p => p.s, p => 1UL << p.i);
        ulong Mask(IEnumerable<string> els) => els.Aggregate(0UL, (m, e) => m | bit[e]);
        ulong[] masks = all.Select(e => Mask(e.Composition.Elements)).ToArray();
        var pick = new Random(o.Seed + 2_000);
        var ternaries = all.Where(e => e.Composition.Elements.Count == 3).ToArray();
        var pairs = new List<(SystemHull Hull, string A, string B)>();
        var pairClock = Stopwatch.StartNew();
        while (pairs.Count < (o.Quick ? 4 : 20))
        {
            PhaseEntry a = ternaries[pick.Next(ternaries.Length)];
            PhaseEntry b = ternaries[pick.Next(ternaries.Length)];
            string[] system = a.Composition.Elements.Union(b.Composition.Elements).Order(StringComparer.Ordinal).ToArray();
            if (system.Length < 4 || system.Length > 5) continue;
            ulong m = Mask(system);
            var inSystem = all.Where((_, i) => (masks[i] & ~m) == 0).ToArray();
            if (inSystem.Length < 50) continue;
            pairs.Add((SystemHull.OverElements(inSystem, elements: system), a.Id, b.Id));
        }

        foreach (var p in pairs) _ = p.Hull.Facets;
        double pairBuildMs = pairClock.Elapsed.TotalMilliseconds;
        ReactionProfile[] profiles = pairs.Select(p => PhaseReactions.Profile(p.Hull, p.A, p.B)).ToArray();
        var reactionTimes = new List<double>();
        for (int r = 0; r < (o.Quick ? 1 : 5); r++)
        {
            var sw = Stopwatch.StartNew();
            foreach (var p in pairs) _ = PhaseReactions.Profile(p.Hull, p.A, p.B);
            reactionTimes.Add(sw.Elapsed.TotalMilliseconds);
        }

        double worstEnergy = 0, scipySolveMs = 0, scipyProcessMs = 0;
        int breakpoints = 0;
        for (int k = 0; k < pairs.Count; k++)
        {
            SystemHull h = pairs[k].Hull;
            ReactionProfile rp = profiles[k];
            double[] fa = [.. rp.First.ComponentAtomFractions], fb = [.. rp.Second.ComponentAtomFractions];
            double[][] queries = rp.Points.Select(p => { double x = p.AtomFractionOfFirst.ToDouble(); return fa.Select((v, c) => (x * v) + ((1 - x) * fb[c])).ToArray(); }).ToArray();
            double[][] points = [.. h.Entries.Select(e => e.ComponentAtomFractions.ToArray()), .. h.Components.Select((_, c) => h.Components.Select((_, j) => j == c ? 1.0 : 0.0).ToArray())];
            double[] e = [.. h.Entries.Select(x => x.AxisEnergyEvPerAtom), .. h.Components.Select(_ => 0.0)];
            HullAtReference.Answer answer = HullAtReference.Solve(points, e, queries, work);
            scipySolveMs += answer.SolveMilliseconds;
            scipyProcessMs += answer.ProcessMilliseconds;
            for (int q = 0; q < rp.Points.Count; q++)
            {
                double x = rp.Points[q].AtomFractionOfFirst.ToDouble();
                double expected = answer.HullEnergyEvPerAtom[q] - (x * rp.First.AxisEnergyEvPerAtom) - ((1 - x) * rp.Second.AxisEnergyEvPerAtom);
                worstEnergy = Math.Max(worstEnergy, Math.Abs(expected - rp.Points[q].ReactionEnergyEvPerAtom));
            }

            breakpoints += rp.Points.Count;
        }

        double reactionMedian = Stats.Median(reactionTimes);
        Console.WriteLine($"-- reactions: {pairs.Count} pairs, {breakpoints} breakpoints; ours {reactionMedian:F1} ms for all; SciPy {scipySolveMs:F0} ms solving, {scipyProcessMs:F0} ms processes; max |ΔE| {worstEnergy:E1} eV/atom");
        sb.AppendLine();
        sb.AppendLine($"(b) Reaction profiles of {pairs.Count} pairs of ternary compounds of the dataset60 generator (dense, {rows.Count} entries), each pair's 4- or 5-element system hulled beforehand ({pairBuildMs:F0} ms for all, with facets; not timed). Ours: `PhaseReactions.Profile` for all pairs, median of {reactionTimes.Count}. Reference: SciPy HiGHS, the hull LP at every breakpoint ({breakpoints} in all), one process per pair.");
        sb.AppendLine();
        sb.AppendLine("| case | pairs | breakpoints | ours all pairs median [ms] | per pair [ms] | SciPy solves [ms] | SciPy processes [ms] | ratio SciPy solves/ours | max abs(ΔE − LP) [eV/atom] |");
        sb.AppendLine("|---|---:|---:|---:|---:|---:|---:|---:|---:|");
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture,
            $"| dataset60 dense | {pairs.Count} | {breakpoints} | {reactionMedian:F1} | {reactionMedian / pairs.Count:F2} | {scipySolveMs:F0} | {scipyProcessMs:F0} | {scipySolveMs / reactionMedian:F1} | {worstEnergy:0.0E+0} |"));
#else
        sb.AppendLine("The electrochemistry suite needs the thermodynamics layer.");
#endif
        return sb.ToString();
    }
}
