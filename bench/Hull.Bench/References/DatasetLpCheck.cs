using System.Diagnostics;
using System.Globalization;
using Hull.Bench.Data;

namespace Hull.Bench.References;

/// <summary>
/// LP check of a dataset analysis: for sampled entries, the energy above hull within the entry's own chemical system
/// (every entry whose elements are a subset of its elements), by SciPy HiGHS under /usr/bin/python3. Formation
/// energies per atom are formed here independently of the thermodynamics layer: total per atom minus the atom
/// fractions times each element's pure-entry total energy per atom.
/// </summary>
public static class DatasetLpCheck
{
    public static string ScriptPath => Path.Combine(AppContext.BaseDirectory, "Scripts", "lp_dataset_check.py");

    /// <summary>LP energy above hull (eV/atom) of each sampled row.</summary>
    public static double[] EnergyAboveHullEvPerAtom(IReadOnlyList<DatasetRow> rows, IReadOnlyList<int> sample, string workDirectory, out double seconds)
    {
        var reference = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var r in rows)
        {
            if (r.Elements.Length != 1) continue;
            double perAtom = r.TotalEnergyEvPerFormulaUnit / r.Amounts[0];
            if (!reference.TryGetValue(r.Elements[0], out double best) || perAtom < best) reference[r.Elements[0]] = perAtom;
        }
        var bit = reference.Keys.Order(StringComparer.Ordinal).Select((e, i) => (e, i)).ToDictionary(p => p.e, p => p.i);
        var masks = rows.Select(r => r.Elements.Aggregate(UInt128.Zero, (m, e) => m | (UInt128.One << bit[e]))).ToArray();
        double Formation(DatasetRow r)
        {
            long atoms = r.Amounts.Sum();
            double f = r.TotalEnergyEvPerFormulaUnit / atoms;
            for (int j = 0; j < r.Elements.Length; j++) f -= (double)r.Amounts[j] / atoms * reference[r.Elements[j]];
            return f;
        }

        string blocks = Path.Combine(workDirectory, "dataset-lp-blocks.txt");
        string outFile = Path.Combine(workDirectory, "dataset-lp-out.txt");
        using (var w = new StreamWriter(blocks))
        {
            foreach (int q in sample)
            {
                var system = rows[q].Elements;
                var members = Enumerable.Range(0, rows.Count).Where(i => (masks[i] & masks[q]) == masks[i]).ToArray();
                w.WriteLine($"{q} {system.Length} {members.Length}");
                WritePoint(w, rows[q], system, Formation(rows[q]));
                foreach (int i in members) WritePoint(w, rows[i], system, Formation(rows[i]));
            }
        }
        var psi = new ProcessStartInfo(LpReference.Python) { RedirectStandardError = true, RedirectStandardOutput = true, UseShellExecute = false };
        psi.ArgumentList.Add(ScriptPath);
        psi.ArgumentList.Add(blocks);
        psi.ArgumentList.Add(outFile);
        var sw = Stopwatch.StartNew();
        using var p = Process.Start(psi) ?? throw new InvalidOperationException($"could not start {LpReference.Python}");
        var err = p.StandardError.ReadToEndAsync();
        var stdout = p.StandardOutput.ReadToEndAsync();
        p.WaitForExit();
        seconds = sw.Elapsed.TotalSeconds;
        if (p.ExitCode != 0) throw new InvalidOperationException($"dataset LP check failed (exit {p.ExitCode}): {err.Result}{stdout.Result}");
        var byRow = new Dictionary<int, double>();
        foreach (var line in File.ReadLines(outFile))
        {
            var f = line.Split(' ');
            if (f.Length != 3 || f[2] != "0") throw new InvalidOperationException($"dataset LP check: solver did not succeed: '{line}'.");
            byRow[int.Parse(f[0], CultureInfo.InvariantCulture)] = double.Parse(f[1], CultureInfo.InvariantCulture);
        }
        File.Delete(blocks);
        File.Delete(outFile);
        return sample.Select(q => byRow[q]).ToArray();
    }

    /// <summary>A row's fractions over the first k-1 elements of the query's system, then its formation energy.</summary>
    private static void WritePoint(StreamWriter w, DatasetRow r, string[] system, double formation)
    {
        long atoms = r.Amounts.Sum();
        for (int k = 0; k < system.Length - 1; k++)
        {
            int j = Array.IndexOf(r.Elements, system[k]);
            double x = j < 0 ? 0.0 : (double)r.Amounts[j] / atoms;
            w.Write(x.ToString("R", CultureInfo.InvariantCulture));
            w.Write(' ');
        }
        w.WriteLine(formation.ToString("R", CultureInfo.InvariantCulture));
    }
}
