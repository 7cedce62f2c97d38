using Hull.Server.Curation;

namespace Hull.Server.Mapping;

/// <summary>Curation records between the Store's texts and the wire.</summary>
public static class CurationWireMapping
{
    public static Protos.V1.CurationRecord ToWire(string dataset, long version, Store.CurationRecord record)
    {
        var wire = new Protos.V1.CurationRecord
        {
            Dataset = dataset,
            Version = version,
            SourceDataset = record.SourceDataset,
            SourceVersion = record.SourceVersion,
            SourceSha256 = record.SourceSha256,
            RecipeJson = record.RecipeJson,
        };
        wire.Steps.AddRange(CurationStepsJson.Read(record.StepsJson).Select(s => new Protos.V1.CurationStepCount
        {
            Number = s.Number,
            Kind = s.Kind,
            ParametersJson = s.Parameters.ToJsonString(),
            EntriesBefore = s.EntriesBefore,
            RemovedCount = s.Removed,
            ChangedCount = s.Changed,
        }));
        return wire;
    }
}
