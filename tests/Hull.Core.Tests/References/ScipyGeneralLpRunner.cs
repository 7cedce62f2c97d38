using System.Text.Json;
using System.Text.Json.Serialization;
using Hull.Core.Optimization;

namespace Hull.Core.Tests.References;

/// <summary>
/// General LP reference through SciPy's HiGHS (<c>scipy.optimize.linprog(method="highs")</c>, feasibility
/// tolerances 1e-10) under Debian's <c>/usr/bin/python3</c> with python3-scipy: script general_lp.py, one process
/// for a whole list of programs.
/// </summary>
public static class ScipyGeneralLpRunner
{
    private const string Python = "/usr/bin/python3";
    private const string ScriptName = "general_lp.py";

    public static IReadOnlyList<GeneralLpAnswer> Solve(IReadOnlyList<LinearProgram> programs)
    {
        string script = Path.Combine(AppContext.BaseDirectory, "References", ScriptName);
        if (!File.Exists(script)) throw new ReferenceToolException($"The LP script {script} was not copied to the test output.");
        using var scratch = new ScratchFolder("scipy-general");
        string input = scratch.File("programs.json");
        string output = scratch.File("answers.json");
        File.WriteAllText(input, JsonSerializer.Serialize(new Programs(programs.Select(ToJson).ToList())));
        ToolProcess.Run(Python, [script, input, output], scratch.Path, "python3-scipy");
        Answers parsed;
        try
        {
            parsed = JsonSerializer.Deserialize<Answers>(File.ReadAllText(output))
                ?? throw new ReferenceToolException("The LP script wrote an empty answer file.");
        }
        catch (Exception e) when (e is JsonException or IOException)
        {
            throw new ReferenceToolException($"Could not read the LP script's answers {output}.", e);
        }
        if (parsed.List is null || parsed.List.Count != programs.Count)
        {
            throw new ReferenceToolException($"The LP script answered {parsed.List?.Count ?? 0} programs of {programs.Count}.");
        }
        return parsed.List.Select(a => new GeneralLpAnswer(a.Status, a.Objective ?? double.NaN, a.X ?? [], a.RowDuals ?? [], a.ReducedCosts ?? [])).ToList();
    }

    private static double? Finite(double v) => double.IsFinite(v) ? v : null;

    private static Program ToJson(LinearProgram p) => new(
        p.Sense == ObjectiveSense.Maximize,
        p.Objective.ToArray(),
        Enumerable.Range(0, p.RowCount).Select(i => p.Row(i).ToArray()).ToList(),
        p.RowLower.ToArray().Select(Finite).ToArray(), p.RowUpper.ToArray().Select(Finite).ToArray(),
        p.ColumnLower.ToArray().Select(Finite).ToArray(), p.ColumnUpper.ToArray().Select(Finite).ToArray());

    private sealed record Programs([property: JsonPropertyName("programs")] List<Program> List);

    private sealed record Program(
        [property: JsonPropertyName("maximize")] bool Maximize,
        [property: JsonPropertyName("c")] double[] C,
        [property: JsonPropertyName("a")] List<double[]> A,
        [property: JsonPropertyName("row_lower")] double?[] RowLower,
        [property: JsonPropertyName("row_upper")] double?[] RowUpper,
        [property: JsonPropertyName("col_lower")] double?[] ColumnLower,
        [property: JsonPropertyName("col_upper")] double?[] ColumnUpper);

    private sealed record Answers(
        [property: JsonPropertyName("scipy")] string Version,
        [property: JsonPropertyName("answers")] List<Answer> List);

    private sealed record Answer(
        [property: JsonPropertyName("status")] string Status,
        [property: JsonPropertyName("objective")] double? Objective,
        [property: JsonPropertyName("x")] double[]? X,
        [property: JsonPropertyName("row_duals")] double[]? RowDuals,
        [property: JsonPropertyName("reduced_costs")] double[]? ReducedCosts);
}
