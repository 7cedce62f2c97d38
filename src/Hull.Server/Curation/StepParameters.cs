using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace Hull.Server.Curation;

/// <summary>
/// The parameters of one recipe step as read from JSON: each read names the step number and the field in its error,
/// and <see cref="RequireAllRead"/> refuses any field no read asked for (a misspelt parameter must not be ignored).
/// </summary>
public sealed class StepParameters
{
    private readonly JsonObject _fields;
    private readonly HashSet<string> _read = new(StringComparer.Ordinal);

    public StepParameters(int stepNumber, JsonObject fields)
    {
        StepNumber = stepNumber;
        _fields = fields;
    }

    /// <summary>The 1-based step these parameters belong to.</summary>
    public int StepNumber { get; }

    public CurationRecipeException Error(string field, string problem) => new(StepNumber, field, problem);

    /// <summary>A finite number, or <paramref name="fallback"/> when absent (null fallback: required).</summary>
    public double Number(string field, double? fallback = null)
    {
        _read.Add(field);
        JsonNode? node = _fields[field];
        if (node is null)
        {
            return fallback ?? throw Error(field, "is required (a number)");
        }
        if (node.GetValueKind() != JsonValueKind.Number || !double.IsFinite(node.GetValue<double>()))
        {
            throw Error(field, $"must be a finite number, not {node.ToJsonString()}");
        }
        return node.GetValue<double>();
    }

    /// <summary>A number that may be absent (null).</summary>
    public double? OptionalNumber(string field) => _fields[field] is null ? MarkRead(field) : Number(field);

    /// <summary>A non-empty text, or <paramref name="fallback"/> when absent (null fallback: required).</summary>
    public string Text(string field, string? fallback = null)
    {
        _read.Add(field);
        JsonNode? node = _fields[field];
        if (node is null)
        {
            return fallback ?? throw Error(field, "is required (a text)");
        }
        if (node.GetValueKind() != JsonValueKind.String || string.IsNullOrWhiteSpace(node.GetValue<string>()))
        {
            throw Error(field, $"must be a non-empty text, not {node.ToJsonString()}");
        }
        return node.GetValue<string>();
    }

    /// <summary>A required, non-empty list of non-empty texts.</summary>
    public IReadOnlyList<string> TextList(string field)
    {
        _read.Add(field);
        if (_fields[field] is not JsonArray array || array.Count == 0)
        {
            throw Error(field, "is required (a non-empty list of texts)");
        }
        var texts = new List<string>(array.Count);
        for (int i = 0; i < array.Count; i++)
        {
            if (array[i] is not JsonValue value || value.GetValueKind() != JsonValueKind.String || string.IsNullOrWhiteSpace(value.GetValue<string>()))
            {
                throw Error(string.Create(CultureInfo.InvariantCulture, $"{field}[{i}]"), "must be a non-empty text");
            }
            texts.Add(value.GetValue<string>());
        }
        return texts;
    }

    /// <exception cref="CurationRecipeException">A field that is not one of <paramref name="fields"/>: names it and lists them.</exception>
    public void RequireOnly(string kind, IReadOnlyCollection<string> fields)
    {
        foreach ((string name, JsonNode? _) in _fields)
        {
            if (!fields.Contains(name, StringComparer.Ordinal))
            {
                string known = fields.Count == 0 ? "it takes none" : "its parameters: " + string.Join(", ", fields);
                throw Error(name, $"is not a parameter of {kind} ({known})");
            }
        }
    }

    /// <exception cref="CurationRecipeException">A field no read asked for: names it.</exception>
    public void RequireAllRead()
    {
        foreach ((string name, JsonNode? _) in _fields)
        {
            if (!_read.Contains(name)) throw Error(name, "is not a parameter of this step kind");
        }
    }

    private double? MarkRead(string field)
    {
        _read.Add(field);
        return null;
    }
}
