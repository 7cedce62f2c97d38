using System.Diagnostics;
using System.Globalization;
using System.Text;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Thermo;

namespace Hull.Bench.Suites;

/// <summary>
/// The figure of a ternary of 1e4 entries, timed as the server produces it: the hull with its tie-lines (a fresh
/// hull each repetition, as on a cache miss), then the figure drawn from it. Targets: at most 2 MB of SVG and
/// 200 ms; the server's documented response limit is 64 MiB.
/// </summary>
public static class FiguresSuite
{
    public const string Name = "figures";

    private const int Entries = 10_000;
    private const double TargetMs = 200;
    private const double TargetBytes = 2_000_000;
    private static readonly string[] Elements = ["Co", "Li", "O"];

    public static string Run(BenchOptions options)
    {
        int reps = options.Quick ? 1 : options.InProcessReps ?? 15;
        int entries = options.Scale(Entries);
        var report = new StringBuilder();
        report.AppendLine($"# Figures: a ternary of {entries} entries\n");
        report.AppendLine($"Command: `{options.CommandLine}`; machine: {MachineInfo.Describe()}; load average {LoadAverage()}; one run, medians of {reps} repetitions after one warm-up.");
        report.AppendLine("Wall time counts the waits for a core on a shared machine; CPU time (this process, all threads) does not.\n");
        report.AppendLine("| distribution | entries | stable phases | tie-lines | unstable drawn (cut-off 0.2) | SVG bytes | hull + tie-lines median [ms] | figure median [ms] (of it: positions) | total median [ms] | total max [ms] | total CPU time median [ms] | targets (≤ 2 MB, ≤ 200 ms) |");
        report.AppendLine("|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---|");
        foreach (EnergyDistribution distribution in new[] { EnergyDistribution.Dense, EnergyDistribution.Sparse })
        {
            PointSet points = LatticeGenerator.Generate(3, entries, LatticeGenerator.LargeCellMaxAtoms, distribution, options.Seed);
            PhaseEntry[] rows = points.Amounts.Select((a, i) => new PhaseEntry(
                $"e{i:00000}", Formula(a), points.EnergiesEvPerAtom[i], Core.Thermo.EnergyBasis.FormationPerAtom)).ToArray();
            var metadata = new FigureMetadata("bench", 1, new string('0', 64));
            var hullMs = new List<double>();
            var figureMs = new List<double>();
            var totalMs = new List<double>();
            var inputMs = new List<double>();
            FigureResult? figure = null;
            var cpuMs = new List<double>();
            for (int r = 0; r <= reps; r++)
            {
                TimeSpan cpuStart = Process.GetCurrentProcess().TotalProcessorTime;
                long start = Stopwatch.GetTimestamp();
                SystemHull hull = SystemHull.OverElements(rows);
                _ = hull.TieLines.Count;
                double built = Stopwatch.GetElapsedTime(start).TotalMilliseconds;
                long inputStart = Stopwatch.GetTimestamp();
                FigureInput input = FigureInput.FromHull(hull, metadata);
                double placed = Stopwatch.GetElapsedTime(inputStart).TotalMilliseconds;
                long drawStart = Stopwatch.GetTimestamp();
                figure = PhaseDiagram.Draw(input);
                double drawn = Stopwatch.GetElapsedTime(drawStart).TotalMilliseconds + placed;
                if (r > 0) inputMs.Add(placed);
                if (r == 0) continue; // warm-up (JIT)
                cpuMs.Add((Process.GetCurrentProcess().TotalProcessorTime - cpuStart).TotalMilliseconds);
                hullMs.Add(built);
                figureMs.Add(drawn);
                totalMs.Add(built + drawn);
            }

            int bytes = Encoding.UTF8.GetByteCount(figure!.Svg);
            double total = Stats.Median(totalMs);
            string met = bytes <= TargetBytes && total <= TargetMs ? "met" : "NOT met";
            report.AppendLine(string.Create(CultureInfo.InvariantCulture,
                $"| {distribution.ToString().ToLowerInvariant()} | {entries} | {figure.StablePhaseCount} | {figure.EdgeCount} | {figure.UnstableShownCount} | {bytes} | {Stats.Median(hullMs):F1} | {Stats.Median(figureMs):F1} ({Stats.Median(inputMs):F1}) | {total:F1} | {totalMs.Max():F1} | {Stats.Median(cpuMs):F1} | {met} |"));
        }

        string text = report.ToString();
        Console.Write(text);
        return text;
    }

    internal static string LoadAverage() =>
        File.Exists("/proc/loadavg") ? string.Join(' ', File.ReadAllText("/proc/loadavg").Split(' ').Take(3)) : "unknown";

    private static Composition Formula(long[] amounts) => Formula(Elements, amounts);

    /// <summary>The formula of integer amounts of <paramref name="elements"/> (zero amounts left out).</summary>
    internal static Composition Formula(string[] elements, long[] amounts) =>
        Composition.Parse(string.Concat(elements.Select((e, k) => amounts[k] == 0 ? string.Empty : $"{e}{amounts[k]}")));
}
