using System.Globalization;
using System.Text;
using Hull.Bench.Measure;

namespace Hull.Bench.Suites;

/// <summary>Markdown tables of hull case results, printed and written to bench/results/&lt;suite&gt;.md.</summary>
public static class MarkdownReport
{
    public static string HullTable(IEnumerable<HullCaseResult> results)
    {
        var sb = new StringBuilder();
        sb.AppendLine("| case | entries | components | distinct compositions | ours in-process median [ms] (reps) | ours whole-process median [ms] (reps) | qconvex median [ms] (reps) | ratio qconvex / ours whole-process | ratio qconvex / ours in-process | engine | hull vertices | lower facets | qconvex full-hull facets | peak MB ours in-process | peak MB ours process | peak MB qconvex | LP max \\|diff\\| [eV/atom] (points checked) |");
        sb.AppendLine("|---|---:|---:|---:|---:|---:|---:|---:|---:|---|---:|---:|---:|---:|---:|---:|---:|");
        foreach (var r in results)
        {
            string q = r.QconvexReps > 0 ? $"{F(r.QconvexMedianMs)} ({r.QconvexReps})" : r.QconvexStatus;
            string lp = r.LpChecked > 0 ? $"{r.LpMaxAbsDiff.ToString("0.0E+0", CultureInfo.InvariantCulture)} ({r.LpChecked})" : "—";
            sb.AppendLine(string.Join(" | ", new[]
            {
                "| " + r.Name,
                r.Entries.ToString(CultureInfo.InvariantCulture),
                r.Components.ToString(CultureInfo.InvariantCulture),
                r.DistinctCompositions.ToString(CultureInfo.InvariantCulture),
                r.InProcessReps > 0 ? $"{F(r.InProcessMedianMs)} ({r.InProcessReps})" : "—",
                r.ProcessReps > 0 ? $"{F(r.ProcessMedianMs)} ({r.ProcessReps})" : "—",
                q,
                Ratio(r.RatioToProcess, r),
                Ratio(r.RatioToInProcess, r),
                Finished(r) ? r.Engine : "—",
                Finished(r) ? r.Vertices.ToString(CultureInfo.InvariantCulture) : "—",
                Finished(r) && r.Facets is int facets ? facets.ToString(CultureInfo.InvariantCulture) : "—",
                r.QconvexFacets?.ToString(CultureInfo.InvariantCulture) ?? "—",
                F(r.PeakInProcessMb),
                F(r.PeakProcessMb),
                F(r.PeakQconvexMb),
                lp + " |",
            }));
        }
        return sb.ToString();
    }

    public static string Header(string suite, string command) =>
        $"# Benchmark results: {suite}\n\nRun {DateTime.UtcNow:yyyy-MM-dd HH:mm} UTC on {MachineInfo.Describe()}.\n\nCommand: `{command}`\n\n"
        + $"Load average (1/5/15 min) when the suite started: {MachineInfo.StartLoad}; when it ended: {MachineInfo.LoadAverage()} (the machine is shared; 2 cores).\n";

    public static void Write(string repoRoot, string suite, string content)
    {
        string dir = Path.Combine(repoRoot, "bench", "results");
        Directory.CreateDirectory(dir);
        File.WriteAllText(Path.Combine(dir, suite + ".md"), content);
        Console.WriteLine();
        Console.WriteLine(content);
        Console.WriteLine($"(written to bench/results/{suite}.md)");
    }

    private static bool Finished(HullCaseResult r) => r.InProcessReps > 0 || r.ProcessReps > 0;

    private static string Ratio(double v, HullCaseResult r) =>
        double.IsFinite(v) ? v.ToString("0.00", CultureInfo.InvariantCulture) + "×" : r.QconvexReps == 0 ? "—" : "n/a";

    private static string F(double v) => double.IsFinite(v) ? v.ToString(v >= 100 ? "F0" : "F1", CultureInfo.InvariantCulture) : "—";
}
