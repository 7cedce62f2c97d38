namespace Hull.Core.Thermo;

/// <summary>Checks shared by every operation that takes a list of entries: no missing rows, unique ids.</summary>
internal static class EntryList
{
    public static void Validate(IReadOnlyList<PhaseEntry> entries)
    {
        ArgumentNullException.ThrowIfNull(entries);
        var rowById = new Dictionary<string, int>(entries.Count, StringComparer.Ordinal);
        for (int row = 0; row < entries.Count; row++)
        {
            PhaseEntry? entry = entries[row];
            if (entry is null)
            {
                throw new ThermoInputException($"Row {row} has no entry (null).", rowIndex: row);
            }

            if (!rowById.TryAdd(entry.Id, row))
            {
                throw new ThermoInputException(
                    $"Entry id '{entry.Id}' appears twice (rows {rowById[entry.Id]} and {row}); ids must be unique.",
                    entryId: entry.Id,
                    rowIndex: row);
            }
        }
    }

    /// <summary>"'a' (row 3), 'b' (row 7) and 4 more" — a bounded list for error messages.</summary>
    public static string Describe(IReadOnlyList<(string Id, int Row)> rows, int shown = 5)
    {
        IEnumerable<string> parts = rows.Take(shown).Select(r => $"'{r.Id}' (row {r.Row})");
        string text = string.Join(", ", parts);
        return rows.Count > shown ? $"{text} and {rows.Count - shown} more" : text;
    }
}
