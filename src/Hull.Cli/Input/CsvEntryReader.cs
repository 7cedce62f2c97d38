using System.Globalization;
using System.Text;

namespace Hull.Cli.Input;

/// <summary>Reads entries from CSV in the layout of <see cref="EntryFileLayout"/>.</summary>
public static class CsvEntryReader
{
    public static IReadOnlyList<EntryRecord> Read(string path, TextReader reader)
    {
        var records = new List<EntryRecord>();
        Dictionary<string, int>? columns = null;
        int lineNumber = 0;
        while (ReadRecord(reader, path, ref lineNumber) is { } record)
        {
            (int line, List<string> fields) = record;
            if (fields.Count == 1 && fields[0].Trim().Length == 0) continue;
            if (fields[0].TrimStart().StartsWith('#')) continue;

            if (columns is null)
            {
                columns = ReadHeader(path, line, fields);
                continue;
            }

            if (fields.Count != columns.Count)
            {
                throw new InputFileException(path, line, $"{fields.Count} fields, but the header has {columns.Count} ({string.Join(",", columns.Keys)})");
            }

            string Field(string name) => columns.TryGetValue(name, out int index) ? fields[index] : string.Empty;
            string id = Field(EntryFileLayout.Id).Trim();
            string formula = Field(EntryFileLayout.Formula).Trim();
            if (id.Length == 0) throw new InputFileException(path, line, "column 'id' is empty");
            if (formula.Length == 0) throw new InputFileException(path, line, "column 'formula' is empty");
            string energyText = Field(EntryFileLayout.EnergyEv).Trim();
            if (!ParseNumber(energyText, out double energy))
            {
                throw new InputFileException(path, line, $"column 'energy_ev': '{energyText}' is not a finite number (use a '.' decimal point, e.g. -2.345)");
            }

            var basis = EntryFileLayout.ParseBasis(Field(EntryFileLayout.Basis), problem => new InputFileException(path, line, $"column 'basis': {problem}"));
            string entropyText = Field(EntryFileLayout.StandardEntropy).Trim();
            double? entropy = null;
            if (entropyText.Length > 0)
            {
                entropy = ParseNumber(entropyText, out double value)
                    ? value
                    : throw new InputFileException(path, line, $"column '{EntryFileLayout.StandardEntropy}': '{entropyText}' is not a finite number of J/(mol K)");
            }

            double? sigma = EntryFileLayout.ParseSigma(Field(EntryFileLayout.Sigma), problem => new InputFileException(path, line, $"column '{EntryFileLayout.Sigma}': {problem}"));
            records.Add(new EntryRecord(id, formula, energy, basis, Field(EntryFileLayout.Note), line,
                TemperatureModelText.FromEntropy(entropy, Field(EntryFileLayout.ModelFormula)), sigma, Field(EntryFileLayout.CorrelationGroup).Trim(),
                Field(EntryFileLayout.Method).Trim()));
        }

        if (columns is null) throw new InputFileException(path, null, $"no header line; the first line must name the columns, e.g. {string.Join(",", EntryFileLayout.PlainColumns)}");
        return records;
    }

    /// <summary>A finite number in the invariant culture ('.' decimal point, exponent allowed).</summary>
    internal static bool ParseNumber(string text, out double value) =>
        double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value);

    /// <summary>The header's columns by name; refuses unknown, repeated and missing required ones, naming them.</summary>
    internal static Dictionary<string, int> ReadHeader(string path, int line, List<string> fields,
        IReadOnlyList<string>? known = null, IReadOnlyList<string>? required = null)
    {
        known ??= EntryFileLayout.Columns;
        required ??= EntryFileLayout.RequiredColumns;
        var columns = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int i = 0; i < fields.Count; i++)
        {
            string name = fields[i].Trim();
            if (!known.Contains(name))
            {
                throw new InputFileException(path, line, $"unknown column '{name}' in the header; the columns are {string.Join(", ", known)}");
            }

            if (!columns.TryAdd(name, i)) throw new InputFileException(path, line, $"column '{name}' appears twice in the header");
        }

        foreach (string column in required)
        {
            if (!columns.ContainsKey(column)) throw new InputFileException(path, line, $"the header has no '{column}' column");
        }

        return columns;
    }

    /// <summary>One CSV record (which may span lines inside quotes), with the line it starts on; null at the end.</summary>
    internal static (int Line, List<string> Fields)? ReadRecord(TextReader reader, string path, ref int lineNumber)
    {
        string? text = reader.ReadLine();
        if (text is null) return null;
        lineNumber++;
        int start = lineNumber;
        var fields = new List<string>();
        var field = new StringBuilder();
        bool quoted = false;
        int i = 0;
        while (true)
        {
            if (i >= text.Length)
            {
                if (!quoted) break;
                string? next = reader.ReadLine();
                if (next is null) throw new InputFileException(path, start, "a quoted field is never closed");
                lineNumber++;
                field.Append('\n');
                text = next;
                i = 0;
                continue;
            }

            char c = text[i];
            if (quoted)
            {
                if (c == '"')
                {
                    if (i + 1 < text.Length && text[i + 1] == '"')
                    {
                        field.Append('"');
                        i += 2;
                        continue;
                    }

                    quoted = false;
                }
                else
                {
                    field.Append(c);
                }
            }
            else if (c == '"' && field.ToString().Trim().Length == 0)
            {
                field.Clear();
                quoted = true;
            }
            else if (c == ',')
            {
                fields.Add(field.ToString());
                field.Clear();
            }
            else
            {
                field.Append(c);
            }

            i++;
        }

        fields.Add(field.ToString());
        return (start, fields);
    }
}
