using System.Text.Json.Nodes;
using Hull.Core.Chemistry;

namespace Hull.Server.Curation;

/// <summary>Keeps only entries made of the listed elements alone (a chemical system and its subsystems).</summary>
public sealed class KeepElementsStep(IReadOnlyList<string> elements) : ICurationStep
{
    public const string KindName = "keep_elements";

    public IReadOnlyList<string> Elements { get; } = elements;

    public string Kind => KindName;

    public static KeepElementsStep Read(StepParameters p)
    {
        IReadOnlyList<string> elements = p.TextList("elements");
        for (int i = 0; i < elements.Count; i++)
        {
            if (!ElementTable.IsSymbol(elements[i])) throw p.Error($"elements[{i}]", $"'{elements[i]}' is not an element symbol");
        }
        return new KeepElementsStep(elements.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList());
    }

    public JsonObject Parameters() => new() { ["elements"] = new JsonArray(Elements.Select(e => (JsonNode)e).ToArray()) };

    public CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context)
    {
        var allowed = new HashSet<string>(Elements, StringComparer.Ordinal);
        return new(entries.Where(e => e.Phase.Composition.Elements.All(allowed.Contains)).ToList());
    }
}
