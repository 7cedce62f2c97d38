using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>The steps that drop every entry whose metadata has one word, matched whole and case-sensitively.</summary>
public abstract class DropByMetadataWordStep(string parameterName, string parameterValue, string word) : ICurationStep
{
    public abstract string Kind { get; }

    public JsonObject Parameters() => new() { [parameterName] = parameterValue };

    public CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context) =>
        new(entries.Where(e => !e.MetadataWords.Contains(word, StringComparer.Ordinal)).ToList());
}
