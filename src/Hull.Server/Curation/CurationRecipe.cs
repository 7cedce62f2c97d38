using System.Text.Json;
using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>
/// An ordered list of curation steps, written as a recipe file of our own: a JSON object
/// <c>{"recipe_schema": 1, "steps": [{"kind": "...", parameter: value, ...}, ...]}</c>. The same text read back gives
/// the same steps, so a recipe recorded with a derived version runs again to the same content.
/// </summary>
public sealed class CurationRecipe
{
    /// <summary>The recipe layout this build writes and reads.</summary>
    public const int SchemaVersion = 1;

    private static readonly JsonSerializerOptions Indented = new() { WriteIndented = true };

    public CurationRecipe(IReadOnlyList<ICurationStep> steps)
    {
        Steps = steps;
    }

    public IReadOnlyList<ICurationStep> Steps { get; }

    /// <summary>The recipe file's text (indented JSON, every parameter written with its default filled in).</summary>
    public string ToJson() => ToNode().ToJsonString(Indented);

    public JsonObject ToNode()
    {
        var steps = new JsonArray();
        foreach (ICurationStep step in Steps)
        {
            JsonObject o = new() { ["kind"] = step.Kind };
            foreach ((string name, JsonNode? value) in step.Parameters()) o[name] = value?.DeepClone();
            steps.Add(o);
        }
        return new JsonObject { ["recipe_schema"] = SchemaVersion, ["steps"] = steps };
    }

    /// <exception cref="CurationRecipeException">Not JSON, a wrong schema version, or a faulty step (number and field named).</exception>
    public static CurationRecipe Parse(string text)
    {
        JsonNode? root;
        try
        {
            root = JsonNode.Parse(text);
        }
        catch (JsonException e)
        {
            throw new CurationRecipeException(0, "(file)", $"is not JSON: {e.Message}");
        }
        if (root is not JsonObject recipe) throw new CurationRecipeException(0, "(file)", "must be a JSON object");
        foreach ((string name, JsonNode? _) in recipe)
        {
            if (name is not ("recipe_schema" or "steps")) throw new CurationRecipeException(0, name, "is not a recipe field (recipe_schema, steps)");
        }
        if (recipe["recipe_schema"] is not JsonValue schema || schema.GetValueKind() != JsonValueKind.Number
            || !schema.TryGetValue(out int version) || version != SchemaVersion)
        {
            throw new CurationRecipeException(0, "recipe_schema", $"must be {SchemaVersion}, the recipe layout this server reads");
        }
        if (recipe["steps"] is not JsonArray array || array.Count == 0)
        {
            throw new CurationRecipeException(0, "steps", "must be a non-empty list of steps");
        }
        var steps = new List<ICurationStep>(array.Count);
        for (int i = 0; i < array.Count; i++)
        {
            int number = i + 1;
            if (array[i] is not JsonObject fields) throw new CurationRecipeException(number, "(step)", "must be a JSON object");
            if (fields["kind"] is not JsonValue kind || kind.GetValueKind() != JsonValueKind.String)
            {
                throw new CurationRecipeException(number, "kind", "is required (a text naming the step kind)");
            }
            var parameters = new JsonObject();
            foreach ((string name, JsonNode? value) in fields)
            {
                if (name != "kind") parameters[name] = value?.DeepClone();
            }
            steps.Add(CurationStepKinds.Read(kind.GetValue<string>(), new StepParameters(number, parameters)));
        }
        // A version records one correction set, so a recipe applies at most one.
        ApplyCorrectionSetStep[] corrections = steps.OfType<ApplyCorrectionSetStep>().ToArray();
        if (corrections.Length > 1)
        {
            throw new CurationRecipeException(corrections[1].StepNumber, "kind",
                $"a recipe applies at most one correction set (a derived version records one); step {corrections[0].StepNumber} already applies {corrections[0].Label}");
        }
        return new CurationRecipe(steps);
    }

    /// <summary>The recipe's apply_correction_set step, or null when it applies no set.</summary>
    public ApplyCorrectionSetStep? Corrections => Steps.OfType<ApplyCorrectionSetStep>().SingleOrDefault();

    /// <summary>A short label of the steps, e.g. "drop_flagged, keep_lowest_duplicate".</summary>
    public override string ToString() => string.Join(", ", Steps.Select(s => s.Kind));

}
