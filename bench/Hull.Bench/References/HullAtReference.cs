using System.Diagnostics;
using System.Globalization;

namespace Hull.Bench.References;

/// <summary>
/// Hull energy and chemical potentials at query compositions by linear programming (script lp_hull_at.py, SciPy
/// HiGHS under Debian's /usr/bin/python3, one process for all queries): the electrochemistry suite's reference.
/// </summary>
public static class HullAtReference
{
    public sealed record Answer(double[] HullEnergyEvPerAtom, double[][] ChemicalPotentialsEvPerAtom, double ProcessMilliseconds, double SolveMilliseconds);

    public static Answer Solve(IReadOnlyList<double[]> fractions, IReadOnlyList<double> energiesEvPerAtom, IReadOnlyList<double[]> queries, string work)
    {
        Directory.CreateDirectory(work);
        string points = Path.Combine(work, "hull-at-points.txt"), queryFile = Path.Combine(work, "hull-at-queries.txt"), output = Path.Combine(work, "hull-at-out.txt");
        File.WriteAllLines(points, fractions.Select((f, i) => string.Join(' ', f.Append(energiesEvPerAtom[i]).Select(v => v.ToString("R", CultureInfo.InvariantCulture)))));
        File.WriteAllLines(queryFile, queries.Select(q => string.Join(' ', q.Select(v => v.ToString("R", CultureInfo.InvariantCulture)))));
        var psi = new ProcessStartInfo(LpReference.Python) { RedirectStandardError = true, UseShellExecute = false };
        psi.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "Scripts", "lp_hull_at.py"));
        psi.ArgumentList.Add(points);
        psi.ArgumentList.Add(queryFile);
        psi.ArgumentList.Add(output);
        var clock = Stopwatch.StartNew();
        using Process p = Process.Start(psi) ?? throw new InvalidOperationException($"could not start {LpReference.Python}");
        string error = p.StandardError.ReadToEnd();
        p.WaitForExit();
        double processMs = clock.Elapsed.TotalMilliseconds;
        if (p.ExitCode != 0) throw new InvalidOperationException($"lp_hull_at.py failed (exit {p.ExitCode}): {error}");
        string[] lines = File.ReadAllLines(output);
        var energies = new double[queries.Count];
        var potentials = new double[queries.Count][];
        for (int q = 0; q < queries.Count; q++)
        {
            double[] v = lines[q].Split(' ').Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray();
            if (v[^1] != 0) throw new InvalidOperationException($"lp_hull_at.py: query {q} did not solve (status {v[^1]}).");
            energies[q] = v[0];
            potentials[q] = v[1..^1];
        }

        double solveMs = double.Parse(lines[queries.Count].Split(' ')[1], CultureInfo.InvariantCulture) * 1000;
        return new Answer(energies, potentials, processMs, solveMs);
    }
}
