using System.Diagnostics;
using System.Globalization;
using System.Text;
using Hull.Bench.Data;
using Hull.Bench.Measure;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;

namespace Hull.Bench.Suites;

/// <summary>
/// Stability sampling of a 2e3-entry five-component system (σ = 0.02 eV/atom on every compound, a quarter of them
/// also in a correlation group of σ 0.01): 1,000 samples on 2 cores, target ≤ 5 s, and the scaling with N. Beside
/// it, in the same run: the same samples read from a hull built per sample over the kept entries (the way before
/// the local programs, "built hull"), and the plain way: every entry placed on the sampled-energy axis and the
/// whole hull rebuilt and read per sample (SystemHull.OnAxis, one thread), the job without any reuse.
/// </summary>
public static class UncertaintySuite
{
    public const string Name = "uncertainty";

    private const int TargetSamples = 1_000;
    private const double TargetSeconds = 5;

    public static string Run(BenchOptions options)
    {
        int reps = options.Quick ? 1 : options.InProcessReps ?? 3;
        int entries = options.Scale(UncertaintyBenchSystem.Entries);
        var report = new StringBuilder();
        report.AppendLine($"# Uncertainty: stability sampling of {entries} entries in 5 components\n");
        report.AppendLine($"Command: `{options.CommandLine}`; machine: {MachineInfo.Describe()}; load average at start {FiguresSuite.LoadAverage()}; medians of {reps} repetitions after a 20-sample warm-up; the plain way over 10 samples after one.");
        report.AppendLine("Wall time counts the waits for a core on a shared machine; CPU time (this process, all threads) does not.\n");
        report.AppendLine("| distribution | stable (plain) | points kept per sample (mean) | per-sample hull | samples | threads | wall median [s] | CPU median [s] | CPU per sample [ms] | load (1 min) | plain-way wall per sample [ms] | target (1,000 samples ≤ 5 s on 2 cores) |");
        report.AppendLine("|---|---:|---:|---|---:|---:|---:|---:|---:|---:|---:|---|");
        foreach (EnergyDistribution distribution in new[] { EnergyDistribution.Dense, EnergyDistribution.Sparse })
        {
            var system = UncertaintyBenchSystem.Generate(distribution, entries, options.Seed);
            (PhaseEntry[] rows, SystemHull plain, EnergyUncertainty[] sigma, CorrelationGroup[] groups) = system;
            double plainPerSample = PlainWayMsPerSample(rows, sigma, options.Seed, options.Quick ? 3 : 10);
            // Warm-up (JIT, the plain hull's lazy parts) on a short run, so that every repetition below is timed.
            _ = StabilitySampling.Run(plain, sigma, groups, SamplingPlan.Fixed(20, 1), 2);
            _ = StabilitySampling.Run(plain, sigma, groups, SamplingPlan.Fixed(20, 1), 2, rebuildAll: false, localPrograms: false);
            int stable = plain.StablePhases.Count;
            foreach ((int samples, int threads, bool local) in new[] { (250, 2, false), (250, 2, true), (1000, 2, true), (2000, 2, true), (1000, 1, true), (1000, 2, false) })
            {
                int n = options.Quick ? Math.Max(50, samples / 10) : samples;
                var wall = new List<double>();
                var cpu = new List<double>();
                double kept = 0;
                for (int r = 0; r < reps; r++)
                {
                    TimeSpan cpuStart = Process.GetCurrentProcess().TotalProcessorTime;
                    long start = Stopwatch.GetTimestamp();
                    kept = StabilitySampling.Run(
                        plain, sigma, groups, SamplingPlan.Fixed(n, (ulong)(options.Seed + r)), threads, rebuildAll: false, localPrograms: local).MeanPointsRebuilt;
                    wall.Add(Stopwatch.GetElapsedTime(start).TotalSeconds);
                    cpu.Add((Process.GetCurrentProcess().TotalProcessorTime - cpuStart).TotalSeconds);
                }

                double median = Stats.Median(wall);
                double cpuPerSample = Stats.Median(cpu) * 1000 / n;
                string met = samples == TargetSamples && threads == 2 && local ? (median <= TargetSeconds ? "met" : "NOT met") : "";
                report.AppendLine(string.Create(CultureInfo.InvariantCulture,
                    $"| {distribution.ToString().ToLowerInvariant()} | {stable} | {kept:F0} | {(local ? "local programs" : "built hull")} | {n} | {threads} | {median:F2} | {Stats.Median(cpu):F2} | {cpuPerSample:F2} | {FiguresSuite.LoadAverage().Split(' ')[0]} | {plainPerSample:F1} | {met} |"));
            }
        }

        string text = report.ToString();
        Console.Write(text);
        return text;
    }

    // The job without reuse: every entry on the sampled axis, the whole hull built and every entry read, per sample.
    private static double PlainWayMsPerSample(PhaseEntry[] rows, EnergyUncertainty[] sigma, int seed, int samples)
    {
        FormationEnergySet formation = FormationEnergies.Compute(rows);
        var random = new Random(seed);
        long start = 0;
        for (int s = -1; s < samples; s++)
        {
            if (s == 0) start = Stopwatch.GetTimestamp(); // s = -1 warms up
            var placed = rows.Select((r, i) => new HullAxisEntry(r, formation.FormationEnergiesEvPerAtom[i] + sigma[i].SigmaEvPerAtom * Gaussian(random))).ToArray();
            SystemHull hull = SystemHull.OnAxis(HullAxis.SampledEnergy(Math.Max(0, s)), placed);
            foreach (EntryStability e in hull.Entries) _ = e.IsHullVertex;
        }

        return Stopwatch.GetElapsedTime(start).TotalMilliseconds / samples;
    }

    private static double Gaussian(Random random) =>
        Math.Sqrt(-2 * Math.Log(1 - random.NextDouble())) * Math.Cos(2 * Math.PI * random.NextDouble());
}
