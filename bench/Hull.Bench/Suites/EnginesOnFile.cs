using System.Diagnostics;
using System.Globalization;
using Hull.Core.Geometry;

namespace Hull.Bench.Suites;

/// <summary>
/// Both engines forced, and the one <see cref="HullStability"/> chooses, on one points file in-process: the
/// measurement behind an engine choice on a given data set (the engine-choice suite does the same on generated ones).
/// </summary>
public static class EnginesOnFile
{
    public static int Run(string path, int reps)
    {
        var file = Hull.Solve.PointsFileSolver.Read(path);
        var rows = new long[file.Count][];
        for (int i = 0; i < rows.Length; i++) rows[i] = file.Row(i).ToArray();
        var energies = file.EnergiesEvPerAtom;
        var cases = new (string Name, Func<IHullStability> Build)[]
        {
            ("hull (forced)", () => LowerHull.Build(rows, energies)),
            ("programs (forced)", () => LinearProgramHull.Build(rows, energies)),
            ("chosen", () => HullStability.Build(rows, energies)),
        };
        foreach (var (name, build) in cases)
        {
            Summarise(build(), energies.Length, out string summary);
            var walls = new List<double>();
            // CPU over all repetitions: the process's CPU clock is too coarse for one run of a few milliseconds.
            var cpu = Environment.CpuUsage.TotalTime;
            for (int r = 0; r < reps; r++)
            {
                var sw = Stopwatch.StartNew();
                Summarise(build(), energies.Length, out _);
                walls.Add(sw.Elapsed.TotalMilliseconds);
            }
            double cpuMs = (Environment.CpuUsage.TotalTime - cpu).TotalMilliseconds / reps;
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"{name}: {summary}; {reps} runs: median {Median(walls):F1} ms wall, mean {cpuMs:F1} ms CPU"));
        }
        return 0;
    }

    private static void Summarise(IHullStability hull, int count, out string summary)
    {
        double sum = 0;
        int onHull = 0;
        for (int i = 0; i < count; i++)
        {
            double above = hull.EnergyAboveHullEvPerAtom(i);
            sum += above;
            if (above == 0) onHull++;
        }
        string facets = hull is LowerHull lower
            ? string.Create(CultureInfo.InvariantCulture, $" facets={lower.Facets.Count} facets_made={lower.FacetsMade} points_added={lower.PointsAdded}")
            : "";
        summary = string.Create(CultureInfo.InvariantCulture, $"engine={(hull is LowerHull ? "hull" : "programs")} vertices={hull.VertexPoints.Count}{facets} on_hull={onHull} sum_eah={sum:R}");
    }

    private static double Median(List<double> values)
    {
        var sorted = values.Order().ToArray();
        return sorted[sorted.Length / 2];
    }
}
