using System.Diagnostics;
using System.Globalization;
using System.Text;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Core.Thermo.Uncertainty;

namespace Hull.Bench.Suites;

/// <summary>
/// Stability sampling on one thread and on two: 1,000 samples of the 2e3-entry five-component system
/// (<see cref="UncertaintyBenchSystem"/>), dense and sparse energies, wall and CPU time, samples per second,
/// allocation per sample, and whether both thread counts gave the same answer to the last bit. The repetitions
/// alternate one and two threads, so that a change of the machine's load falls on both alike.
/// </summary>
public static class UncertaintyThreadsSuite
{
    public const string Name = "uncertainty-threads";
    private const int Samples = 1_000;

    public static string Run(BenchOptions options)
    {
        int reps = options.Quick ? 1 : options.InProcessReps ?? 5;
        int entries = options.Scale(UncertaintyBenchSystem.Entries);
        int samples = options.Quick ? 100 : Samples;
        var report = new StringBuilder();
        report.AppendLine($"# Uncertainty on one and two threads: {samples} samples of {entries} entries in 5 components\n");
        report.AppendLine($"Command: `{options.CommandLine}`; machine: {MachineInfo.Describe()}; load average at start {FiguresSuite.LoadAverage()}; medians of {reps} repetitions (one thread and two in turn) after a 20-sample warm-up.");
        report.AppendLine("Wall time counts the waits for a core on a shared machine; CPU time (this process, all threads) does not. Allocation: bytes allocated by all threads during the run, per sample.\n");
        report.AppendLine("| family | threads | wall median [s] | CPU median [s] | samples/s (wall) | CPU per sample [ms] | allocated per sample [KB] | CPU 2 threads / 1 thread | wall 1 thread / 2 threads | answers equal | load (1 min) |");
        report.AppendLine("|---|---:|---:|---:|---:|---:|---:|---:|---:|---|---:|");
        foreach (EnergyDistribution distribution in new[] { EnergyDistribution.Dense, EnergyDistribution.Sparse })
        {
            var system = UncertaintyBenchSystem.Generate(distribution, entries, options.Seed);
            _ = Once(system, 20, 2, 1);
            var runs = new Dictionary<int, List<OnceRun>> { [1] = [], [2] = [] };
            for (int r = 0; r < reps; r++)
            {
                foreach (int threads in new[] { 1, 2 })
                {
                    runs[threads].Add(Once(system, samples, threads, (ulong)options.Seed));
                }
            }

            bool equal = runs.Values.SelectMany(l => l).Select(o => o.Fingerprint).Distinct().Count() == 1;
            double cpu1 = Stats.Median(runs[1].Select(o => o.CpuSeconds).ToList());
            double cpu2 = Stats.Median(runs[2].Select(o => o.CpuSeconds).ToList());
            double wall1 = Stats.Median(runs[1].Select(o => o.WallSeconds).ToList());
            double wall2 = Stats.Median(runs[2].Select(o => o.WallSeconds).ToList());
            foreach (int threads in new[] { 1, 2 })
            {
                double wall = threads == 1 ? wall1 : wall2;
                double cpu = threads == 1 ? cpu1 : cpu2;
                double allocated = Stats.Median(runs[threads].Select(o => o.AllocatedBytesPerSample).ToList());
                report.AppendLine(string.Create(CultureInfo.InvariantCulture,
                    $"| {distribution.ToString().ToLowerInvariant()} | {threads} | {wall:F2} | {cpu:F2} | {samples / wall:F0} | {cpu * 1000 / samples:F2} | {allocated / 1024:F0} | {(threads == 2 ? (cpu2 / cpu1).ToString("F2", CultureInfo.InvariantCulture) : "")} | {(threads == 2 ? (wall1 / wall2).ToString("F2", CultureInfo.InvariantCulture) : "")} | {(equal ? "yes" : "NO")} | {FiguresSuite.LoadAverage().Split(' ')[0]} |"));
            }
        }

        string text = report.ToString();
        Console.Write(text);
        return text;
    }

    /// <summary>
    /// uncertainty-once dense|sparse [THREADS [SAMPLES [SEED]]]: one timed run after a 20-sample warm-up, printed as
    /// one line (wall, CPU, allocation per sample, the answer's fingerprint), for comparing two builds in turn.
    /// </summary>
    public static int RunOnce(string[] args)
    {
        if (args.Length is < 1 or > 4)
        {
            Console.Error.WriteLine("usage: Hull.Bench uncertainty-once dense|sparse [THREADS [SAMPLES [SEED]]]");
            return 2;
        }

        var distribution = Enum.Parse<EnergyDistribution>(args[0], ignoreCase: true);
        int threads = args.Length > 1 ? int.Parse(args[1], CultureInfo.InvariantCulture) : 2;
        int samples = args.Length > 2 ? int.Parse(args[2], CultureInfo.InvariantCulture) : Samples;
        int seed = args.Length > 3 ? int.Parse(args[3], CultureInfo.InvariantCulture) : new BenchOptions().Seed;
        var system = UncertaintyBenchSystem.Generate(distribution, UncertaintyBenchSystem.Entries, seed);
        _ = Once(system, 20, threads, 1);
        OnceRun run = Once(system, samples, threads, (ulong)seed);
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"{args[0]} threads={threads} samples={samples} wall_s={run.WallSeconds:F3} cpu_s={run.CpuSeconds:F3} samples_per_s={samples / run.WallSeconds:F0} alloc_kb_per_sample={run.AllocatedBytesPerSample / 1024:F1} answer={run.Fingerprint} load={FiguresSuite.LoadAverage()}"));
        return 0;
    }

    private static OnceRun Once(UncertaintyBenchSystem system, int samples, int threads, ulong seed)
    {
        long allocatedStart = GC.GetTotalAllocatedBytes(precise: true);
        TimeSpan cpuStart = Process.GetCurrentProcess().TotalProcessorTime;
        long start = Stopwatch.GetTimestamp();
        StabilitySamplingResult result = StabilitySampling.Run(system.Plain, system.Sigma, system.Groups, SamplingPlan.Fixed(samples, seed), threads);
        double wall = Stopwatch.GetElapsedTime(start).TotalSeconds;
        double cpu = (Process.GetCurrentProcess().TotalProcessorTime - cpuStart).TotalSeconds;
        double allocated = (double)(GC.GetTotalAllocatedBytes(precise: true) - allocatedStart) / samples;
        return new OnceRun(wall, cpu, allocated, UncertaintyBenchSystem.Fingerprint(result));
    }

    private sealed record OnceRun(double WallSeconds, double CpuSeconds, double AllocatedBytesPerSample, string Fingerprint);
}
