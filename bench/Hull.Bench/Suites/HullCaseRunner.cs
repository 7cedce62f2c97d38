using System.Diagnostics;
using System.Globalization;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Bench.References;
using Hull.Core.Geometry;

namespace Hull.Bench.Suites;

/// <summary>What to measure for one case and how often.</summary>
public sealed record HullCasePlan(
    string Name,
    PointSet Points,
    int InProcessReps,
    int ProcessReps,
    int QconvexReps,
    TimeSpan QconvexCap,
    int LpSample,
    TimeSpan? OursCap = null);

/// <summary>
/// Runs one hull case: ours in-process (one untimed warm-up, then the timed repetitions of LowerHull.Build plus
/// EnergyAboveHull for every point), ours as a whole process on a points file, qconvex as a whole process on the
/// same points lifted, interleaved repetition by repetition so that machine noise hits both alike, and the LP check.
/// </summary>
public static class HullCaseRunner
{
    /// <summary>Exactness demanded of ours against the LP reference (eV/atom), from the benchmark brief.</summary>
    public const double LpAgreementEvPerAtom = 1e-9;

    /// <summary>
    /// A run longer than this (ms) is not repeated, and in-process it is not preceded by a warm-up: at that length
    /// noise and JIT are small against the time, and repeating would push a suite past its time budget.
    /// </summary>
    public const double LongRunMs = 20_000;

    public static HullCaseResult Run(HullCasePlan plan, string workDirectory, int seed)
    {
        var pts = plan.Points;
        var result = new HullCaseResult
        {
            Name = plan.Name,
            Entries = pts.Count,
            Components = pts.Components,
            DistinctCompositions = CountDistinctCompositions(pts),
        };
        Console.WriteLine($"-- {plan.Name}: {pts.Count} entries, {pts.Components} components, {result.DistinctCompositions} distinct compositions");

        string oursFile = Path.Combine(workDirectory, "points.txt");
        string qhullFile = Path.Combine(workDirectory, "points.qhull");
        string qhullOut = Path.Combine(workDirectory, "qconvex.out");
        pts.WriteAmountsFile(oursFile);
        pts.WriteQhullFile(qhullFile);

        var procTimes = new List<double>();
        var procPeaks = new List<double>();
        bool oursFinished = true;
        if (plan.OursCap is { } oursCap)
        {
            // A case that may not finish: one capped whole-process run decides whether ours is timed in-process at all.
            var run = ExternalRun.Run(OwnExecutable.Path, OwnExecutable.SolveFileArguments(oursFile), oursCap);
            result.PeakProcessMb = run.PeakMegabytes;
            if (run.TimedOut)
            {
                oursFinished = false;
                result.Notes.Add($"ours did not finish within {oursCap.TotalSeconds:F0} s (whole process, stopped; its peak memory is not reported when killed)");
            }
            else if (!run.Succeeded)
            {
                oursFinished = false;
                result.Notes.Add($"ours failed, exit {run.ExitCode}: {FirstLine(run.StandardError)}");
            }
            else
            {
                procTimes.Add(run.WallMilliseconds);
                procPeaks.Add(run.PeakMegabytes);
                SetSizes(run.StandardOutput, result);
            }
            Console.WriteLine($"   ours capped whole-process run: {(oursFinished ? $"{run.WallMilliseconds:F0} ms" : string.Join("; ", result.Notes))}");
        }

        double[] ours = [];
        if (plan.InProcessReps > 0 && oursFinished)
        {
            ProcessMemory.ResetPeak();
            var times = new List<double>();
            var first = SolveInProcess(pts, out LowerHull hull);
            if (first > LongRunMs)
            {
                // JIT warm-up is milliseconds; on a run this long the first run is the measurement.
                times.Add(first);
                result.Notes.Add($"in-process: one cold run ({first / 1000:F0} s), no warm-up");
            }
            else
            {
                Console.WriteLine($"   warm-up in-process run (not counted): {first:F1} ms");
                for (int r = 0; r < plan.InProcessReps; r++) times.Add(SolveInProcess(pts, out hull));
            }
            result.PeakInProcessMb = ProcessMemory.PeakMegabytes();
            result.InProcessMedianMs = Stats.Median(times);
            result.InProcessReps = times.Count;
            result.Vertices = hull.VertexPoints.Count;
            result.Facets = hull.Facets.Count;
            ours = new double[pts.Count];
            for (int i = 0; i < pts.Count; i++) ours[i] = hull.EnergyAboveHull(i);
            result.OnHull = ours.Count(e => e == 0.0);
            Console.WriteLine($"   in-process: median {result.InProcessMedianMs:F1} ms over {times.Count} ({Join(times)}); vertices {result.Vertices}, lower facets {result.Facets}, on hull {result.OnHull}, peak {result.PeakInProcessMb:F0} MB");
        }

        var qTimes = new List<double>();
        var qPeaks = new List<double>();
        bool oursDone = !oursFinished || procTimes.Count >= plan.ProcessReps;
        bool qDone = plan.QconvexReps == 0;
        for (int r = 0; !(oursDone && qDone); r++)
        {
            if (!oursDone)
            {
                var run = ExternalRun.Run(OwnExecutable.Path, OwnExecutable.SolveFileArguments(oursFile), TimeSpan.FromMinutes(10));
                if (!run.Succeeded) throw new InvalidOperationException($"our whole-process run failed (exit {run.ExitCode}): {run.StandardError}");
                CheckProcessSummary(run.StandardOutput, result, ours);
                procTimes.Add(run.WallMilliseconds);
                procPeaks.Add(run.PeakMegabytes);
                if (run.WallMilliseconds > LongRunMs && procTimes.Count < plan.ProcessReps)
                {
                    result.Notes.Add($"ours whole process took {run.WallMilliseconds / 1000:F0} s, not repeated");
                    oursDone = true;
                }
                oursDone |= procTimes.Count >= plan.ProcessReps;
            }
            if (!qDone)
            {
                var q = QconvexReference.Run(qhullFile, qhullOut, plan.QconvexCap);
                if (q.Process.TimedOut)
                {
                    result.QconvexStatus = $"did not finish within {plan.QconvexCap.TotalSeconds:F0} s";
                    result.QconvexCapMs = plan.QconvexCap.TotalMilliseconds;
                    result.PeakQconvexMb = q.Process.PeakMegabytes;
                    qDone = true;
                }
                else if (!q.Process.Succeeded)
                {
                    result.QconvexStatus = $"failed, exit {q.Process.ExitCode}: {FirstLine(q.Process.StandardError)}";
                    qDone = true;
                }
                else
                {
                    qTimes.Add(q.Process.WallMilliseconds);
                    qPeaks.Add(q.Process.PeakMegabytes);
                    result.QconvexFacets = q.Facets;
                    result.QconvexStatus = "ok";
                    if (q.Process.WallMilliseconds > LongRunMs && qTimes.Count < plan.QconvexReps)
                    {
                        result.Notes.Add($"qconvex took {q.Process.WallMilliseconds / 1000:F0} s, not repeated");
                        qDone = true;
                    }
                    qDone |= qTimes.Count >= plan.QconvexReps;
                }
            }
        }
        if (procTimes.Count > 0)
        {
            result.ProcessMedianMs = Stats.Median(procTimes);
            result.ProcessReps = procTimes.Count;
            result.PeakProcessMb = procPeaks.Max();
            Console.WriteLine($"   ours whole process: median {result.ProcessMedianMs:F1} ms over {procTimes.Count} ({Join(procTimes)}), peak {result.PeakProcessMb:F0} MB");
        }
        if (qTimes.Count > 0)
        {
            result.QconvexMedianMs = Stats.Median(qTimes);
            result.QconvexReps = qTimes.Count;
            result.PeakQconvexMb = qPeaks.Max();
            Console.WriteLine($"   qconvex whole process: median {result.QconvexMedianMs:F1} ms over {qTimes.Count} ({Join(qTimes)}), full-hull facets {result.QconvexFacets}, peak {result.PeakQconvexMb:F0} MB");
        }
        else
        {
            Console.WriteLine($"   qconvex: {result.QconvexStatus}");
        }

        if (plan.LpSample != 0 && ours.Length > 0)
        {
            var queries = ChooseLpQueries(pts.Count, plan.LpSample, seed);
            var lp = LpReference.EnergyAboveHull(pts, queries, workDirectory, out double seconds);
            double worst = 0;
            for (int j = 0; j < queries.Count; j++) worst = Math.Max(worst, Math.Abs(ours[queries[j]] - Math.Max(0.0, lp[j])));
            result.LpMaxAbsDiff = worst;
            result.LpChecked = queries.Count;
            result.LpSeconds = seconds;
            string verdict = worst <= LpAgreementEvPerAtom ? "within" : "OUTSIDE";
            Console.WriteLine($"   LP reference: {queries.Count} points in {seconds:F1} s, max |ours - LP| = {worst:E2} eV/atom ({verdict} {LpAgreementEvPerAtom:E0})");
        }
        foreach (var f in new[] { oursFile, qhullFile }) File.Delete(f);
        return result;
    }

    /// <summary>
    /// The fixed cost of a whole process of ours: median wall time (ms) of <paramref name="reps"/> solve-file runs on
    /// a 2-component, 3-point file (runtime start-up, JIT of the path, a trivial hull).
    /// </summary>
    public static double MeasureStartupMs(string workDirectory, int reps)
    {
        string tiny = Path.Combine(workDirectory, "tiny.txt");
        new PointSet(2, [[1, 0], [0, 1], [1, 1]], [0.0, 0.0, -0.5]).WriteAmountsFile(tiny);
        var times = new List<double>();
        for (int r = 0; r < reps; r++)
        {
            var run = ExternalRun.Run(OwnExecutable.Path, OwnExecutable.SolveFileArguments(tiny), TimeSpan.FromMinutes(1));
            if (!run.Succeeded) throw new InvalidOperationException($"start-up run failed (exit {run.ExitCode}): {run.StandardError}");
            times.Add(run.WallMilliseconds);
        }
        File.Delete(tiny);
        double median = Stats.Median(times);
        Console.WriteLine($"-- start-up: ours whole process on a 3-point file, median {median:F0} ms over {reps} ({Join(times)})");
        return median;
    }

    /// <summary>All points when the sample covers them (sample &lt; 0 means all); otherwise a seeded uniform sample without replacement, sorted.</summary>
    public static IReadOnlyList<int> ChooseLpQueries(int count, int sample, int seed)
    {
        if (sample < 0 || sample >= count) return Enumerable.Range(0, count).ToArray();
        var all = Enumerable.Range(0, count).ToArray();
        new Random(seed ^ 0x5bd1e995).Shuffle(all);
        return all.Take(sample).Order().ToArray();
    }

    /// <summary>Ours, timed: build the hull and compute every point's energy above hull.</summary>
    public static double SolveInProcess(PointSet pts, out LowerHull hull)
    {
        var sw = Stopwatch.StartNew();
        hull = LowerHull.Build(pts.Amounts, pts.EnergiesEvPerAtom);
        double sum = 0;
        for (int i = 0; i < pts.Count; i++) sum += hull.EnergyAboveHull(i);
        sw.Stop();
        GC.KeepAlive(sum);
        return sw.Elapsed.TotalMilliseconds;
    }

    private static void SetSizes(string stdout, HullCaseResult result)
    {
        var fields = Fields(stdout);
        result.Vertices = int.Parse(fields["vertices"], CultureInfo.InvariantCulture);
        result.Facets = int.Parse(fields["facets"], CultureInfo.InvariantCulture);
        result.OnHull = int.Parse(fields["on_hull"], CultureInfo.InvariantCulture);
    }

    private static Dictionary<string, string> Fields(string stdout) =>
        stdout.Trim().Split(' ').Select(f => f.Split('=')).Where(p => p.Length == 2).ToDictionary(p => p[0], p => p[1]);

    private static void CheckProcessSummary(string stdout, HullCaseResult result, double[] ours)
    {
        // The child prints "vertices=V facets=F on_hull=H sum_eah=S"; it must agree with the in-process run.
        var fields = Fields(stdout);
        if (ours.Length == 0) { SetSizes(stdout, result); return; }
        int v = int.Parse(fields["vertices"], CultureInfo.InvariantCulture);
        int f = int.Parse(fields["facets"], CultureInfo.InvariantCulture);
        double s = double.Parse(fields["sum_eah"], CultureInfo.InvariantCulture);
        double expected = ours.Sum();
        if (v != result.Vertices || f != result.Facets || Math.Abs(s - expected) > 1e-6 * Math.Max(1, Math.Abs(expected)))
        {
            throw new InvalidOperationException($"whole-process run disagrees with in-process: {stdout.Trim()} vs vertices={result.Vertices} facets={result.Facets} sum_eah={expected}");
        }
    }

    private static int CountDistinctCompositions(PointSet pts)
    {
        var set = new HashSet<string>();
        foreach (var row in pts.Amounts)
        {
            long g = 0;
            foreach (long a in row) g = Gcd(g, a);
            set.Add(string.Join(',', row.Select(a => a / g)));
        }
        return set.Count;
    }

    private static long Gcd(long a, long b)
    {
        while (b != 0) (a, b) = (b, a % b);
        return Math.Abs(a);
    }

    private static string FirstLine(string s) => s.Split('\n', StringSplitOptions.RemoveEmptyEntries).FirstOrDefault()?.Trim() ?? "";

    private static string Join(IEnumerable<double> v) => string.Join(", ", v.Select(x => x.ToString("F0", CultureInfo.InvariantCulture)));
}
