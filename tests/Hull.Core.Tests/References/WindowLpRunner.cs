using System.Text.Json;
using System.Text.Json.Serialization;

namespace Hull.Core.Tests.References;

/// <summary>
/// Highest and lowest values of linear objectives over {μ ≤ 0 : A_ub μ ≤ b_ub, A_eq μ = b_eq} by SciPy's HiGHS
/// (<c>scipy.optimize.linprog(method="highs")</c>) under Debian's <c>/usr/bin/python3</c>; one process for all problems.
/// </summary>
public static class WindowLpRunner
{

    public sealed record Problem(
        [property: JsonPropertyName("a_ub")] double[][] AUpper,
        [property: JsonPropertyName("b_ub")] double[] BUpper,
        [property: JsonPropertyName("a_eq")] double[][] AEqual,
        [property: JsonPropertyName("b_eq")] double[] BEqual,
        [property: JsonPropertyName("objectives")] double[][] Objectives,
        [property: JsonPropertyName("max_only")] bool MaxOnly = false);

    public sealed record Answer(
        [property: JsonPropertyName("max")] double[] Max,
        [property: JsonPropertyName("min")] double[] Min,
        [property: JsonPropertyName("status")] int[] Status);

    private sealed record Problems([property: JsonPropertyName("problems")] IReadOnlyList<Problem> List);

    private sealed record Answers(
        [property: JsonPropertyName("scipy")] string Version,
        [property: JsonPropertyName("answers")] List<Answer> List);

    public static IReadOnlyList<Answer> Solve(IReadOnlyList<Problem> problems)
    {
        string script = Path.Combine(AppContext.BaseDirectory, "References", "windows_lp.py");
        if (!File.Exists(script)) throw new ReferenceToolException($"The LP script {script} was not copied to the test output.");
        using var scratch = new ScratchFolder("scipy-windows");
        string input = scratch.File("problems.json");
        string output = scratch.File("answers.json");
        File.WriteAllText(input, JsonSerializer.Serialize(new Problems(problems)));
        ToolProcess.Run("/usr/bin/python3", [script, input, output], scratch.Path, "python3-scipy");
        Answers parsed = JsonSerializer.Deserialize<Answers>(File.ReadAllText(output))
            ?? throw new ReferenceToolException("The window LP script wrote nothing.");
        if (parsed.List.Count != problems.Count) throw new ReferenceToolException($"{parsed.List.Count} answers for {problems.Count} problems.");
        if (parsed.List.Any(a => a.Status.Any(s => s != 0))) throw new ReferenceToolException("HiGHS did not solve every window LP to optimality.");
        return parsed.List;
    }
}
