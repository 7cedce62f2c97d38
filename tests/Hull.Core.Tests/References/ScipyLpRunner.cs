using System.Text.Json;
using System.Text.Json.Serialization;

namespace Hull.Core.Tests.References;

/// <summary>
/// LP reference through SciPy's HiGHS solver (<c>scipy.optimize.linprog(method="highs")</c>) run by Debian's system
/// python, <c>/usr/bin/python3</c> with python3-scipy (the python3 first on PATH may lack SciPy). All queries of a
/// problem go to one python process: starting it costs far more than one small LP.
/// </summary>
public static class ScipyLpRunner
{
    private const string Python = "/usr/bin/python3";
    private const string ScriptName = "hull_lp.py";

    /// <summary>
    /// Largest accepted violation of sum_j lambda_j x_j = x_q: the solver works to 1e-10 feasibility; above 1e-9
    /// (the tolerance of the comparisons) the answer could not decide a check.
    /// </summary>
    private const double MaxResidual = 1e-9;

    public static IReadOnlyList<HullLpAnswer> Solve(HullLpProblem problem)
    {
        if (problem.ExcludedPerQuery is not null && problem.ExcludedPerQuery.Count != problem.Queries.Count)
        {
            throw new ArgumentException($"{problem.ExcludedPerQuery.Count} exclusion lists for {problem.Queries.Count} queries.", nameof(problem));
        }
        string script = Path.Combine(AppContext.BaseDirectory, "References", ScriptName);
        if (!File.Exists(script)) throw new ReferenceToolException($"The LP script {script} was not copied to the test output.");
        using var scratch = new ScratchFolder("scipy");
        string input = scratch.File("problem.json");
        string output = scratch.File("answers.json");
        File.WriteAllText(input, JsonSerializer.Serialize(new Problem(problem.Amounts, problem.EnergiesEvPerAtom, problem.Queries,
            problem.ExcludedPerQuery ?? problem.Queries.Select(_ => Array.Empty<int>()).ToList())));
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
        if (parsed.List is null || parsed.List.Count != problem.Queries.Count)
        {
            throw new ReferenceToolException($"The LP script answered {parsed.List?.Count ?? 0} queries of {problem.Queries.Count}.");
        }
        for (int q = 0; q < parsed.List.Count; q++)
        {
            // An LP answer that misses its own constraints by more than the checks' tolerance is no reference.
            if (!(parsed.List[q].Residual <= MaxResidual))
            {
                throw new ReferenceToolException($"SciPy's LP for query {q} misses the composition by {parsed.List[q].Residual:R}.");
            }
        }
        return parsed.List.Select(a => new HullLpAnswer(a.HullEnergy, a.Phases, a.Weights, a.Duals)).ToList();
    }

    private sealed record Problem(
        [property: JsonPropertyName("amounts")] IReadOnlyList<long[]> Amounts,
        [property: JsonPropertyName("energies")] IReadOnlyList<double> Energies,
        [property: JsonPropertyName("queries")] IReadOnlyList<double[]> Queries,
        [property: JsonPropertyName("excluded")] IReadOnlyList<int[]> Excluded);

    private sealed record Answers(
        [property: JsonPropertyName("scipy")] string Version,
        [property: JsonPropertyName("answers")] List<Answer> List);

    private sealed record Answer(
        [property: JsonPropertyName("hull_energy")] double HullEnergy,
        [property: JsonPropertyName("phases")] int[] Phases,
        [property: JsonPropertyName("weights")] double[] Weights,
        [property: JsonPropertyName("residual")] double Residual,
        [property: JsonPropertyName("duals")] double[]? Duals);
}
