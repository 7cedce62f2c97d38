using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>Opens connections to one database file with the settings every operation relies on.</summary>
internal sealed class ConnectionFactory
{
    /// <summary>How long a statement waits for another process's write lock before failing, in seconds.</summary>
    public const int BusyTimeoutSeconds = 30;

    private readonly string _pooled;
    private readonly string _unpooled;

    public ConnectionFactory(string databasePath)
    {
        DatabasePath = databasePath;
        var builder = new SqliteConnectionStringBuilder
        {
            DataSource = databasePath,
            // Never create the file behind the store's back: if it vanished, operations must fail, not start afresh.
            Mode = SqliteOpenMode.ReadWrite,
            Cache = SqliteCacheMode.Private,
            ForeignKeys = true,
            DefaultTimeout = BusyTimeoutSeconds,
            Pooling = true,
        };
        _pooled = builder.ToString();
        builder.Pooling = false;
        _unpooled = builder.ToString();
    }

    public string DatabasePath { get; }

    /// <summary>A pooled connection, ready for use.</summary>
    public SqliteConnection Open() => Open(_pooled);

    /// <summary>A fresh connection that sees the file as it is now (for health checks).</summary>
    public SqliteConnection OpenUnpooled() => Open(_unpooled);

    /// <summary>Closes the idle pooled connections of this database.</summary>
    public void ClearPool()
    {
        using var connection = new SqliteConnection(_pooled);
        SqliteConnection.ClearPool(connection);
    }

    private static SqliteConnection Open(string connectionString)
    {
        var connection = new SqliteConnection(connectionString);
        try
        {
            connection.Open();
            ApplySessionSettings(connection);
            return connection;
        }
        catch
        {
            connection.Dispose();
            throw;
        }
    }

    /// <summary>Per-connection settings (the journal mode is stored in the file itself; see <see cref="SchemaMigrator"/>).</summary>
    public static void ApplySessionSettings(SqliteConnection connection)
    {
        using var command = connection.CreateCommand();
        // synchronous=FULL: with WAL, NORMAL already survives a killed process (a commit is in the OS's hands before
        // it returns), but may lose the last commits on power loss or an OS crash. A batch we answered "committed"
        // must survive those too; FULL costs one fsync of the WAL per transaction, i.e. per batch, which is small
        // next to writing the batch's rows.
        command.CommandText = $"PRAGMA synchronous = FULL; PRAGMA busy_timeout = {BusyTimeoutSeconds * 1000};";
        command.ExecuteNonQuery();
    }
}
