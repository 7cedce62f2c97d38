using System.Diagnostics;
using System.Globalization;
using System.Text;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Core.Geometry;

namespace Hull.Bench.Suites;

/// <summary>
/// Where each engine wins: both engines forced on every family, 3–8 components, at several sizes, in-process, beside
/// the engine <see cref="HullStability.Build(long[], int, IReadOnlyList{double})"/> picks; the crossover points behind
/// the choice. Every case also checks that both engines give the same vertices and energies above hull.
/// </summary>
public static class EngineChoiceSuite
{
    public const string Name = "engine-choice";

    /// <summary>An engine whose first run takes longer than this (ms) is not repeated on that case.</summary>
    private const double SingleRunFromMs = 5_000;

    public static readonly (int Components, int Entries)[] Sizes =
    [
        (3, 2_000), (3, 20_000), (3, 100_000),
        (4, 2_000), (4, 20_000), (4, 100_000),
        (5, 2_000), (5, 20_000), (5, 100_000),
        (6, 2_000), (6, 20_000),
        (7, 2_000), (7, 20_000),
        (8, 2_000), (8, 20_000),
    ];

    public static string Run(BenchOptions o)
    {
        int reps = o.Quick ? 1 : o.InProcessReps ?? 3;
        var sb = new StringBuilder();
        sb.Append(MarkdownReport.Header(Name, o.CommandLine));
        sb.AppendLine();
        sb.AppendLine($"In-process, one untimed warm-up per engine and case, then the median of {reps} runs of build + energy above hull of every entry; an engine whose first run exceeds {SingleRunFromMs / 1000:F0} s is timed once, and the incremental hull is not forced at larger sizes of a family and dimension where it took more than that (nor on the lattice families in 8 components and 7 × 2e4, where its millions of facets take minutes). CPU time is summed over both threads: on this shared machine it is the measure of work, wall time the measure of waiting. "
            + "`hull`: LowerHull.Build forced; `programs`: LinearProgramHull.Build forced; `chosen`: HullStability.Build. Vertices and energies above hull of the two engines are compared on every case (≤ 1e-9 eV/atom).");
        sb.AppendLine();
        sb.AppendLine("| family | components | entries | distinct compositions | vertices | hull facets made per composition / per point added | hull wall / CPU [ms] | programs wall / CPU [ms] | programs / hull (CPU) | chosen engine | chosen wall / CPU [ms] | chosen / best (CPU) |");
        sb.AppendLine("|---|---:|---:|---:|---:|---:|---:|---:|---:|---|---:|---:|");
        var hullTooSlow = new HashSet<(PointFamily, int)>();
        foreach (var family in PointFamilies.All)
        {
            foreach (var (n, entries) in Sizes)
            {
                int seed = o.Seed + 100_000 * (int)family + 1000 * n + entries / 1000;
                var pts = PointFamilies.Generate(family, n, o.Scale(entries), seed);
                var flat = Hull.Solve.PointsFile.FromRows(n, pts.Amounts, pts.EnergiesEvPerAtom);
                var programs = Time(() => LinearProgramHull.Build(pts.Amounts, pts.EnergiesEvPerAtom), pts.Count, reps, out var p);
                // On the lattice families in 7–8 components the incremental hull's millions of facets take minutes and
                // gigabytes (bench/README.md); it is not forced there.
                bool lattice = family is PointFamily.Dense or PointFamily.Sparse;
                bool runHull = !(lattice && (n == 8 || (n == 7 && entries >= 20_000))) && !hullTooSlow.Contains((family, n));
                var hull = (WallMs: double.NaN, CpuMs: double.NaN);
                IHullStability? h = null;
                if (runHull) hull = Time(() => LowerHull.Build(pts.Amounts, pts.EnergiesEvPerAtom), pts.Count, reps, out h);
                // A forced incremental hull over the single-run time at one size is not forced at the larger ones.
                if (hull.CpuMs > SingleRunFromMs) hullTooSlow.Add((family, n));
                var chosen = Time(() => HullStability.Build(flat.AmountsRowMajor, n, flat.EnergiesEvPerAtom), pts.Count, reps, out var c);
                if (h is not null) Compare(h, p, $"{family.Token()} {n}c {entries}");
                Compare(c, p, $"{family.Token()} {n}c {entries} (chosen)");
                string chosenName = c is LowerHull ? "hull" : "programs";
                double bestCpu = double.IsNaN(hull.CpuMs) ? programs.CpuMs : Math.Min(hull.CpuMs, programs.CpuMs);
                int distinct = HullCaseRunner.CountDistinctCompositions(pts);
                string made = h is LowerHull lh ? $"{F(lh.FacetsMade / (double)distinct)} / {F(lh.FacetsMade / (double)Math.Max(1, lh.PointsAdded))}" : "—";
                var line = $"| {family.Token()} | {n} | {pts.Count} | {distinct} | {p.VertexPoints.Count} | {made} | {F(hull.WallMs)} / {F(hull.CpuMs)} | {F(programs.WallMs)} / {F(programs.CpuMs)} | "
                    + $"{(double.IsNaN(hull.CpuMs) ? "—" : F(programs.CpuMs / hull.CpuMs, "F2"))} | {chosenName} | {F(chosen.WallMs)} / {F(chosen.CpuMs)} | {F(chosen.CpuMs / bestCpu, "F2")} |";
                Console.WriteLine(line);
                sb.AppendLine(line);
            }
        }
        return sb.ToString();
    }

    /// <summary>Median wall and CPU time (ms; CPU summed over threads, which the load of a shared machine barely changes).</summary>
    private static (double WallMs, double CpuMs) Time(Func<IHullStability> build, int points, int reps, out IHullStability built)
    {
        var process = System.Diagnostics.Process.GetCurrentProcess();
        (double, double) Once(out IHullStability b)
        {
            process.Refresh();
            var cpu = process.TotalProcessorTime;
            var sw = Stopwatch.StartNew();
            b = build();
            for (int i = 0; i < points; i++) b.EnergyAboveHullEvPerAtom(i);
            double wall = sw.Elapsed.TotalMilliseconds;
            process.Refresh();
            return (wall, (process.TotalProcessorTime - cpu).TotalMilliseconds);
        }
        var first = Once(out built);
        if (first.Item1 > SingleRunFromMs) return first;
        var walls = new List<double>();
        var cpus = new List<double>();
        for (int r = 0; r < reps; r++)
        {
            var (w, c) = Once(out built);
            walls.Add(w);
            cpus.Add(c);
        }
        return (Stats.Median(walls), Stats.Median(cpus));
    }

    private static string F(double v, string format = "F1") => double.IsNaN(v) ? "not run" : v.ToString(format, CultureInfo.InvariantCulture);

    private static void Compare(IHullStability a, IHullStability b, string what)
    {
        if (!a.VertexPoints.SequenceEqual(b.VertexPoints))
        {
            throw new InvalidOperationException($"{what}: the engines' vertices differ ({a.VertexPoints.Count} against {b.VertexPoints.Count})");
        }
        for (int i = 0; i < a.PointCount; i++)
        {
            double d = Math.Abs(a.EnergyAboveHullEvPerAtom(i) - b.EnergyAboveHullEvPerAtom(i));
            if (!(d <= HullCaseRunner.LpAgreementEvPerAtom)) throw new InvalidOperationException($"{what}: energy above hull of entry {i} differs by {d:E2} eV/atom between the engines");
        }
    }
}
