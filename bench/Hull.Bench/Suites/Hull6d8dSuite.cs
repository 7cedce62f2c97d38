using System.Globalization;
using System.Text;
using Hull.Bench.Data;

namespace Hull.Bench.Suites;

/// <summary>
/// Higher dimensions: 2e3 and 2e4 entries in 6 components, 2e3 and 2e4 in 8. Ours against qconvex's full hull
/// (target: ours at least 20x faster), exactness against the LP reference (1e-9 eV/atom); 8 components with 2e4
/// entries: ours alone (target at most 10 s), qconvex under a time cap to confirm it does not finish.
/// </summary>
public static class Hull6d8dSuite
{
    public const string Name = "hull6d8d";

    public const double SpeedupTarget = 20.0;
    public const double Large8cTargetMs = 10_000;

    public static string Run(BenchOptions o, string workDirectory, string repoRoot)
    {
        int capSeconds = o.QconvexCapSeconds ?? 120;
        var cap = TimeSpan.FromSeconds(capSeconds);
        var results = new List<HullCaseResult>();
        string solver = NativeSolver.Publish(repoRoot);
        int startupReps = o.Quick ? 1 : 7;
        double startupMs = HullCaseRunner.MeasureStartupMs(solver, workDirectory, startupReps);
        var sampleNote = new StringBuilder();
        var cases = new (int N, int Entries, int InReps, int ProcReps, int QReps, int Lp, bool Capped)[]
        {
            (6, 2_000, 5, 3, 3, -1, false),
            (6, 20_000, 3, 3, 3, 300, false),
            (8, 2_000, 3, 3, 3, -1, false),
            (8, 20_000, 3, 3, 1, 100, true),
        };
        foreach (var c in cases)
        {
            foreach (var dist in new[] { EnergyDistribution.Dense, EnergyDistribution.Sparse })
            {
                int seed = o.Seed + 1000 * c.N + c.Entries + (int)dist;
                var pts = LatticeGenerator.Generate(c.N, o.Scale(c.Entries), LatticeGenerator.SmallCellMaxAtoms, dist, seed);
                int inReps = o.Quick ? 1 : o.InProcessReps ?? c.InReps;
                int procReps = o.Quick ? 1 : o.ProcessReps ?? c.ProcReps;
                int qReps = o.Quick ? 1 : Math.Min(procReps, c.QReps);
                int lp = o.LpSample ?? c.Lp;
                var plan = new HullCasePlan($"{c.N}c ≤12 atoms {dist.ToString().ToLowerInvariant()}", pts, inReps, procReps, qReps, cap, lp,
                    c.Capped ? cap : null);
                var r = HullCaseRunner.Run(plan, workDirectory, seed, solver);
                results.Add(r);
            }
        }

        var sb = new StringBuilder();
        sb.Append(MarkdownReport.Header(Name, o.CommandLine));
        sb.AppendLine();
        sb.AppendLine("Ours in-process: one untimed warm-up, then the median of the timed runs (count in brackets) of HullStability.Build + EnergyAboveHull for every entry (the engine the library picks, named in the engine column: in 6 and more components one linear program per composition, which builds no facets). "
            + $"Whole-process: ours as `Hull.Solve IN` (bench/Hull.Solve published with Native AOT, same sources as the in-process runs) and `{References.QconvexReference.CommandLine("IN", "OUT")}` on the same points (lifted: n-1 fractions + energy), parsing included, interleaved; "
            + $"qconvex capped at {capSeconds} s per run; 8 components × 2e4 entries: ours first runs once as a whole process under the same cap, and is timed in-process only if that finished. "
            + $"Any run longer than {HullCaseRunner.LongRunMs / 1000:F0} s is not repeated, and in-process such a run is a single cold run without warm-up (noted below). "
            + "LP column: every entry for 2e3-entry cases; for 2e4 entries a seeded uniform random sample (each LP spans all 2e4 points, about 0.1 s each).");
        sb.AppendLine();
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture, $"Fixed cost of our whole process (process start-up, trivial hull, exit; median of {startupReps} runs on a 3-point file): {startupMs:F0} ms."));
        sb.AppendLine();
        sb.Append(MarkdownReport.HullTable(results));
        sb.AppendLine();
        sb.AppendLine("Targets:");
        foreach (var r in results)
        {
            var line = new StringBuilder($"- {r.Name}, {r.Entries} entries: ");
            if (r.Components == 8 && r.Entries >= 20_000 && r.ProcessReps == 0)
            {
                line.Append(CultureInfo.InvariantCulture, $"ours did not finish within the {capSeconds} s cap (target ≤ {Large8cTargetMs / 1000:F0} s: MISSED); qconvex {r.QconvexStatus}");
            }
            else if (r.Components == 8 && r.Entries >= 20_000)
            {
                line.Append(CultureInfo.InvariantCulture, $"ours in-process {r.InProcessMedianMs / 1000:F2} s, whole process {r.ProcessMedianMs / 1000:F2} s (target ≤ {Large8cTargetMs / 1000:F0} s: {(r.ProcessMedianMs <= Large8cTargetMs ? "met" : "MISSED")}); qconvex {r.QconvexStatus}");
                if (r.QconvexReps > 0) line.Append(CultureInfo.InvariantCulture, $" in {r.QconvexMedianMs / 1000:F1} s");
            }
            else if (r.QconvexReps == 0)
            {
                line.Append(CultureInfo.InvariantCulture, $"qconvex {r.QconvexStatus}; ours whole process {r.ProcessMedianMs / 1000:F1} s, so qconvex / ours ≥ {r.QconvexCapMs / r.ProcessMedianMs:F1}× (target ≥ {SpeedupTarget:F0}×)");
            }
            else
            {
                line.Append(CultureInfo.InvariantCulture, $"qconvex / ours whole-process = {r.RatioToProcess:F1}×, qconvex / ours in-process = {r.RatioToInProcess:F1}× (target ≥ {SpeedupTarget:F0}×: whole-process {(r.RatioToProcess >= SpeedupTarget ? "met" : "MISSED")}, in-process {(r.RatioToInProcess >= SpeedupTarget ? "met" : "MISSED")})");
            }
            if (r.LpChecked > 0) line.Append(CultureInfo.InvariantCulture, $"; LP max |diff| {r.LpMaxAbsDiff:E1} eV/atom over {r.LpChecked} entries ({(r.LpMaxAbsDiff <= HullCaseRunner.LpAgreementEvPerAtom ? "within" : "OUTSIDE")} 1e-9), LP took {r.LpSeconds:F0} s");
            foreach (var n in r.Notes) line.Append("; " + n);
            sb.AppendLine(line.ToString());
        }
        return sb.ToString();
    }
}
