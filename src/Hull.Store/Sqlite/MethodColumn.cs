using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// How an entry's method tag sits in the file (migration 7): one nullable column of the entry row, so the tag shares
/// the row's visibility range. Staging tables carry the same column; a session begun before migration 7 staged into
/// a table without it, and its rows are untagged.
/// </summary>
internal static class MethodColumn
{
    public const string Name = "method";

    /// <summary>The staging column's definition (NULL for an untagged entry).</summary>
    public const string StagingDefinition = "method TEXT NULL";

    /// <summary>The tag from column <paramref name="index"/> (null where NULL).</summary>
    public static string? Read(System.Data.Common.DbDataReader reader, int index) => reader.IsDBNull(index) ? null : reader.GetString(index);

    /// <summary>Adds the parameter an entry or staging insert binds ($method).</summary>
    public static SqliteParameter AddParameter(SqliteCommand command) => command.Parameters.Add("$method", SqliteType.Text);

    /// <summary>Sets the parameter from a row (NULL when untagged).</summary>
    public static void Bind(EntryRow row, SqliteParameter method) => method.Value = (object?)row.Method ?? DBNull.Value;

    /// <summary>The staging table's column, or NULL for a table made before migration 7.</summary>
    public static string StagingSelect(SqliteConnection connection, SqliteTransaction transaction, string stagingTable) =>
        StagingColumns.Has(connection, transaction, stagingTable, Name) ? Name : "NULL";

    /// <summary>Gives a staging table of a session begun before migration 7 the column (its rows stay untagged).</summary>
    public static void EnsureStagingColumn(SqliteConnection connection, SqliteTransaction transaction, string stagingTable) =>
        StagingColumns.Ensure(connection, transaction, stagingTable, StagingDefinition, Name);
}
