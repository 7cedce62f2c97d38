using System.Data;
using Hull.Store.Sqlite;
using Npgsql;

namespace Hull.Store.Postgres;

/// <summary>
/// Versioned datasets in a PostgreSQL database that several servers share. The same calls with the same meaning as
/// the SQLite <see cref="DatasetStore"/>: reads run in REPEATABLE READ transactions (one consistent snapshot per
/// call); every write transaction first updates the one row of <c>store_commits</c>, whose lock queues writers of
/// every process one at a time, so version numbers are issued without gaps or repeats and a version is visible
/// whole or not at all. A server killed mid-write loses its connection and PostgreSQL rolls its transaction back.
/// The tables live in the first schema of the connection string's search path (created when missing), else in
/// the user's default schema.
/// </summary>
public sealed partial class PostgresDatasetStore : IDatasetStore
{
    /// <summary>How long a write waits for other writers before failing, in seconds (as SQLite's busy timeout).</summary>
    public const int WriteLockTimeoutSeconds = 30;

    // PostgreSQL's class 08 (connection exception) and the shutdown codes: the database went away, not a bad request.
    private static readonly string[] UnavailableStates = ["57P01", "57P02", "57P03", "53300"];

    private readonly NpgsqlDataSource _source;
    private readonly LatestVersionMemory _latest;
    private readonly TimeProvider _clock;
    private int _disposed;

    private PostgresDatasetStore(NpgsqlDataSource source, string location, TimeProvider clock)
    {
        _source = source;
        Location = location;
        _clock = clock;
        _latest = new LatestVersionMemory(new CommitGenerationSignal(this));
    }

    /// <inheritdoc />
    public string Location { get; }

    /// <summary>
    /// Opens the store in the database <paramref name="connectionString"/> names (Npgsql keywords: Host, Port,
    /// Database, Username, Password or a passfile, Search Path for the schema), creating or migrating its tables.
    /// </summary>
    /// <exception cref="ArgumentException">The connection string cannot be read.</exception>
    /// <exception cref="StoreUnavailableException">The database cannot be reached.</exception>
    /// <exception cref="UnsupportedSchemaVersionException">The schema is newer than this build knows.</exception>
    /// <exception cref="StoreCorruptException">The schema holds tables that are not a store.</exception>
    public static PostgresDatasetStore Open(string connectionString, TimeProvider? clock = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(connectionString);
        clock ??= TimeProvider.System;
        NpgsqlConnectionStringBuilder builder = Parse(connectionString, out string? problem)
            ?? throw new ArgumentException(problem, nameof(connectionString));
        string location = Describe(builder);
        NpgsqlDataSource source = NpgsqlDataSource.Create(builder);
        try
        {
            using NpgsqlConnection connection = OpenConnection(source, location);
            try
            {
                using (NpgsqlTransaction transaction = connection.BeginTransaction())
                {
                    PostgresSchemaCreation.CreateFirstSchema(connection, transaction, builder.SearchPath);
                    transaction.Commit();
                }

                PostgresSchemaMigrator.Migrate(connection, location, clock);
            }
            catch (Exception e) when (IsUnavailable(e))
            {
                throw new StoreUnavailableException(location, e.Message, e);
            }
            return new PostgresDatasetStore(source, location, clock);
        }
        catch
        {
            source.Dispose();
            throw;
        }
    }

    /// <inheritdoc />
    public bool CheckHealth(out string? problem)
    {
        if (Volatile.Read(ref _disposed) != 0)
        {
            problem = "the store has been closed";
            return false;
        }
        try
        {
            using NpgsqlConnection connection = _source.OpenConnection();
            using NpgsqlTransaction transaction = connection.BeginTransaction();
            connection.Execute(transaction, $"SET LOCAL lock_timeout = '{WriteLockTimeoutSeconds}s'");
            long version = PostgresSchemaMigrator.ReadVersion(connection, transaction, Location);
            if (version != PostgresSchema.LatestVersion)
            {
                problem = $"schema version is {version}, expected {PostgresSchema.LatestVersion}";
                return false;
            }
            if (connection.Execute(transaction, "UPDATE schema_version SET applied_at_utc = applied_at_utc WHERE version = @v", ("@v", (int)version)) != 1)
            {
                problem = "could not write the schema table";
                return false;
            }
            transaction.Commit();
            problem = null;
            return true;
        }
        catch (Exception e) when (e is NpgsqlException or StoreException or InvalidOperationException or TimeoutException)
        {
            problem = e.Message;
            return false;
        }
    }

    /// <summary>Closes the store's connections; later calls throw <see cref="ObjectDisposedException"/>.</summary>
    public void Dispose()
    {
        if (Interlocked.Exchange(ref _disposed, 1) != 0) return;
        _latest.Dispose();
        _source.Dispose();
    }

    /// <summary>Runs <paramref name="body"/> in a read transaction: one consistent snapshot of the database.</summary>
    private T Read<T>(Func<NpgsqlConnection, NpgsqlTransaction, T> body) => Run(() =>
    {
        using NpgsqlConnection connection = _source.OpenConnection();
        using NpgsqlTransaction transaction = connection.BeginTransaction(IsolationLevel.RepeatableRead);
        T result = body(connection, transaction);
        transaction.Commit();
        return result;
    });

    /// <summary>
    /// Runs <paramref name="body"/> in a write transaction after every earlier writer of any process has finished;
    /// an exception rolls everything back.
    /// </summary>
    private T Write<T>(Func<NpgsqlConnection, NpgsqlTransaction, T> body) => Run(() =>
    {
        using NpgsqlConnection connection = _source.OpenConnection();
        // READ COMMITTED: each statement after the queue sees every commit made before this writer's turn came.
        using NpgsqlTransaction transaction = connection.BeginTransaction(IsolationLevel.ReadCommitted);
        connection.Execute(transaction,
            $"SET LOCAL lock_timeout = '{WriteLockTimeoutSeconds}s'; UPDATE store_commits SET generation = generation + 1");
        T result = body(connection, transaction);
        transaction.Commit();
        return result;
    });

    /// <summary>Runs a call, turning a lost or unreachable database into <see cref="StoreUnavailableException"/>.</summary>
    private T Run<T>(Func<T> call)
    {
        ObjectDisposedException.ThrowIf(Volatile.Read(ref _disposed) != 0, this);
        try
        {
            return call();
        }
        catch (Exception e) when (IsUnavailable(e))
        {
            throw new StoreUnavailableException(Location, e.Message, e);
        }
    }

    /// <summary>The store's commit generation, read outside any transaction (what the latest-version memory watches).</summary>
    internal long ReadCommitGeneration() => Run(() =>
    {
        using NpgsqlConnection connection = _source.OpenConnection();
        using NpgsqlCommand command = connection.Command(null, "SELECT generation FROM store_commits");
        return (long)command.ExecuteScalar()!;
    });

    private static NpgsqlConnection OpenConnection(NpgsqlDataSource source, string location)
    {
        try
        {
            return source.OpenConnection();
        }
        catch (Exception e) when (IsUnavailable(e) || e is PostgresException)
        {
            throw new StoreUnavailableException(location, e.Message, e);
        }
    }

    private static bool IsUnavailable(Exception e) => e switch
    {
        PostgresException p => p.SqlState.StartsWith("08", StringComparison.Ordinal) || UnavailableStates.Contains(p.SqlState),
        NpgsqlException => true,
        TimeoutException => true,
        _ => false,
    };

    /// <summary>Null when <paramref name="connectionString"/> can be read, else what is wrong with it.</summary>
    public static string? CheckConnectionString(string connectionString)
    {
        Parse(connectionString, out string? problem);
        return problem;
    }

    /// <summary>Where a connection string points, for people and logs (never the password).</summary>
    public static string Describe(string connectionString) =>
        Parse(connectionString, out _) is { } builder ? Describe(builder) : "(an unreadable PostgreSQL connection string)";

    private static NpgsqlConnectionStringBuilder? Parse(string connectionString, out string? problem)
    {
        try
        {
            var builder = new NpgsqlConnectionStringBuilder(connectionString);
            problem = string.IsNullOrWhiteSpace(builder.Host) ? "the PostgreSQL connection string names no Host" : null;
            return problem is null ? builder : null;
        }
        catch (Exception e) when (e is ArgumentException or FormatException or KeyNotFoundException or InvalidCastException)
        {
            problem = $"the PostgreSQL connection string cannot be read: {e.Message}";
            return null;
        }
    }

    private static string Describe(NpgsqlConnectionStringBuilder builder)
    {
        string schema = PostgresSchemaCreation.FirstSchema(builder.SearchPath) is { } s ? $" (schema {s})" : string.Empty;
        return $"postgresql://{builder.Username}@{builder.Host}:{builder.Port}/{builder.Database}{schema}";
    }
}
