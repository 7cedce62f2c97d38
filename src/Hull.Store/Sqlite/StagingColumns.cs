using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// Columns a schema step added to staging tables: a session begun before that step staged into a table without
/// them, so its rows are read as having none, and its next batch gives the table the columns first.
/// </summary>
internal static class StagingColumns
{
    /// <summary>Whether <paramref name="stagingTable"/> has the column <paramref name="column"/>.</summary>
    public static bool Has(SqliteConnection connection, SqliteTransaction transaction, string stagingTable, string column)
    {
        using SqliteCommand command = connection.Command(transaction,
            "SELECT count(*) FROM pragma_table_info($t) WHERE name = $c").With("$t", stagingTable).With("$c", column);
        return (long)command.ExecuteScalar()! == 1;
    }

    /// <summary>
    /// Adds each line of <paramref name="definitions"/> ("name TYPE NULL," per line) to the table unless it already
    /// has <paramref name="markerColumn"/>, the step's last column (the step adds all of them or none).
    /// </summary>
    public static void Ensure(SqliteConnection connection, SqliteTransaction transaction, string stagingTable, string definitions, string markerColumn)
    {
        if (Has(connection, transaction, stagingTable, markerColumn)) return;
        foreach (string definition in definitions.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
        {
            using SqliteCommand alter = connection.Command(transaction, $"ALTER TABLE {stagingTable} ADD COLUMN {definition.TrimEnd(',')}");
            alter.ExecuteNonQuery();
        }
    }
}
