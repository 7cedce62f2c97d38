using System.Text;
using System.Text.Json;
using Hull.Cli.Input;
using Hull.Protos.V1;

namespace Hull.Cli.Output;

/// <summary>Writes entries in the JSON entry-file layout of <see cref="EntryFileLayout"/>, readable by `hull import`.</summary>
public static class EntryFileWriter
{
    public static string ToJson(string dataset, long version, IEnumerable<Entry> entries)
    {
        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer, ProtoJson.PlainWriting))
        {
            json.WriteStartObject();
            json.WriteString("dataset", dataset);
            json.WriteNumber("dataset_version", version);
            json.WriteStartArray("entries");
            foreach (Entry e in entries)
            {
                json.WriteStartObject();
                json.WriteString(EntryFileLayout.Id, e.Id);
                json.WriteString(EntryFileLayout.Formula, e.Formula);
                json.WriteNumber(EntryFileLayout.EnergyEv, e.EnergyEv);
                json.WriteString(EntryFileLayout.Basis, EntryFileLayout.TokenOf(e.Basis));
                json.WriteString(EntryFileLayout.Note, e.Note);
                if (e.TemperatureModel is { } model) WriteModel(json, model);
                if (e.HasEnergySigmaEvPerAtom) json.WriteNumber(EntryFileLayout.Sigma, e.EnergySigmaEvPerAtom);
                if (e.CorrelationGroup.Length > 0) json.WriteString(EntryFileLayout.CorrelationGroup, e.CorrelationGroup);
                if (e.Method.Length > 0) json.WriteString(EntryFileLayout.Method, e.Method);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteEndObject();
        }

        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    private static void WriteModel(Utf8JsonWriter json, EntryTemperatureModel model)
    {
        if (model.KindCase == EntryTemperatureModel.KindOneofCase.StandardEntropyJPerMolK)
        {
            json.WriteNumber(EntryFileLayout.StandardEntropy, model.StandardEntropyJPerMolK);
        }
        else if (model.FreeEnergyTable is { } table)
        {
            json.WriteStartObject(EntryFileLayout.FreeEnergyTable);
            json.WriteString(EntryFileLayout.Anchor, EntryFileLayout.TokenOf(table.Anchor));
            json.WriteStartArray(EntryFileLayout.Rows);
            foreach (EntryFreeEnergyRow point in table.Rows)
            {
                json.WriteStartObject();
                json.WriteNumber(EntryFileLayout.TemperatureK, point.TemperatureK);
                json.WriteNumber(EntryFileLayout.FreeEnergyAboveAnchorEv, point.FreeEnergyAboveAnchorEv);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteEndObject();
        }

        if (model.Formula.Length > 0) json.WriteString(EntryFileLayout.ModelFormula, model.Formula);
    }
}
