using System.Text.Json;
using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>The per-step counts of a run as the curation record keeps them: a JSON array, one object per step.</summary>
public static class CurationStepsJson
{
    public static string Write(IReadOnlyList<CurationStepRecord> steps) => new JsonArray(steps.Select(s => (JsonNode)new JsonObject
    {
        ["number"] = s.Number,
        ["kind"] = s.Kind,
        ["parameters"] = s.Parameters.DeepClone(),
        ["entries_before"] = s.EntriesBefore,
        ["removed"] = s.Removed,
        ["changed"] = s.Changed,
    }).ToArray()).ToJsonString();

    /// <exception cref="JsonException">Not the text <see cref="Write"/> makes.</exception>
    public static IReadOnlyList<CurationStepRecord> Read(string text)
    {
        JsonArray array = JsonNode.Parse(text)?.AsArray() ?? throw new JsonException("a curation record's steps are not a JSON array");
        return array.Select(n => n!.AsObject()).Select(o => new CurationStepRecord(
            o["number"]!.GetValue<int>(), o["kind"]!.GetValue<string>(), o["parameters"]!.AsObject().DeepClone().AsObject(),
            o["entries_before"]!.GetValue<int>(), o["removed"]!.GetValue<int>(), o["changed"]!.GetValue<int>())).ToList();
    }
}
