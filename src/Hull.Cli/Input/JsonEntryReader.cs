using System.Text.Json;
using Hull.Protos.V1;

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
            if (!EntryFileLayout.Columns.Contains(property.Name) && property.Name != EntryFileLayout.FreeEnergyTable)
            {
                throw Fail($"unknown field \"{property.Name}\"; the fields are {string.Join(", ", EntryFileLayout.Columns)}, {EntryFileLayout.FreeEnergyTable}");
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
        double? entropy = null;
        if (item.TryGetProperty(EntryFileLayout.StandardEntropy, out JsonElement entropyElement) && entropyElement.ValueKind != JsonValueKind.Null)
        {
            entropy = FiniteNumber(entropyElement, out double value)
                ? value
                : throw Fail($"field \"{EntryFileLayout.StandardEntropy}\" must be a finite number of J/(mol K), not {entropyElement.GetRawText()}");
        }

        EntryTemperatureModel? model = TemperatureModelText.FromEntropy(entropy, Text(EntryFileLayout.ModelFormula, required: false));
        if (item.TryGetProperty(EntryFileLayout.FreeEnergyTable, out JsonElement tableElement) && tableElement.ValueKind != JsonValueKind.Null)
        {
            if (entropy is not null)
            {
                throw Fail($"both \"{EntryFileLayout.StandardEntropy}\" and \"{EntryFileLayout.FreeEnergyTable}\" are given; an entry has one temperature model");
            }

            model ??= new EntryTemperatureModel();
            model.FreeEnergyTable = ReadTable(tableElement, Fail);
        }

        double? sigma = null;
        if (item.TryGetProperty(EntryFileLayout.Sigma, out JsonElement sigmaElement) && sigmaElement.ValueKind != JsonValueKind.Null)
        {
            sigma = sigmaElement.ValueKind == JsonValueKind.Number && sigmaElement.TryGetDouble(out double s)
                ? EntryFileLayout.ParseSigma(s.ToString("R", System.Globalization.CultureInfo.InvariantCulture), problem => Fail($"field \"{EntryFileLayout.Sigma}\": {problem}"))
                : throw Fail($"field \"{EntryFileLayout.Sigma}\" must be a number of eV/atom, not {sigmaElement.GetRawText()}");
        }

        // JSON has no line per entry that a reader can report cheaply; the entry's index stands in (0-based).
        return new EntryRecord(id, formula, energy, basis, Text(EntryFileLayout.Note, required: false), -(index + 1), model,
            sigma, Text(EntryFileLayout.CorrelationGroup, required: false).Trim(), Text(EntryFileLayout.Method, required: false).Trim());
    }

    private static EntryFreeEnergyTable ReadTable(JsonElement table, Func<string, InputFileException> fail)
    {
        string at = $"field \"{EntryFileLayout.FreeEnergyTable}\"";
        if (table.ValueKind != JsonValueKind.Object) throw fail($"{at} must be an object with \"{EntryFileLayout.Anchor}\" and \"{EntryFileLayout.Rows}\"");
        foreach (JsonProperty property in table.EnumerateObject())
        {
            if (property.Name is not (EntryFileLayout.Anchor or EntryFileLayout.Rows))
            {
                throw fail($"{at}: unknown field \"{property.Name}\"; the fields are {EntryFileLayout.Anchor}, {EntryFileLayout.Rows}");
            }
        }

        if (!table.TryGetProperty(EntryFileLayout.Anchor, out JsonElement anchor) || anchor.ValueKind != JsonValueKind.String)
        {
            throw fail($"{at}: \"{EntryFileLayout.Anchor}\" must be given as a string, one of {string.Join(", ", EntryFileLayout.AnchorTokens.Keys)}");
        }

        var wire = new EntryFreeEnergyTable { Anchor = EntryFileLayout.ParseAnchor(anchor.GetString()!, problem => fail($"{at}: {problem}")) };
        if (!table.TryGetProperty(EntryFileLayout.Rows, out JsonElement points) || points.ValueKind != JsonValueKind.Array)
        {
            throw fail($"{at}: \"{EntryFileLayout.Rows}\" must be an array of objects with \"{EntryFileLayout.TemperatureK}\" and \"{EntryFileLayout.FreeEnergyAboveAnchorEv}\"");
        }

        int k = 0;
        foreach (JsonElement point in points.EnumerateArray())
        {
            string where = $"{at}: rows[{k}]";
            if (point.ValueKind != JsonValueKind.Object) throw fail($"{where} must be an object");
            double Number(string name) =>
                point.TryGetProperty(name, out JsonElement value) && FiniteNumber(value, out double number)
                    ? number
                    : throw fail($"{where}: \"{name}\" must be a finite number");
            foreach (JsonProperty property in point.EnumerateObject())
            {
                if (property.Name is not (EntryFileLayout.TemperatureK or EntryFileLayout.FreeEnergyAboveAnchorEv))
                {
                    throw fail($"{where}: unknown field \"{property.Name}\"; the fields are {EntryFileLayout.TemperatureK}, {EntryFileLayout.FreeEnergyAboveAnchorEv}");
                }
            }

            wire.Rows.Add(new EntryFreeEnergyRow { TemperatureK = Number(EntryFileLayout.TemperatureK), FreeEnergyAboveAnchorEv = Number(EntryFileLayout.FreeEnergyAboveAnchorEv) });
            k++;
        }

        return wire;
    }

    private static bool FiniteNumber(JsonElement element, out double value)
    {
        value = 0;
        return element.ValueKind == JsonValueKind.Number && element.TryGetDouble(out value) && double.IsFinite(value);
    }
}
