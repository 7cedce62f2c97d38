using System.Text;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Input;

/// <summary>
/// The per-dataset table of G(T) points that goes beside entry files (`hull import --free-energy-tables`, and out
/// of `hull export --csv --free-energy-tables`): CSV, one point per line, columns <c>entry_id</c>, <c>anchor</c>
/// (computed_0k or fitted_298k, the same on every point of one entry), <c>temperature_k</c> and
/// <c>free_energy_above_anchor_ev</c> (G(T) − H(anchor) of one formula unit, eV, on the anchor the entry's energy stands for). An entry's points keep the file's order; the
/// server refuses a table that is not strictly increasing in temperature. Blank lines and '#' lines are skipped.
/// </summary>
public static class FreeEnergyTableFile
{
    public const string EntryId = "entry_id";

    /// <summary>The columns, in the order files are written; all are required.</summary>
    public static IReadOnlyList<string> Columns { get; } =
        [EntryId, EntryFileLayout.Anchor, EntryFileLayout.TemperatureK, EntryFileLayout.FreeEnergyAboveAnchorEv];

    /// <summary>One entry's table as read, with the line of its first point.</summary>
    public sealed record EntryTable(string EntryId, EntryFreeEnergyTable Table, int FirstLine);

    /// <summary>The tables of a file, in the order their entries first appear.</summary>
    public static IReadOnlyList<EntryTable> Read(string path)
    {
        try
        {
            using var reader = new StreamReader(path, new UTF8Encoding(false, throwOnInvalidBytes: true), detectEncodingFromByteOrderMarks: true);
            return Read(path, reader);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new InputFileException(path, null, "no such file", e);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or DecoderFallbackException)
        {
            throw new InputFileException(path, null, e is DecoderFallbackException ? "not UTF-8 text" : $"cannot be read: {e.Message}", e);
        }
    }

    public static IReadOnlyList<EntryTable> Read(string path, TextReader reader)
    {
        var tables = new List<EntryTable>();
        var byId = new Dictionary<string, (EntryTable Table, string AnchorText)>(StringComparer.Ordinal);
        Dictionary<string, int>? columns = null;
        int lineNumber = 0;
        while (CsvEntryReader.ReadRecord(reader, path, ref lineNumber) is { } record)
        {
            (int line, List<string> fields) = record;
            if (fields.Count == 1 && fields[0].Trim().Length == 0) continue;
            if (fields[0].TrimStart().StartsWith('#')) continue;
            if (columns is null)
            {
                columns = CsvEntryReader.ReadHeader(path, line, fields, Columns, Columns);
                continue;
            }

            if (fields.Count != columns.Count)
            {
                throw new InputFileException(path, line, $"{fields.Count} fields, but the header has {columns.Count} ({string.Join(",", columns.Keys)})");
            }

            string Field(string name) => fields[columns[name]].Trim();
            string id = Field(EntryId);
            if (id.Length == 0) throw new InputFileException(path, line, $"column '{EntryId}' is empty");
            string anchorText = Field(EntryFileLayout.Anchor);
            FreeEnergyAnchor anchor = EntryFileLayout.ParseAnchor(anchorText, problem => new InputFileException(path, line, $"column 'anchor': {problem}"));
            double Number(string name, string unit) => CsvEntryReader.ParseNumber(Field(name), out double value)
                ? value
                : throw new InputFileException(path, line, $"column '{name}': '{Field(name)}' is not a finite number of {unit}");
            var point = new EntryFreeEnergyRow
            {
                TemperatureK = Number(EntryFileLayout.TemperatureK, "K"),
                FreeEnergyAboveAnchorEv = Number(EntryFileLayout.FreeEnergyAboveAnchorEv, "eV"),
            };

            if (byId.TryGetValue(id, out var known))
            {
                if (known.Table.Table.Anchor != anchor)
                {
                    throw new InputFileException(path, line,
                        $"entry '{id}': anchor '{anchorText}' differs from '{known.AnchorText}' on line {known.Table.FirstLine}; one table has one anchor");
                }

                known.Table.Table.Rows.Add(point);
                continue;
            }

            var table = new EntryTable(id, new EntryFreeEnergyTable { Anchor = anchor, Rows = { point } }, line);
            byId.Add(id, (table, anchorText));
            tables.Add(table);
        }

        if (columns is null) throw new InputFileException(path, null, $"no header line; the first line must name the columns {string.Join(",", Columns)}");
        if (tables.Count == 0) throw new InputFileException(path, null, "no points");
        return tables;
    }

    /// <summary>
    /// The entry files' records with the tables attached to their entries. Refuses a table for an id no entry file
    /// has, and one for an entry that already has a temperature model (a standard entropy, or a JSON table).
    /// </summary>
    public static IReadOnlyList<(string Path, IReadOnlyList<EntryRecord> Records)> Attach(
        IReadOnlyList<(string Path, IReadOnlyList<EntryRecord> Records)> inputs, string tablePath, IReadOnlyList<EntryTable> tables)
    {
        var where = new Dictionary<string, (int Input, int Record)>(StringComparer.Ordinal);
        for (int i = 0; i < inputs.Count; i++)
        {
            for (int r = 0; r < inputs[i].Records.Count; r++) where.TryAdd(inputs[i].Records[r].Id, (i, r));
        }

        var records = inputs.Select(input => input.Records.ToArray()).ToArray();
        foreach (EntryTable table in tables)
        {
            if (!where.TryGetValue(table.EntryId, out var at))
            {
                throw new InputFileException(tablePath, table.FirstLine, $"entry '{table.EntryId}' is in none of the entry files imported with it");
            }

            EntryRecord record = records[at.Input][at.Record];
            if (record.TemperatureModel is { KindCase: not EntryTemperatureModel.KindOneofCase.None } model)
            {
                string kind = model.KindCase == EntryTemperatureModel.KindOneofCase.StandardEntropyJPerMolK ? "a standard entropy" : "a G(T) table";
                throw new InputFileException(tablePath, table.FirstLine,
                    $"entry '{table.EntryId}' already has {kind} in {Path.GetFileName(inputs[at.Input].Path)} {EntryFileReader.Locate(record)}; an entry has one temperature model");
            }

            var withTable = record.TemperatureModel?.Clone() ?? new EntryTemperatureModel();
            withTable.FreeEnergyTable = table.Table.Clone();
            records[at.Input][at.Record] = record with { TemperatureModel = withTable };
        }

        return [.. inputs.Select((input, i) => (input.Path, (IReadOnlyList<EntryRecord>)records[i]))];
    }

    /// <summary>The tables of exported entries in this file's layout; an empty table when none has one.</summary>
    public static Table ToTable(IEnumerable<Entry> entries)
    {
        var table = new Table([.. Columns]);
        foreach (Entry entry in entries)
        {
            if (entry.TemperatureModel?.FreeEnergyTable is not { } points) continue;
            foreach (EntryFreeEnergyRow point in points.Rows)
            {
                table.Add(entry.Id, EntryFileLayout.TokenOf(points.Anchor), point.TemperatureK, point.FreeEnergyAboveAnchorEv);
            }
        }

        return table;
    }
}
