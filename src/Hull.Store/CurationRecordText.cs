using System.Text.Json;
using System.Text.Json.Nodes;

namespace Hull.Store;

/// <summary>
/// A curation record as one text, kept in its import session (import_sessions.curation_record) until the commit
/// writes it to curation_records; the same in every backend.
/// </summary>
internal static class CurationRecordText
{
    public static void Check(CurationRecord record)
    {
        ArgumentNullException.ThrowIfNull(record);
        DatasetName.Validate(record.SourceDataset);
        if (record.SourceVersion < 1) throw new ArgumentException($"source version {record.SourceVersion} is not a version number", nameof(record));
        foreach ((string text, string field) in new[] { (record.SourceSha256, "source_sha256"), (record.RecipeJson, "recipe_json"), (record.StepsJson, "steps_json") })
        {
            if (string.IsNullOrEmpty(text)) throw new ArgumentException($"the curation record's {field} is empty", nameof(record));
            StoreArguments.CheckStoredText(text, field);
        }
    }

    public static string Write(CurationRecord record) => new JsonObject
    {
        ["source_dataset"] = record.SourceDataset,
        ["source_version"] = record.SourceVersion,
        ["source_sha256"] = record.SourceSha256,
        ["recipe_json"] = record.RecipeJson,
        ["steps_json"] = record.StepsJson,
    }.ToJsonString();

    public static CurationRecord Read(string text)
    {
        JsonObject o = JsonNode.Parse(text)?.AsObject() ?? throw new JsonException("a session's curation record is not a JSON object");
        return new CurationRecord(o["source_dataset"]!.GetValue<string>(), o["source_version"]!.GetValue<long>(), o["source_sha256"]!.GetValue<string>(),
            o["recipe_json"]!.GetValue<string>(), o["steps_json"]!.GetValue<string>());
    }
}
