using Hull.Bench;
using Hull.Bench.Measure;
using Hull.Bench.Suites;

// Benchmarks of the hull engine beside outside references. Usage:
//   dotnet run -c Release --project bench/Hull.Bench -- <hull3d4d|hull6d8d|dataset60> [options]
//   Hull.Bench solve-file POINTS   (Hull.Solve's job run by this JIT-compiled program, for comparison by hand;
//                                   the suites time the Native AOT executable of bench/Hull.Solve instead)
if (args.Length == 0)
{
    Console.Error.WriteLine("usage: Hull.Bench <hull3d4d|hull6d8d|families|engine-choice|dataset60|figures|windows|defect-ewald|electrochemistry|fermi-sweep|uncertainty|uncertainty-threads> [--reps N] [--proc-reps N] [--qconvex-cap SECONDS] [--lp-sample N] [--seed N] [--quick]");
    Console.Error.WriteLine("       Hull.Bench solve-file POINTS");
    Console.Error.WriteLine("       Hull.Bench engines-file POINTS [REPS]");
    Console.Error.WriteLine("       Hull.Bench uncertainty-once dense|sparse [THREADS [SAMPLES [SEED]]]");
    return 2;
}
if (args[0] == "solve-file")
{
    if (args.Length != 2) { Console.Error.WriteLine("usage: Hull.Bench solve-file POINTS"); return 2; }
    Console.WriteLine(Hull.Solve.PointsFileSolver.SolveFile(args[1]).Summary.Format());
    return 0;
}

if (args[0] == "engines-file")
{
    // engines-file POINTS [REPS]: both engines forced and the chosen one on one points file, in-process (one warm-up,
    // then REPS runs: median wall, mean CPU of this process), for checking the engine choice on a file by hand.
    if (args.Length is < 2 or > 3) { Console.Error.WriteLine("usage: Hull.Bench engines-file POINTS [REPS]"); return 2; }
    return EnginesOnFile.Run(args[1], args.Length > 2 ? int.Parse(args[2], System.Globalization.CultureInfo.InvariantCulture) : 11);
}

if (args[0] == "write-points")
{
    // write-points COMPONENTS ENTRIES MAX_ATOMS dense|sparse|pair|faceted SEED PATH: one generated case, for profiling
    // by hand (pair and faceted ignore MAX_ATOMS; the suites' families use 12).
    if (args.Length != 7) { Console.Error.WriteLine("usage: Hull.Bench write-points COMPONENTS ENTRIES MAX_ATOMS dense|sparse|pair|faceted SEED PATH"); return 2; }
    var family = Enum.Parse<Hull.Bench.Data.PointFamily>(args[4], ignoreCase: true);
    var pts = family is Hull.Bench.Data.PointFamily.Pair or Hull.Bench.Data.PointFamily.Faceted
        ? Hull.Bench.Data.PointFamilies.Generate(family, int.Parse(args[1]), int.Parse(args[2]), int.Parse(args[5]))
        : Hull.Bench.Data.LatticeGenerator.Generate(int.Parse(args[1]), int.Parse(args[2]), int.Parse(args[3]),
            family == Hull.Bench.Data.PointFamily.Dense ? Hull.Bench.Data.EnergyDistribution.Dense : Hull.Bench.Data.EnergyDistribution.Sparse, int.Parse(args[5]));
    pts.WriteAmountsFile(args[6]);
    pts.WriteQhullFile(args[6] + ".qhull");
    return 0;
}

if (args[0] == "uncertainty-once")
{
    // uncertainty-once dense|sparse [THREADS [SAMPLES [SEED]]]: one timed sampling run, for comparing builds in turn.
    return UncertaintyThreadsSuite.RunOnce(args[1..]);
}

if (args[0] == "dataset-once")
{
    // dataset-once dense|sparse [ENTRIES [REPS]]: generate and analyse the dataset60 dataset (REPS times, default
    // once), for profiling by hand.
    return Dataset60Suite.RunOnce(Enum.Parse<Hull.Bench.Data.EnergyDistribution>(args[1], ignoreCase: true),
        args.Length > 2 ? int.Parse(args[2]) : Dataset60Suite.Entries, args.Length > 3 ? int.Parse(args[3]) : 1);
}

string suite = args[0];
BenchOptions options;
try
{
    options = BenchOptions.Parse(suite, args[1..]);
}
catch (ArgumentException e)
{
    Console.Error.WriteLine(e.Message);
    return 2;
}

string repoRoot = FindRepoRoot();
string work = Path.Combine(Path.GetTempPath(), $"hull-bench-{Environment.ProcessId}");
Directory.CreateDirectory(work);
Console.WriteLine($"machine: {MachineInfo.Describe()}");
Console.WriteLine($"suite {suite}{(options.Quick ? " (QUICK smoke run: entries / 10, one repetition; not a result)" : "")}");
var total = System.Diagnostics.Stopwatch.StartNew();
try
{
    string report = suite switch
    {
        Hull3d4dSuite.Name => Hull3d4dSuite.Run(options, work, repoRoot),
        Hull6d8dSuite.Name => Hull6d8dSuite.Run(options, work, repoRoot),
        Dataset60Suite.Name => Dataset60Suite.Run(options, work),
        FiguresSuite.Name => FiguresSuite.Run(options),
        WindowsSuite.Name => WindowsSuite.Run(options, work, repoRoot),
        DefectEwaldSuite.Name => DefectEwaldSuite.Run(options, repoRoot),
        ElectrochemistrySuite.Name => ElectrochemistrySuite.Run(options, work),
        EngineChoiceSuite.Name => EngineChoiceSuite.Run(options),
        FamiliesSuite.Name => FamiliesSuite.Run(options, work, repoRoot),
        FermiSweepSuite.Name => FermiSweepSuite.Run(options, repoRoot),
        UncertaintySuite.Name => UncertaintySuite.Run(options),
        UncertaintyThreadsSuite.Name => UncertaintyThreadsSuite.Run(options),
        _ => throw new ArgumentException($"unknown suite '{suite}' (hull3d4d, hull6d8d, families, engine-choice, dataset60, figures, windows, defect-ewald, electrochemistry, fermi-sweep)"),
    };
    report += $"\nSuite wall time: {total.Elapsed.TotalMinutes:F1} min.\n";
    MarkdownReport.Write(repoRoot, options.Quick ? suite + "-quick" : suite, report);
    return 0;
}
catch (ArgumentException e)
{
    Console.Error.WriteLine(e.Message);
    return 2;
}
catch (InvalidOperationException e)
{
    // A reference tool or our own executable could not be built or run, or disagreed: the message says which.
    Console.Error.WriteLine($"error: {e.Message}");
    return 1;
}
finally
{
    Directory.Delete(work, recursive: true);
}

static string FindRepoRoot()
{
    for (var d = new DirectoryInfo(Directory.GetCurrentDirectory()); d is not null; d = d.Parent)
    {
        if (File.Exists(Path.Combine(d.FullName, "Hull.sln"))) return d.FullName;
    }
    throw new InvalidOperationException("run from inside the repository (Hull.sln not found above the current directory)");
}
