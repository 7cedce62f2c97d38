using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

/// <summary>
/// Versioned datasets of phase entries in an embedded SQLite database (WAL mode) inside a data directory.
/// Thread-safe: each operation takes its own pooled connection; reads run concurrently on consistent snapshots,
/// writes go one at a time. Every import creates a new immutable version; older versions read the same forever.
/// </summary>
public sealed partial class DatasetStore : IDatasetStore
{
    /// <summary>Name of the database file inside the data directory.</summary>
    public const string DatabaseFileName = "hull-store.sqlite3";

    /// <summary>As <see cref="IDatasetStore.NoVersion"/> (kept here for callers that name the SQLite store).</summary>
    public const long NoVersion = IDatasetStore.NoVersion;

    /// <summary>As <see cref="IDatasetStore.MaxPageSize"/>.</summary>
    public const int MaxPageSize = IDatasetStore.MaxPageSize;

    // A health probe waits this long for an import in progress to finish; longer means the store is not answering.
    private static readonly TimeSpan HealthWriteWait = TimeSpan.FromSeconds(10);

    // SQLite result code for "file is not a database".
    private const int SqliteNotADatabase = 26;

    private readonly ConnectionFactory _connections;
    private readonly DataVersionSignal _signal;
    private readonly LatestVersionMemory _latest;
    private readonly TimeProvider _clock;

    // One writer at a time inside this process; other processes are kept out by SQLite's own write lock.
    private readonly SemaphoreSlim _writeGate = new(1, 1);
    private int _disposed;

    private DatasetStore(ConnectionFactory connections, string dataDirectory, TimeProvider clock, TimeSpan crossProcessWindow)
    {
        _connections = connections;
        _signal = new DataVersionSignal(connections, crossProcessWindow);
        _latest = new LatestVersionMemory(_signal);
        _clock = clock;
        DataDirectory = dataDirectory;
    }

    /// <summary>The absolute data directory the store lives in.</summary>
    public string DataDirectory { get; }

    /// <summary>The data directory: where an SQLite store lives.</summary>
    public string Location => DataDirectory;

    /// <summary>The absolute path of the database file.</summary>
    public string DatabasePath => _connections.DatabasePath;

    /// <summary>
    /// Opens the store in <paramref name="dataDirectory"/>, creating the directory and the database on first use and
    /// migrating an older schema. Throws <see cref="UnsupportedSchemaVersionException"/> for a newer schema and
    /// <see cref="StoreCorruptException"/> for a file that is not a store.
    /// </summary>
    /// <param name="dataDirectory">Directory holding the database file.</param>
    /// <param name="clock">Source of commit times; the system clock when null.</param>
    public static DatasetStore Open(string dataDirectory, TimeProvider? clock = null) =>
        Open(dataDirectory, clock, DataVersionSignal.DefaultCrossProcessWindow);

    /// <summary>As <see cref="Open(string, TimeProvider?)"/>, with the time another process's commit may go unseen
    /// by "latest version" questions (see <see cref="DataVersionSignal"/>); for tests.</summary>
    internal static DatasetStore Open(string dataDirectory, TimeProvider? clock, TimeSpan crossProcessWindow)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(dataDirectory);
        clock ??= TimeProvider.System;
        string directory = Path.GetFullPath(dataDirectory);
        Directory.CreateDirectory(directory);
        string path = Path.Combine(directory, DatabaseFileName);

        string createOrOpen = new SqliteConnectionStringBuilder
        {
            DataSource = path,
            Mode = SqliteOpenMode.ReadWriteCreate,
            Pooling = false,
            DefaultTimeout = ConnectionFactory.BusyTimeoutSeconds,
        }.ToString();
        try
        {
            using var connection = new SqliteConnection(createOrOpen);
            connection.Open();
            ConnectionFactory.ApplySessionSettings(connection);
            SchemaMigrator.Migrate(connection, path, clock, Schema.LatestVersion);
        }
        catch (SqliteException e) when (e.SqliteErrorCode == SqliteNotADatabase)
        {
            throw new StoreCorruptException(path, "the file is not an SQLite database", e);
        }
        return new DatasetStore(new ConnectionFactory(path), directory, clock, crossProcessWindow);
    }

    /// <summary>True only when the database file is there and its schema table can be read and written.</summary>
    public bool CheckHealth() => CheckHealth(out _);

    /// <summary>As <see cref="CheckHealth()"/>, and says what is wrong when it is not healthy.</summary>
    public bool CheckHealth(out string? problem)
    {
        if (Volatile.Read(ref _disposed) != 0)
        {
            problem = "the store has been closed";
            return false;
        }
        if (!File.Exists(DatabasePath))
        {
            problem = $"database file '{DatabasePath}' is missing";
            return false;
        }
        if (!_writeGate.Wait(HealthWriteWait))
        {
            problem = $"a write has held the store for more than {HealthWriteWait.TotalSeconds:0} s";
            return false;
        }
        try
        {
            // Unpooled: a pooled connection could still be reading a file that was since deleted or replaced.
            using SqliteConnection connection = _connections.OpenUnpooled();
            using SqliteTransaction transaction = connection.BeginTransaction(deferred: false);
            long version = SchemaMigrator.ReadVersion(connection, transaction, DatabasePath);
            if (version != Schema.LatestVersion)
            {
                problem = $"schema version is {version}, expected {Schema.LatestVersion}";
                return false;
            }
            using SqliteCommand touch = connection.Command(transaction,
                "UPDATE schema_version SET applied_at_utc = applied_at_utc WHERE version = $v").With("$v", version);
            if (touch.ExecuteNonQuery() != 1)
            {
                problem = "could not write the schema table";
                return false;
            }
            transaction.Commit();
            _signal.CommittedHere();
            problem = null;
            return true;
        }
        catch (Exception e) when (e is SqliteException or StoreException or IOException or UnauthorizedAccessException)
        {
            problem = e.Message;
            return false;
        }
        finally
        {
            _writeGate.Release();
        }
    }

    /// <summary>Closes the pooled connections; later calls throw <see cref="ObjectDisposedException"/>.</summary>
    public void Dispose()
    {
        if (Interlocked.Exchange(ref _disposed, 1) != 0) return;
        _latest.Dispose();
        _connections.ClearPool();
    }

    /// <summary>Runs <paramref name="body"/> in a read transaction: one consistent snapshot of the database.</summary>
    private T Read<T>(Func<SqliteConnection, SqliteTransaction, T> body)
    {
        ObjectDisposedException.ThrowIf(Volatile.Read(ref _disposed) != 0, this);
        using SqliteConnection connection = _connections.Open();
        using SqliteTransaction transaction = connection.BeginTransaction(deferred: true);
        T result = body(connection, transaction);
        transaction.Commit();
        return result;
    }

    /// <summary>Runs <paramref name="body"/> in a write transaction; an exception rolls everything back.</summary>
    private T Write<T>(Func<SqliteConnection, SqliteTransaction, T> body)
    {
        ObjectDisposedException.ThrowIf(Volatile.Read(ref _disposed) != 0, this);
        _writeGate.Wait();
        try
        {
            using SqliteConnection connection = _connections.Open();
            // BEGIN IMMEDIATE: take the write lock up front, so another process cannot slip in between our reads and writes.
            using SqliteTransaction transaction = connection.BeginTransaction(deferred: false);
            T result = body(connection, transaction);
            transaction.Commit();
            _signal.CommittedHere();
            return result;
        }
        finally
        {
            _writeGate.Release();
        }
    }
}
