using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// How an entry's energy uncertainty sits in the file (migration 6): two nullable columns of the entry row itself, so
/// σ and correlation group share the row's visibility range. Staging tables carry the same two columns; a session
/// begun before migration 6 staged into a table without them, and its rows have neither.
/// </summary>
internal static class UncertaintyColumns
{
    /// <summary>The two columns, in the order of <see cref="Read"/>, in entries and in staging tables alike.</summary>
    public const string Names = "energy_sigma_ev_per_atom, correlation_group";

    /// <summary>The two staging columns' definitions (NULL for an entry without an uncertainty).</summary>
    public const string StagingDefinitions = """
        energy_sigma_ev_per_atom REAL NULL,
        correlation_group        TEXT NULL
        """;

    /// <summary>σ and group from the two columns from <paramref name="first"/> on (null where NULL).</summary>
    public static (double? SigmaEvPerAtom, string? CorrelationGroup) Read(System.Data.Common.DbDataReader reader, int first) =>
        (reader.IsDBNull(first) ? null : reader.GetDouble(first), reader.IsDBNull(first + 1) ? null : reader.GetString(first + 1));

    /// <summary>Adds the two parameters an entry or staging insert binds ($sigma, $group).</summary>
    public static (SqliteParameter Sigma, SqliteParameter Group) AddParameters(SqliteCommand command) =>
        (command.Parameters.Add("$sigma", SqliteType.Real), command.Parameters.Add("$group", SqliteType.Text));

    /// <summary>Sets the two parameters from a row (NULL where it has none).</summary>
    public static void Bind(EntryRow row, SqliteParameter sigma, SqliteParameter group)
    {
        // SQLite reads -0.0 back as 0.0; store the +0 it will return so the row reads back exactly.
        sigma.Value = row.SigmaEvPerAtom is { } s ? s + 0.0 : DBNull.Value;
        group.Value = (object?)row.CorrelationGroup ?? DBNull.Value;
    }

    /// <summary>The staging table's two columns, or two NULLs for a table made before migration 6.</summary>
    public static string StagingSelect(SqliteConnection connection, SqliteTransaction transaction, string stagingTable) =>
        StagingColumns.Has(connection, transaction, stagingTable, "correlation_group") ? Names : "NULL, NULL";

    /// <summary>Gives a staging table of a session begun before migration 6 the two columns (its rows get NULLs).</summary>
    public static void EnsureStagingColumns(SqliteConnection connection, SqliteTransaction transaction, string stagingTable) =>
        StagingColumns.Ensure(connection, transaction, stagingTable, StagingDefinitions, "correlation_group");
}
