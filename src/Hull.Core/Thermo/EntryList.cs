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
                throw new ThermoInputException($"Entry {row + 1} of the list (counting from 1) is missing (null).", rowIndex: row);
            }

            if (!rowById.TryAdd(entry.Id, row))
            {
                throw new ThermoInputException(
                    $"Entry id '{entry.Id}' appears twice (entries {rowById[entry.Id] + 1} and {row + 1} of the list, counting from 1); ids must be unique.",
                    entryId: entry.Id,
                    rowIndex: row);
            }
        }
    }

    /// <summary>"'a', 'b' and 4 more" — a bounded list for error messages. Entries are named by id: a position in the
    /// list analysed means nothing to someone who imported a file.</summary>
    public static string Describe(IReadOnlyList<(string Id, int Row)> rows, int shown = 5)
    {
        IEnumerable<string> parts = rows.Take(shown).Select(r => $"'{r.Id}'");
        string text = string.Join(", ", parts);
        return rows.Count > shown ? $"{text} and {rows.Count - shown} more" : text;
    }
}
