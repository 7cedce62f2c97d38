using System.Text.Json;

namespace Hull.Cli.Input;

/// <summary>Reads entries from JSON in the layout of <see cref="EntryFileLayout"/>.</summary>
public static class JsonEntryReader
{
    public static IReadOnlyList<EntryRecord> Read(string path, Stream stream)
    {
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(stream, new JsonDocumentOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        }
        catch (JsonException e)
        {
            int? line = e.LineNumber is long l ? (int)l + 1 : null;
            throw new InputFileException(path, line, $"not valid JSON: {e.Message}", e);
        }

        using (document)
        {
            JsonElement root = document.RootElement;
            JsonElement array = root.ValueKind switch
            {
                JsonValueKind.Array => root,
                JsonValueKind.Object when root.TryGetProperty("entries", out JsonElement entries) && entries.ValueKind == JsonValueKind.Array => entries,
                _ => throw new InputFileException(path, null, "expected an array of entries, or an object with an \"entries\" array"),
            };

            var records = new List<EntryRecord>(array.GetArrayLength());
            int index = 0;
            foreach (JsonElement item in array.EnumerateArray())
            {
                records.Add(ReadEntry(path, item, index));
                index++;
            }

            return records;
        }
    }

    private static EntryRecord ReadEntry(string path, JsonElement item, int index)
    {
        string where = $"entries[{index}]";
        InputFileException Fail(string problem) => new(path, null, $"{where}: {problem}");
        if (item.ValueKind != JsonValueKind.Object) throw Fail("expected an object");

        foreach (JsonProperty property in item.EnumerateObject())
        {
            if (!EntryFileLayout.Columns.Contains(property.Name))
            {
                throw Fail($"unknown field \"{property.Name}\"; the fields are {string.Join(", ", EntryFileLayout.Columns)}");
            }
        }

        string Text(string name, bool required)
        {
            if (!item.TryGetProperty(name, out JsonElement value) || value.ValueKind == JsonValueKind.Null)
            {
                return required ? throw Fail($"field \"{name}\" is missing") : string.Empty;
            }

            return value.ValueKind == JsonValueKind.String ? value.GetString()! : throw Fail($"field \"{name}\" must be a string");
        }

        string id = Text(EntryFileLayout.Id, required: true).Trim();
        string formula = Text(EntryFileLayout.Formula, required: true).Trim();
        if (id.Length == 0) throw Fail("field \"id\" is empty");
        if (formula.Length == 0) throw Fail("field \"formula\" is empty");
        if (!item.TryGetProperty(EntryFileLayout.EnergyEv, out JsonElement energyElement))
        {
            throw Fail("field \"energy_ev\" is missing");
        }

        if (energyElement.ValueKind != JsonValueKind.Number || !energyElement.TryGetDouble(out double energy) || !double.IsFinite(energy))
        {
            throw Fail($"field \"energy_ev\" must be a finite number, not {energyElement.GetRawText()}");
        }

        var basis = EntryFileLayout.ParseBasis(Text(EntryFileLayout.Basis, required: true), problem => Fail($"field \"basis\": {problem}"));
        double? sigma = null;
        if (item.TryGetProperty(EntryFileLayout.Sigma, out JsonElement sigmaElement) && sigmaElement.ValueKind != JsonValueKind.Null)
        {
            sigma = sigmaElement.ValueKind == JsonValueKind.Number && sigmaElement.TryGetDouble(out double s)
                ? EntryFileLayout.ParseSigma(s.ToString("R", System.Globalization.CultureInfo.InvariantCulture), problem => Fail($"field \"{EntryFileLayout.Sigma}\": {problem}"))
                : throw Fail($"field \"{EntryFileLayout.Sigma}\" must be a number of eV/atom, not {sigmaElement.GetRawText()}");
        }

        // JSON has no line per entry that a reader can report cheaply; the entry's index stands in (0-based).
        return new EntryRecord(id, formula, energy, basis, Text(EntryFileLayout.Note, required: false), -(index + 1),
            sigma, Text(EntryFileLayout.CorrelationGroup, required: false).Trim());
    }
}
