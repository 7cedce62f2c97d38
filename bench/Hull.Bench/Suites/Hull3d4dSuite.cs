using Hull.Bench.Data;

namespace Hull.Bench.Suites;

/// <summary>
/// 1e5 entries in 3- and 4-component systems, both lattices, both energy distributions: ours (in-process and whole
/// process) against qconvex's full hull (whole process). Target: ours no slower than qconvex.
/// </summary>
public static class Hull3d4dSuite
{
    public const string Name = "hull3d4d";
    public const int Entries = 100_000;

    public static string Run(BenchOptions o, string workDirectory, string repoRoot)
    {
        int inReps = o.Quick ? 1 : o.InProcessReps ?? 11;
        int procReps = o.Quick ? 1 : o.ProcessReps ?? 7;
        int lp = o.LpSample ?? 10;
        var results = new List<HullCaseResult>();
        string solver = NativeSolver.Publish(repoRoot);
        int startupReps = o.Quick ? 1 : 7;
        double startupMs = HullCaseRunner.MeasureStartupMs(solver, workDirectory, startupReps);
        int caseNo = 0;
        foreach (int n in new[] { 3, 4 })
        {
            foreach (int maxAtoms in new[] { LatticeGenerator.SmallCellMaxAtoms, LatticeGenerator.LargeCellMaxAtoms })
            {
                foreach (var dist in new[] { EnergyDistribution.Dense, EnergyDistribution.Sparse })
                {
                    int seed = o.Seed + 1000 * n + 10 * maxAtoms + (int)dist;
                    var pts = LatticeGenerator.Generate(n, o.Scale(Entries), maxAtoms, dist, seed);
                    var plan = new HullCasePlan($"{n}c ≤{maxAtoms} atoms {dist.ToString().ToLowerInvariant()}", pts,
                        inReps, procReps, procReps, TimeSpan.FromMinutes(10), lp);
                    results.Add(HullCaseRunner.Run(plan, workDirectory, seed, solver));
                    caseNo++;
                }
            }
        }
        var text = MarkdownReport.Header(Name, o.CommandLine)
            + $"\nOurs in-process: one untimed warm-up run, then the median of {inReps} timed runs of HullStability.Build + EnergyAboveHull for every entry (the engine the library picks, named in the engine column: the incremental hull, or one linear program per composition for ≤ 4096 compositions or ≥ 6 components; in-process times exclude parsing; both engines use both cores). "
            + $"Whole-process times (ours: `Hull.Solve IN`, bench/Hull.Solve published with Native AOT from the same sources the in-process runs use; qconvex: `{References.QconvexReference.CommandLine("IN", "OUT")}`) include start-up and parsing the same points from a text file; medians of {procReps} runs, interleaved ours/qconvex. "
            + $"qconvex computes the full convex hull (upper and lower) of the lifted points (n-1 fractions + energy), single-threaded. "
            + $"LP column: a seeded random sample of {lp} entries per case checked against SciPy HiGHS (each LP spans all 1e5 points).\n\n"
            + $"Fixed cost of our whole process (process start-up, trivial hull, exit; median of {startupReps} runs on a 3-point file): {startupMs:F0} ms.\n\n"
            + MarkdownReport.HullTable(results)
            + "\nTarget (ours no slower than qconvex's full hull, i.e. ratio ≥ 1):\n"
            + string.Concat(results.Select(r => string.Create(System.Globalization.CultureInfo.InvariantCulture,
                $"- {r.Name}: qconvex / ours whole-process = {r.RatioToProcess:F2}× ({(r.RatioToProcess >= 1 ? "met" : "MISSED")}), qconvex / ours in-process = {r.RatioToInProcess:F2}× ({(r.RatioToInProcess >= 1 ? "met" : "MISSED")}); LP max |diff| {r.LpMaxAbsDiff:E1} eV/atom over {r.LpChecked} entries{string.Concat(r.Notes.Select(n => "; " + n))}\n")));
        return text;
    }
}
