using System.Diagnostics;
using System.Text.Json;
using System.Text.Json.Nodes;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// End to end against an outside reference: entries imported over gRPC, energies above hull and hull energies read
/// back over gRPC, compared with the lower hull computed as a linear program by SciPy's HiGHS (scipy.optimize.linprog
/// run by Debian's /usr/bin/python3; the script is the engine tests' References/hull_lp.py).
/// </summary>
public sealed class LinearProgramReferenceTests
{
    private const string Python = "/usr/bin/python3";

    /// <summary>
    /// Agreement required, eV/atom: the LP is solved to 1e-10 feasibility on energies of order 1 eV/atom, and the
    /// service rounds nothing, so 1e-7 is far above both errors and far below any physically meaningful difference.
    /// </summary>
    private const double ToleranceEvPerAtom = 1e-7;

    private static readonly string[] Elements = ["Co", "Li", "Ni", "O"];

    [Fact]
    public async Task Energy_above_hull_and_hull_energy_match_a_scipy_linear_program()
    {
        var random = new Random(9001);
        var entries = Elements.Select(e => Data.Formation($"{e}-ref", e, 0.0)).ToList();
        var amounts = Elements.Select((_, k) => Elements.Select((_, j) => j == k ? 1L : 0L).ToArray()).ToList();
        for (int i = 0; i < 80; i++)
        {
            long[] a = Elements.Select(_ => (long)random.Next(0, 5)).ToArray();
            if (a.Count(x => x > 0) < 2) a[3] += 1 + random.Next(3);
            if (a.Count(x => x > 0) < 2) a[1] += 1;
            string formula = string.Concat(Elements.Select((e, k) => a[k] == 0 ? string.Empty : $"{e}{a[k]}"));
            entries.Add(Data.Formation($"p{i:00}", formula, -2.0 * random.NextDouble()));
            amounts.Add(a);
        }

        await using var s = await RunningServer.StartAsync();
        await Data.CreateWithAsync(s.Clients, "lp", [.. entries]);
        var results = new Dictionary<string, EntryStability>();
        using (var call = s.Clients.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = "lp" }, s.Clients.Call()))
        {
            await foreach (var page in call.ResponseStream.ReadAllAsync()) foreach (var r in page.Results) results[r.EntryId] = r;
        }

        string[] probes = ["LiCoO2", "Li2NiO2", "CoNiO3", "LiCoNiO4", "Li3Co2Ni2O9", "Li0.5Ni0.5O"];
        var hullEnergies = await s.Clients.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "lp", Formulas = { probes } }, s.Clients.Call());

        var queries = amounts.Select(Fractions).ToList();
        queries.AddRange(probes.Select(p => Fractions(ProbeAmounts(p))));
        double[] lp = RunLinearProgram(amounts, entries.Select(e => e.EnergyEv).ToArray(), queries);

        for (int i = 0; i < entries.Count; i++)
        {
            double expectedAbove = Math.Max(0.0, entries[i].EnergyEv - lp[i]);
            Assert.True(Math.Abs(results[entries[i].Id].EnergyAboveHullEvPerAtom - expectedAbove) <= ToleranceEvPerAtom,
                $"{entries[i].Id}: service {results[entries[i].Id].EnergyAboveHullEvPerAtom}, LP {expectedAbove}");
        }

        for (int p = 0; p < probes.Length; p++)
        {
            Assert.Equal(lp[entries.Count + p], hullEnergies.Results[p].HullEnergyEvPerAtom, ToleranceEvPerAtom);
        }

        Assert.Contains(results.Values, r => r.EnergyAboveHullEvPerAtom > 0.05);
        Assert.Contains(results.Values, r => r.IsHullVertex && !r.EntryId.EndsWith("-ref", StringComparison.Ordinal));
    }

    private static double[] Fractions(long[] amounts)
    {
        double total = amounts.Sum();
        return amounts.Select(a => a / total).ToArray();
    }

    private static long[] ProbeAmounts(string formula) => formula switch
    {
        "LiCoO2" => [1, 1, 0, 2],
        "Li2NiO2" => [0, 2, 1, 2],
        "CoNiO3" => [1, 0, 1, 3],
        "LiCoNiO4" => [1, 1, 1, 4],
        "Li3Co2Ni2O9" => [2, 3, 2, 9],
        "Li0.5Ni0.5O" => [0, 1, 1, 2],
        _ => throw new ArgumentException(formula),
    };

    /// <summary>Hull energy at each query composition from hull_lp.py (fails, never skips, when the tool is missing).</summary>
    internal static double[] RunLinearProgram(List<long[]> amounts, double[] energies, List<double[]> queries)
    {
        Assert.True(File.Exists(Python), $"{Python} (Debian python3 with python3-scipy) is required; scripts/test.sh installs it");
        string script = Path.Combine(AppContext.BaseDirectory, "References", "hull_lp.py");
        using var folder = new TempFolder("hull-lp");
        string problem = Path.Combine(folder.Path, "problem.json");
        string answers = Path.Combine(folder.Path, "answers.json");
        File.WriteAllText(problem, JsonSerializer.Serialize(new { amounts, energies, queries }));
        var start = new ProcessStartInfo(Python) { RedirectStandardError = true, RedirectStandardOutput = true };
        start.ArgumentList.Add(script);
        start.ArgumentList.Add(problem);
        start.ArgumentList.Add(answers);
        using var process = Process.Start(start)!;
        string error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"hull_lp.py failed: {error}");
        JsonNode result = JsonNode.Parse(File.ReadAllText(answers))!;
        return result["answers"]!.AsArray().Select(a => a!["hull_energy"]!.GetValue<double>()).ToArray();
    }
}
