using System.Globalization;
using System.Text.Json;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using Hull.Store;

namespace Hull.Server.Corrections;

/// <summary>
/// A correction set as a JSON document of our own (README, "Energy corrections"):
/// <code>
/// {"set_schema": 1, "name": "fit-2026", "version": 1, "base_method": "gga",
///  "fitted_references": [{"element": "O", "energy_ev_per_atom": -4.95}],
///  "species_shifts": [{"element": "O", "applies_to": "with_metal", "shift_ev_per_atom": -0.69}],
///  "method_rules": [{"method": "gga+u", "shift_ev_per_atom": 0.12}, {"method": "hybrid", "align_on": "LiCoO2"}]}
/// </code>
/// The three lists may be left out (none). Unknown or repeated fields are refused, so a misspelt rule never passes
/// unnoticed. The document is stored as given; parsing it again gives the same set.
/// </summary>
public static class CorrectionSetDocument
{
    /// <summary>The document layout this build reads.</summary>
    public const int SchemaVersion = 1;

    private static readonly string[] TopFields = ["set_schema", "name", "version", "base_method", "fitted_references", "species_shifts", "method_rules"];

    /// <exception cref="CorrectionSetDocumentException">Not JSON, or a field missing, unknown, repeated, of the wrong kind
    /// or breaking the set's rules (the field named).</exception>
    public static CorrectionSet Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(text);
        }
        catch (JsonException e)
        {
            throw new CorrectionSetDocumentException("(document)", $"is not JSON: {e.Message}");
        }

        using (document)
        {
            JsonElement root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object) throw new CorrectionSetDocumentException("(document)", "must be a JSON object");
            CheckFields(root, "", TopFields);
            long schema = Integer(root, "", "set_schema");
            if (schema != SchemaVersion)
            {
                throw new CorrectionSetDocumentException("set_schema", $"is {schema}; this server reads set_schema {SchemaVersion}");
            }

            string name = Text(root, "", "name");
            if (name.Length > IDatasetStore.MaxCorrectionSetNameLength || name.Any(char.IsControl))
            {
                throw new CorrectionSetDocumentException("name", $"must be 1 to {IDatasetStore.MaxCorrectionSetNameLength} characters without control characters");
            }

            long version = Integer(root, "", "version");
            string baseMethod = Text(root, "", "base_method");
            var fitted = Items(root, "fitted_references", (item, at) =>
            {
                CheckFields(item, at, ["element", "energy_ev_per_atom"]);
                return Science(at, () => new FittedElementReference(Text(item, at, "element"), Number(item, at, "energy_ev_per_atom")));
            });
            var shifts = Items(root, "species_shifts", (item, at) =>
            {
                CheckFields(item, at, ["element", "applies_to", "shift_ev_per_atom"]);
                string kind = Text(item, at, "applies_to");
                return Science(at, () => new SpeciesShift(Text(item, at, "element"),
                    Science($"{at}.applies_to", () => SpeciesClassTokens.Parse(kind)), Number(item, at, "shift_ev_per_atom")));
            });
            var rules = Items(root, "method_rules", (item, at) =>
            {
                CheckFields(item, at, ["method", "shift_ev_per_atom", "align_on"]);
                string method = Text(item, at, "method");
                bool shift = item.TryGetProperty("shift_ev_per_atom", out _), align = item.TryGetProperty("align_on", out _);
                if (shift == align)
                {
                    throw new CorrectionSetDocumentException(at, $"method '{method}' needs exactly one of shift_ev_per_atom (a stated shift) and align_on (a reference compound)");
                }

                if (shift) return Science(at, () => MethodRule.Shift(method, Number(item, at, "shift_ev_per_atom")));
                string formula = Text(item, at, "align_on");
                Composition compound = Composition.TryParse(formula, out Composition? parsed, out FormulaParseException? error)
                    ? parsed : throw new CorrectionSetDocumentException($"{at}.align_on", error.Message);
                return Science(at, () => MethodRule.AlignOn(method, compound));
            });
            return Science("(document)", () => new CorrectionSet(name, version, baseMethod, fitted, shifts, rules));
        }
    }

    private static T Science<T>(string at, Func<T> make)
    {
        try
        {
            return make();
        }
        catch (ThermoInputException e)
        {
            throw new CorrectionSetDocumentException(at, e.Message);
        }
    }

    private static List<T> Items<T>(JsonElement root, string field, Func<JsonElement, string, T> read)
    {
        var items = new List<T>();
        if (!root.TryGetProperty(field, out JsonElement list) || list.ValueKind == JsonValueKind.Null) return items;
        if (list.ValueKind != JsonValueKind.Array) throw new CorrectionSetDocumentException(field, "must be an array of objects");
        int i = 0;
        foreach (JsonElement item in list.EnumerateArray())
        {
            string at = string.Create(CultureInfo.InvariantCulture, $"{field}[{i++}]");
            if (item.ValueKind != JsonValueKind.Object) throw new CorrectionSetDocumentException(at, "must be an object");
            items.Add(read(item, at));
        }

        return items;
    }

    private static void CheckFields(JsonElement item, string at, string[] known)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (JsonProperty property in item.EnumerateObject())
        {
            string path = Path(at, property.Name);
            if (!known.Contains(property.Name, StringComparer.Ordinal))
            {
                throw new CorrectionSetDocumentException(path, $"is not a field here; the fields are {string.Join(", ", known)}");
            }

            if (!seen.Add(property.Name)) throw new CorrectionSetDocumentException(path, "is given twice");
        }
    }

    private static string Path(string at, string field) => at.Length == 0 ? field : $"{at}.{field}";

    private static JsonElement Required(JsonElement item, string at, string field) =>
        item.TryGetProperty(field, out JsonElement value) && value.ValueKind != JsonValueKind.Null
            ? value
            : throw new CorrectionSetDocumentException(Path(at, field), "is missing");

    private static string Text(JsonElement item, string at, string field)
    {
        JsonElement value = Required(item, at, field);
        if (value.ValueKind != JsonValueKind.String) throw new CorrectionSetDocumentException(Path(at, field), $"must be a text, not {value.GetRawText()}");
        string text = value.GetString()!;
        if (string.IsNullOrWhiteSpace(text)) throw new CorrectionSetDocumentException(Path(at, field), "is blank");
        return text;
    }

    private static double Number(JsonElement item, string at, string field)
    {
        JsonElement value = Required(item, at, field);
        // JSON has no NaN or infinity; a number beyond binary64's range is refused here rather than read as infinite.
        if (value.ValueKind != JsonValueKind.Number || !value.TryGetDouble(out double number) || !double.IsFinite(number))
        {
            throw new CorrectionSetDocumentException(Path(at, field), $"must be a finite number of eV per atom, not {value.GetRawText()}");
        }

        return number;
    }

    private static long Integer(JsonElement item, string at, string field)
    {
        JsonElement value = Required(item, at, field);
        if (value.ValueKind != JsonValueKind.Number || !value.TryGetInt64(out long number))
        {
            throw new CorrectionSetDocumentException(Path(at, field), $"must be a whole number, not {value.GetRawText()}");
        }

        return number;
    }
}
