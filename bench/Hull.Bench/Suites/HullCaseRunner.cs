using System.Diagnostics;
using System.Globalization;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Bench.References;
using Hull.Core.Geometry;
using Hull.Solve;

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
/// Runs one hull case: ours in-process (one untimed warm-up, then the timed repetitions of
/// <see cref="PointsFileSolver.Solve"/>: HullStability.Build plus EnergyAboveHull for every point), ours as a whole
/// process (the Native AOT Hull.Solve on a points file), qconvex as a whole process on the same points lifted,
/// interleaved repetition by repetition so that machine noise hits both alike, and the LP check.
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

    /// <param name="ourExecutable">The published Native AOT solver (<see cref="NativeSolver.Publish"/>).</param>
    public static HullCaseResult Run(HullCasePlan plan, string workDirectory, int seed, string ourExecutable)
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
        CheckReadBack(oursFile, pts);

        var procTimes = new List<double>();
        var procCpu = new List<double>();
        var qCpu = new List<double>();
        var procPeaks = new List<double>();
        bool oursFinished = true;
        if (plan.OursCap is { } oursCap)
        {
            // A case that may not finish: one capped whole-process run decides whether ours is timed in-process at all.
            var run = ExternalRun.Run(ourExecutable, NativeSolver.Arguments(oursFile), oursCap);
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
        SolveSummary? inProcessSummary = null;
        if (plan.InProcessReps > 0 && oursFinished)
        {
            ProcessMemory.ResetPeak();
            var times = new List<double>();
            var first = SolveInProcess(pts, out SolvedPoints solved);
            if (first > LongRunMs)
            {
                // JIT warm-up is milliseconds; on a run this long the first run is the measurement.
                times.Add(first);
                result.Notes.Add($"in-process: one cold run ({first / 1000:F0} s), no warm-up");
            }
            else
            {
                Console.WriteLine($"   warm-up in-process run (not counted): {first:F1} ms");
                for (int r = 0; r < plan.InProcessReps; r++) times.Add(SolveInProcess(pts, out solved));
            }
            result.PeakInProcessMb = ProcessMemory.PeakMegabytes();
            result.InProcessMedianMs = Stats.Median(times);
            result.InProcessReps = times.Count;
            inProcessSummary = solved.Summary;
            result.Vertices = solved.Summary.Vertices;
            result.Facets = solved.Summary.Facets;
            result.Engine = solved.Summary.Engine;
            result.OnHull = solved.Summary.OnHull;
            ours = new double[pts.Count];
            for (int i = 0; i < pts.Count; i++) ours[i] = solved.Hull.EnergyAboveHullEvPerAtom(i);
            Console.WriteLine($"   in-process: median {result.InProcessMedianMs:F1} ms over {times.Count} ({Join(times)}); vertices {result.Vertices}, engine {result.Engine}, lower facets {result.Facets?.ToString() ?? "not built"}, on hull {result.OnHull}, peak {result.PeakInProcessMb:F0} MB");
        }

        var qTimes = new List<double>();
        var qPeaks = new List<double>();
        bool oursDone = !oursFinished || procTimes.Count >= plan.ProcessReps;
        bool qDone = plan.QconvexReps == 0;
        for (int r = 0; !(oursDone && qDone); r++)
        {
            if (!oursDone)
            {
                var run = ExternalRun.Run(ourExecutable, NativeSolver.Arguments(oursFile), TimeSpan.FromMinutes(10));
                if (!run.Succeeded) throw new InvalidOperationException($"our whole-process run failed (exit {run.ExitCode}): {run.StandardError}");
                CheckProcessSummary(run.StandardOutput, result, inProcessSummary);
                procTimes.Add(run.WallMilliseconds);
                procCpu.Add(run.CpuMilliseconds);
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
                    qCpu.Add(q.Process.CpuMilliseconds);
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
            result.ProcessCpuMedianMs = Stats.Median(procCpu);
            result.ProcessReps = procTimes.Count;
            result.PeakProcessMb = procPeaks.Max();
            Console.WriteLine($"   ours whole process: median {result.ProcessMedianMs:F1} ms over {procTimes.Count} ({Join(procTimes)}), peak {result.PeakProcessMb:F0} MB");
        }
        if (qTimes.Count > 0)
        {
            result.QconvexMedianMs = Stats.Median(qTimes);
            result.QconvexCpuMedianMs = Stats.Median(qCpu);
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
            var lp = LpReference.EnergyAboveHullEvPerAtom(pts, queries, workDirectory, out double seconds);
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
    /// The fixed cost of a whole process of ours: median wall time (ms) of <paramref name="reps"/> runs of the
    /// native solver on a 2-component, 3-point file (process and runtime start-up, a trivial hull, exit).
    /// </summary>
    public static double MeasureStartupMs(string ourExecutable, string workDirectory, int reps)
    {
        string tiny = Path.Combine(workDirectory, "tiny.txt");
        new PointSet(2, [[1, 0], [0, 1], [1, 1]], [0.0, 0.0, -0.5]).WriteAmountsFile(tiny);
        var times = new List<double>();
        for (int r = 0; r < reps; r++)
        {
            var run = ExternalRun.Run(ourExecutable, NativeSolver.Arguments(tiny), TimeSpan.FromMinutes(1));
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

    /// <summary>Ours, timed: the same solve the native executable runs after parsing (build, every energy above hull).</summary>
    public static double SolveInProcess(PointSet pts, out SolvedPoints solved)
    {
        // Laid out as the executable reads them (one array for all amounts), outside the timed region.
        var points = PointsFile.FromRows(pts.Components, pts.Amounts, pts.EnergiesEvPerAtom);
        var sw = Stopwatch.StartNew();
        solved = PointsFileSolver.Solve(points);
        sw.Stop();
        return sw.Elapsed.TotalMilliseconds;
    }

    /// <summary>
    /// The points file the whole process parses must hold exactly the generated points (amounts and energies bit for
    /// bit), so that both runs solve the same input; read here with the parser the executable uses.
    /// </summary>
    private static void CheckReadBack(string pointsFile, PointSet pts)
    {
        var back = PointsFileSolver.Read(pointsFile);
        if (back.Count != pts.Count || back.Components != pts.Components)
        {
            throw new InvalidOperationException($"{pointsFile} reads back as {back.Count} points of {back.Components} components, written {pts.Count} of {pts.Components}");
        }
        for (int i = 0; i < pts.Count; i++)
        {
            if (!back.Row(i).SequenceEqual(pts.Amounts[i])
                || BitConverter.DoubleToInt64Bits(back.EnergiesEvPerAtom[i]) != BitConverter.DoubleToInt64Bits(pts.EnergiesEvPerAtom[i]))
            {
                throw new InvalidOperationException($"{pointsFile} line {i + 2} reads back differently from the generated point {i}");
            }
        }
    }

    private static void SetSizes(string stdout, HullCaseResult result)
    {
        var summary = SolveSummary.Parse(stdout);
        result.Vertices = summary.Vertices;
        result.Facets = summary.Facets;
        result.Engine = summary.Engine;
        result.OnHull = summary.OnHull;
    }

    /// <summary>Relative tolerance on the summed energies above hull between the two runs (sums of 1e5 terms).</summary>
    private const double SumAgreementRelative = 1e-6;

    private static void CheckProcessSummary(string stdout, HullCaseResult result, SolveSummary? inProcess)
    {
        // The child prints "engine=E vertices=V facets=F on_hull=H sum_eah=S"; it must agree with the in-process run.
        if (inProcess is not { } expected) { SetSizes(stdout, result); return; }
        var got = SolveSummary.Parse(stdout);
        double tolerance = SumAgreementRelative * Math.Max(1, Math.Abs(expected.SumEnergyAboveHullEvPerAtom));
        if (got.Engine != expected.Engine || got.Vertices != expected.Vertices || got.Facets != expected.Facets || got.OnHull != expected.OnHull
            || Math.Abs(got.SumEnergyAboveHullEvPerAtom - expected.SumEnergyAboveHullEvPerAtom) > tolerance)
        {
            throw new InvalidOperationException($"whole-process run disagrees with in-process: {stdout.Trim()} vs {expected.Format()}");
        }
    }

    public static int CountDistinctCompositions(PointSet pts)
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
