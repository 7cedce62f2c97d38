using System.Text.Json;
using System.Text.Json.Serialization;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.References;

/// <summary>
/// Open-element hull reference through SciPy's HiGHS under Debian's <c>/usr/bin/python3</c> (script
/// open_hull_lp.py): the script computes formation energies and grand potentials itself from the raw total
/// energies, the references and the open elements' Δμ, then solves the hull LP at each query.
/// </summary>
public static class OpenHullLpRunner
{

    public sealed record Answer(double?[] PhiEvPerClosedAtom, double[] HullEnergyEvPerClosedAtom, double[][] Duals);

    /// <param name="entries">Total energies per formula unit.</param>
    public static Answer Solve(
        IReadOnlyList<string> elements, IReadOnlyDictionary<string, double> openRelative, IReadOnlyDictionary<string, double> references,
        IReadOnlyList<PhaseEntry> entries, IReadOnlyList<Composition> queries)
    {
        string script = Path.Combine(AppContext.BaseDirectory, "References", "open_hull_lp.py");
        if (!File.Exists(script)) throw new ReferenceToolException($"The LP script {script} was not copied to the test output.");
        using var scratch = new ScratchFolder("scipy-open-hull");
        string input = scratch.File("problem.json");
        string output = scratch.File("answers.json");
        var problem = new Problem(
            elements.ToArray(), openRelative.ToDictionary(), references.ToDictionary(),
            entries.Select(e => new RawEntry(AmountsOf(e.Composition), e.EnergyEv)).ToList(),
            queries.Select(AmountsOf).ToList());
        File.WriteAllText(input, JsonSerializer.Serialize(problem));
        ToolProcess.Run("/usr/bin/python3", [script, input, output], scratch.Path, "python3-scipy");
        Answers parsed = JsonSerializer.Deserialize<Answers>(File.ReadAllText(output))
            ?? throw new ReferenceToolException("The open-hull LP script wrote an empty answer file.");
        return new Answer(parsed.Phi, parsed.List.Select(a => a.HullEnergy).ToArray(), parsed.List.Select(a => a.Duals).ToArray());
    }

    private static Dictionary<string, double> AmountsOf(Composition c) => c.Elements.ToDictionary(e => e, e => c.AmountOf(e).ToDouble());

    private sealed record Problem(
        [property: JsonPropertyName("elements")] string[] Elements,
        [property: JsonPropertyName("open")] Dictionary<string, double> Open,
        [property: JsonPropertyName("references")] Dictionary<string, double> References,
        [property: JsonPropertyName("entries")] List<RawEntry> Entries,
        [property: JsonPropertyName("queries")] List<Dictionary<string, double>> Queries);

    private sealed record RawEntry(
        [property: JsonPropertyName("amounts")] Dictionary<string, double> Amounts,
        [property: JsonPropertyName("energy_per_formula_unit")] double EnergyPerFormulaUnit);

    private sealed record Answers(
        [property: JsonPropertyName("phi")] double?[] Phi,
        [property: JsonPropertyName("answers")] List<LpAnswer> List);

    private sealed record LpAnswer(
        [property: JsonPropertyName("hull_energy")] double HullEnergy,
        [property: JsonPropertyName("duals")] double[] Duals);
}
