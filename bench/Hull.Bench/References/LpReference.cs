using System.Diagnostics;
using System.Globalization;
using Hull.Bench.Data;

namespace Hull.Bench.References;

/// <summary>
/// Energy above hull of chosen points by linear programming (SciPy HiGHS under Debian's /usr/bin/python3, one
/// process for all queries). Not timed against ours: it is the exactness check.
/// </summary>
public static class LpReference
{
    /// <summary>Debian's system Python, which has python3-scipy (the python3 first on PATH does not).</summary>
    public const string Python = "/usr/bin/python3";

    public static string ScriptPath => Path.Combine(AppContext.BaseDirectory, "Scripts", "lp_energy_above_hull.py");

    /// <summary>Returns the LP energy above hull (eV/atom) for each query index; throws if any LP fails.</summary>
    public static double[] EnergyAboveHullEvPerAtom(PointSet points, IReadOnlyList<int> queries, string workDirectory, out double seconds)
    {
        string pointsFile = Path.Combine(workDirectory, "lp-points.txt");
        string queryFile = Path.Combine(workDirectory, "lp-queries.txt");
        string outFile = Path.Combine(workDirectory, "lp-out.txt");
        using (var w = new StreamWriter(pointsFile))
        {
            for (int i = 0; i < points.Count; i++)
            {
                for (int k = 0; k < points.Components - 1; k++)
                {
                    w.Write(points.Fraction(i, k).ToString("R", CultureInfo.InvariantCulture));
                    w.Write(' ');
                }
                w.WriteLine(points.EnergiesEvPerAtom[i].ToString("R", CultureInfo.InvariantCulture));
            }
        }
        File.WriteAllLines(queryFile, queries.Select(q => q.ToString(CultureInfo.InvariantCulture)));
        var psi = new ProcessStartInfo(Python) { RedirectStandardError = true, RedirectStandardOutput = true, UseShellExecute = false };
        psi.ArgumentList.Add(ScriptPath);
        psi.ArgumentList.Add(pointsFile);
        psi.ArgumentList.Add(queryFile);
        psi.ArgumentList.Add(outFile);
        var sw = Stopwatch.StartNew();
        using var p = Process.Start(psi) ?? throw new InvalidOperationException($"could not start {Python}");
        var err = p.StandardError.ReadToEndAsync();
        var outText = p.StandardOutput.ReadToEndAsync();
        p.WaitForExit();
        seconds = sw.Elapsed.TotalSeconds;
        if (p.ExitCode != 0) throw new InvalidOperationException($"LP reference failed (exit {p.ExitCode}): {err.Result}{outText.Result}");
        var byIndex = new Dictionary<int, double>();
        int lineNo = 0;
        foreach (var line in File.ReadLines(outFile))
        {
            lineNo++;
            var f = line.Split(' ');
            if (f.Length != 3 || f[2] != "0") throw new InvalidOperationException($"LP reference line {lineNo}: solver did not succeed: '{line}'.");
            byIndex[int.Parse(f[0], CultureInfo.InvariantCulture)] = double.Parse(f[1], CultureInfo.InvariantCulture);
        }
        foreach (var file in new[] { pointsFile, queryFile, outFile }) File.Delete(file);
        return queries.Select(q => byIndex[q]).ToArray();
    }
}
