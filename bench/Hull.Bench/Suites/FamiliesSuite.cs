using System.Globalization;
using System.Text;
using Hull.Bench.Data;

namespace Hull.Bench.Suites;

/// <summary>
/// Every bench family (dense, sparse, pair, faceted) in 3 to 8 components, ours against qconvex's full hull in one
/// run, whole process and in-process, with the LP reference on a sample; the targets of the engine-choice work.
/// </summary>
public static class FamiliesSuite
{
    public const string Name = "families";

    /// <summary>Whole-process ratio wanted where qconvex takes more than <see cref="SlowQconvexMs"/>.</summary>
    public const double SlowCaseRatio = 5.0;

    /// <summary>Whole-process ratio wanted elsewhere (or ours at most <see cref="QuickEnoughMs"/>).</summary>
    public const double QuickCaseRatio = 2.0;

    public const double SlowQconvexMs = 500;
    public const double QuickEnoughMs = 30;

    /// <summary>8 components × 2e4 entries, whole process, on every family.</summary>
    public const double Large8cTargetMs = 1_000;

    private static readonly (int N, int Entries, int Lp)[] Cases =
    [
        (3, 100_000, 10), (4, 100_000, 10), (5, 20_000, 30), (6, 2_000, 100), (6, 20_000, 30), (7, 20_000, 30), (8, 2_000, 100), (8, 20_000, 30),
    ];

    public static string Run(BenchOptions o, string workDirectory, string repoRoot)
    {
        int capSeconds = o.QconvexCapSeconds ?? 30;
        var cap = TimeSpan.FromSeconds(capSeconds);
        string solver = NativeSolver.Publish(repoRoot);
        int startupReps = o.Quick ? 1 : 7;
        double startupMs = HullCaseRunner.MeasureStartupMs(solver, workDirectory, startupReps);
        var results = new List<HullCaseResult>();
        foreach (var family in PointFamilies.All)
        {
            foreach (var c in Cases)
            {
                int seed = o.Seed + 100_000 * (int)family + 1000 * c.N + c.Entries / 1000;
                var pts = PointFamilies.Generate(family, c.N, o.Scale(c.Entries), seed);
                int inReps = o.Quick ? 1 : o.InProcessReps ?? 5;
                int procReps = o.Quick ? 1 : o.ProcessReps ?? 5;
                var plan = new HullCasePlan($"{family.Token()} {c.N}c", pts, inReps, procReps, procReps, cap, o.LpSample ?? c.Lp);
                results.Add(HullCaseRunner.Run(plan, workDirectory, seed, solver));
            }
        }

        var sb = new StringBuilder();
        sb.Append(MarkdownReport.Header(Name, o.CommandLine));
        sb.AppendLine();
        sb.AppendLine("Families (bench/Hull.Bench/Data): dense and sparse on the ≤12-atom lattice over the convex background; pair (independent amounts 0–5 of every component, random pair interactions, few stable); faceted (a piecewise-planar surface with 40 % of the entries exactly on it). "
            + $"Ours in-process: one untimed warm-up, then the median of the timed runs of HullStability.Build + EnergyAboveHull for every entry (the engine the library picks, named in the engine column). Whole process: ours as `Hull.Solve IN` (Native AOT) and `{References.QconvexReference.CommandLine("IN", "OUT")}` on the same points, interleaved, medians; qconvex capped at {capSeconds} s. CPU: user + system time of each whole process (GNU time), ours summed over its two threads, qconvex single-threaded: on a shared machine the measure of work apart from waiting for a core (wall is what a user waits on an idle one). LP column: a seeded sample checked against SciPy HiGHS.");
        sb.AppendLine();
        sb.AppendLine(string.Create(CultureInfo.InvariantCulture, $"Fixed cost of our whole process (start-up, trivial hull, exit; median of {startupReps}): {startupMs:F0} ms."));
        sb.AppendLine();
        sb.Append(MarkdownReport.HullTable(results));
        sb.AppendLine();
        sb.AppendLine($"Targets (whole process): ≥ {QuickCaseRatio:F0}× qconvex at 3–4 components × 1e5; ≥ {SlowCaseRatio:F0}× where qconvex takes more than {SlowQconvexMs / 1000:F1} s, ≥ {QuickCaseRatio:F0}× or ≤ {QuickEnoughMs:F0} ms where it takes less; 8 components × 2e4 ≤ {Large8cTargetMs / 1000:F0} s.");
        foreach (var r in results) sb.AppendLine($"- {r.Name}, {r.Entries} entries: {Verdict(r)}{string.Concat(r.Notes.Select(n => "; " + n))}");
        return sb.ToString();
    }

    private static string Verdict(HullCaseResult r)
    {
        var inv = CultureInfo.InvariantCulture;
        string lp = r.LpChecked > 0
            ? string.Create(inv, $"; LP max |diff| {r.LpMaxAbsDiff:E1} eV/atom over {r.LpChecked} entries ({(r.LpMaxAbsDiff <= HullCaseRunner.LpAgreementEvPerAtom ? "within" : "OUTSIDE")} 1e-9)")
            : "";
        string ours = string.Create(inv, $"ours {r.ProcessMedianMs:F0} ms wall / {r.ProcessCpuMedianMs:F0} ms CPU whole process, {r.InProcessMedianMs:F0} ms in-process ({r.Engine})");
        if (r.Components == 8 && r.Entries >= 20_000)
        {
            string q = r.QconvexReps > 0 ? string.Create(inv, $"qconvex {r.QconvexMedianMs / 1000:F1} s") : $"qconvex {r.QconvexStatus}";
            return string.Create(inv, $"{ours}; target ≤ {Large8cTargetMs:F0} ms: wall {Met(r.ProcessMedianMs <= Large8cTargetMs)}, CPU {Met(r.ProcessCpuMedianMs <= Large8cTargetMs)}; {q}{lp}");
        }
        if (r.QconvexReps == 0)
        {
            double bound = r.QconvexCapMs / r.ProcessMedianMs;
            return string.Create(inv, $"qconvex {r.QconvexStatus}; {ours}, so qconvex / ours ≥ {bound:F1}× wall (target ≥ {SlowCaseRatio:F0}×: {Met(bound >= SlowCaseRatio)}){lp}");
        }
        // 3–4 components × 1e5 have their own target (≥ 2×), whatever qconvex takes.
        bool large3d4d = r.Components <= 4 && r.Entries >= 100_000;
        bool slow = !large3d4d && r.QconvexMedianMs > SlowQconvexMs;
        string target = large3d4d ? $"≥ {QuickCaseRatio:F0}×" : slow ? $"≥ {SlowCaseRatio:F0}×" : $"≥ {QuickCaseRatio:F0}× or ≤ {QuickEnoughMs:F0} ms";
        bool Meets(double ratio, double oursMs) => large3d4d ? ratio >= QuickCaseRatio
            : slow ? ratio >= SlowCaseRatio : ratio >= QuickCaseRatio || oursMs <= QuickEnoughMs;
        return string.Create(inv,
            $"qconvex {r.QconvexMedianMs:F0} ms wall / {r.QconvexCpuMedianMs:F0} ms CPU; {ours}; qconvex / ours {r.RatioToProcess:F2}× wall, {r.CpuRatioToProcess:F2}× CPU; target {target}: wall {Met(Meets(r.RatioToProcess, r.ProcessMedianMs))}, CPU {Met(Meets(r.CpuRatioToProcess, r.ProcessCpuMedianMs))}{lp}");
    }

    private static string Met(bool met) => met ? "met" : "MISSED";
}
