using Hull.Protos.V1;

namespace Hull.Cli.Output;

/// <summary>A curation record as lines of text and as a table of its steps.</summary>
public static class CurationText
{
    /// <summary>One line for the record, then one per step, e.g. "  2. drop_source {"source":"lab-x"}: 4 entries, 1 removed, 0 changed".</summary>
    public static IEnumerable<string> Lines(CurationRecord record)
    {
        yield return $"version {record.Version}: curated from {record.SourceDataset}@{record.SourceVersion} (content sha256 {record.SourceSha256})";
        foreach (CurationStepCount s in record.Steps)
        {
            yield return $"  {s.Number}. {s.Kind} {s.ParametersJson}: {s.EntriesBefore} entries, {s.RemovedCount} removed, {s.ChangedCount} changed";
        }
    }

    public static Table StepsTable(CurationRecord record)
    {
        var table = new Table("step", "kind", "parameters", "entries_before", "removed", "changed");
        foreach (CurationStepCount s in record.Steps) table.Add(s.Number, s.Kind, s.ParametersJson, s.EntriesBefore, s.RemovedCount, s.ChangedCount);
        return table;
    }
}
