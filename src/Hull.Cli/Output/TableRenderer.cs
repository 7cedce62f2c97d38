using System.Globalization;
using System.Text;

namespace Hull.Cli.Output;

/// <summary>Writes a <see cref="Table"/> as aligned text or as CSV (RFC 4180 quoting, full-precision numbers).</summary>
public static class TableRenderer
{
    /// <summary>Decimal places of real numbers in tables: energies to 0.1 meV/atom, finer than DFT noise (~1 meV/atom).</summary>
    public const int TableDecimals = 4;

    public static void Write(TextWriter writer, Table table, OutputFormat format)
    {
        if (format == OutputFormat.Csv)
        {
            WriteCsv(writer, table);
        }
        else
        {
            WriteAligned(writer, table);
        }
    }

    public static void WriteAligned(TextWriter writer, Table table, string indent = "")
    {
        string[][] cells = table.Rows.Select(row => row.Select(c => FormatForTable(c)).ToArray()).ToArray();
        int[] widths = table.Columns.Select((c, k) => Math.Max(c.Length, cells.Length == 0 ? 0 : cells.Max(r => r[k].Length))).ToArray();
        bool[] numeric = table.Columns.Select((_, k) => table.Rows.Count > 0 && table.Rows.All(r => r[k] is null or double or float or int or long or Scientific)).ToArray();

        string Line(IReadOnlyList<string> values)
        {
            var line = new StringBuilder(indent);
            for (int k = 0; k < values.Count; k++)
            {
                if (k > 0) line.Append("  ");
                line.Append(numeric[k] ? values[k].PadLeft(widths[k]) : values[k].PadRight(widths[k]));
            }

            return line.ToString().TrimEnd();
        }

        writer.WriteLine(Line(table.Columns));
        writer.WriteLine(Line(widths.Select(w => new string('-', w)).ToArray()));
        foreach (string[] row in cells) writer.WriteLine(Line(row));
    }

    public static void WriteCsv(TextWriter writer, Table table)
    {
        writer.WriteLine(string.Join(",", table.Columns.Select(Quote)));
        foreach (object?[] row in table.Rows)
        {
            writer.WriteLine(string.Join(",", row.Select(c => Quote(FormatForCsv(c)))));
        }
    }

    public static string FormatForTable(object? cell) => cell switch
    {
        null => string.Empty,
        double d => d.ToString("F" + TableDecimals, CultureInfo.InvariantCulture),
        Scientific s => s.Value.ToString("0.000e+00", CultureInfo.InvariantCulture),
        bool b => b ? "yes" : "no",
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        _ => cell.ToString() ?? string.Empty,
    };

    public static string FormatForCsv(object? cell) => cell switch
    {
        null => string.Empty,
        double d => d.ToString("R", CultureInfo.InvariantCulture),
        Scientific s => s.Value.ToString("R", CultureInfo.InvariantCulture),
        bool b => b ? "true" : "false",
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        _ => cell.ToString() ?? string.Empty,
    };

    public static string Quote(string text) =>
        text.IndexOfAny([',', '"', '\n', '\r']) >= 0 || text != text.Trim() ? "\"" + text.Replace("\"", "\"\"") + "\"" : text;
}
