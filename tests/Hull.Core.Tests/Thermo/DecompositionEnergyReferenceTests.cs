using System.Diagnostics;
using System.Text;
using System.Text.Json;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Thermo;

/// <summary>
/// Energies above the hull and decomposition energies on random quaternary data, checked three ways: the fast
/// decomposition-energy path against a full rebuild of the hull, and both against an independent linear program
/// (SciPy's linprog with HiGHS, Debian's python3-scipy): the hull energy at x over a set of points is
/// min sum_i w_i e_i subject to sum_i w_i x_i = x, w >= 0 (common practice: the lower hull as an LP).
/// </summary>
public sealed class DecompositionEnergyReferenceTests
{
    // HiGHS solves to a primal/dual feasibility of 1e-7 by default; energies here are of order 1 eV/atom.
    private const double LinearProgramToleranceEvPerAtom = 1e-6;

    [Fact]
    public void Fast_path_equals_full_rebuild_and_linear_program()
    {
        PhaseEntry[] entries = RandomQuaternary(seed: 5, compounds: 160);
        SystemHull hull = SystemHull.OverElements(entries);
        string[] components = hull.Components.ToArray();

        EntryStability[] onHull = hull.Entries.Where(e => e.DecompositionEnergyEvPerAtom is not null).ToArray();
        Assert.True(onHull.Length >= 8, $"only {onHull.Length} stable compounds; the check needs a richer hull");
        foreach (EntryStability entry in onHull)
        {
            Assert.Equal(hull.DecompositionEnergyByFullRebuild(entry.Id)!.Value, entry.DecompositionEnergyEvPerAtom!.Value, 1e-12);
        }

        // LP queries: each entry against all points (energy above hull) and each on-hull compound against the points
        // of other reduced compositions (decomposition energy). The pure elements are entries here, so all points are.
        double[][] fractions = entries.Select(e => components.Select(c => e.Composition.AtomicFraction(c)).ToArray()).ToArray();
        double[] energies = hull.Entries.Select(e => e.AxisEnergyEvPerAtom).ToArray();
        var queries = new List<(double[] X, int[] Excluded)>();
        foreach (EntryStability entry in hull.Entries)
        {
            queries.Add((fractions[entry.RowIndex], []));
        }

        foreach (EntryStability entry in onHull)
        {
            Composition reduced = entry.Composition.Reduced;
            int[] excluded = Enumerable.Range(0, entries.Length).Where(i => entries[i].Composition.Reduced == reduced).ToArray();
            queries.Add((fractions[entry.RowIndex], excluded));
        }

        double[] lp = SolveWithScipy(fractions, energies, queries);
        for (int i = 0; i < hull.Entries.Count; i++)
        {
            EntryStability entry = hull.Entries[i];
            Assert.Equal(Math.Max(0, entry.AxisEnergyEvPerAtom - lp[i]), entry.EnergyAboveHullEvPerAtom, LinearProgramToleranceEvPerAtom);
        }

        for (int k = 0; k < onHull.Length; k++)
        {
            double expected = Math.Min(0, onHull[k].AxisEnergyEvPerAtom - lp[hull.Entries.Count + k]);
            Assert.Equal(expected, onHull[k].DecompositionEnergyEvPerAtom!.Value, LinearProgramToleranceEvPerAtom);
        }
    }

    /// <summary>Li–Mn–Fe–O compounds with small integer amounts and random formation energies (a deterministic seed).</summary>
    internal static PhaseEntry[] RandomQuaternary(int seed, int compounds)
    {
        string[] elements = ["Fe", "Li", "Mn", "O"];
        var random = new Random(seed);
        var entries = elements.Select(e => new PhaseEntry(e, Composition.Parse(e), 0.0, EnergyBasis.FormationPerAtom)).ToList();
        while (entries.Count < elements.Length + compounds)
        {
            var amounts = elements.Select(e => (e, new Rational(random.Next(0, 4), 1))).Where(a => !a.Item2.IsZero).ToArray();
            if (amounts.Length < 2)
            {
                continue;
            }

            Composition composition = Composition.FromAmounts(amounts);
            // Some reduced compositions repeat on purpose (polymorphs); energies deepen with more elements.
            double energy = -0.4 * amounts.Length - 0.8 * random.NextDouble();
            entries.Add(new PhaseEntry($"c{entries.Count}", composition, energy, EnergyBasis.FormationPerAtom));
        }

        return entries.ToArray();
    }

    private static double[] SolveWithScipy(double[][] fractions, double[] energies, List<(double[] X, int[] Excluded)> queries)
    {
        const string script = """
            import json, sys
            import numpy as np
            from scipy.optimize import linprog
            data = json.load(sys.stdin)
            F = np.array(data["fractions"]).T
            e = np.array(data["energies"])
            out = []
            for q in data["queries"]:
                keep = np.ones(len(e), dtype=bool)
                keep[q["excluded"]] = False
                r = linprog(e[keep], A_eq=F[:, keep], b_eq=np.array(q["x"]), bounds=(0, None), method="highs")
                if r.status != 0:
                    raise SystemExit("linprog failed: " + r.message)
                out.append(r.fun)
            print(json.dumps(out))
            """;
        string input = JsonSerializer.Serialize(new
        {
            fractions,
            energies,
            queries = queries.Select(q => new { x = q.X, excluded = q.Excluded }),
        });
        string scriptPath = Path.Combine(Path.GetTempPath(), $"hull-lp-{Guid.NewGuid():N}.py");
        File.WriteAllText(scriptPath, script);
        try
        {
            // Debian's own interpreter carries python3-scipy; a missing tool fails the test (never skips).
            var start = new ProcessStartInfo("/usr/bin/python3", [scriptPath])
            {
                RedirectStandardInput = true,
                RedirectStandardOutput = true,
                RedirectStandardError = true,
                StandardOutputEncoding = Encoding.UTF8,
            };
            using Process process = Process.Start(start) ?? throw new InvalidOperationException("could not start /usr/bin/python3");
            process.StandardInput.Write(input);
            process.StandardInput.Close();
            string output = process.StandardOutput.ReadToEnd();
            string error = process.StandardError.ReadToEnd();
            process.WaitForExit();
            Assert.True(process.ExitCode == 0, $"/usr/bin/python3 with scipy failed: {error}");
            return JsonSerializer.Deserialize<double[]>(output, new JsonSerializerOptions { NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals })!;
        }
        finally
        {
            File.Delete(scriptPath);
        }
    }
}
