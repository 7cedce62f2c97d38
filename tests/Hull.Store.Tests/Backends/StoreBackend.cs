using System.Data.Common;
using Hull.Store.CrashHost;
using Microsoft.Data.Sqlite;
using Npgsql;
using Hull.Store.Postgres;


namespace Hull.Store.Tests.Backends;

/// <summary>
/// A kind of store the suite runs against. Each test class of the suite is abstract over it, with one concrete
/// class per backend (…OnSqlite, …OnPostgres), so every test runs on both and its name says which.
/// </summary>
public abstract class StoreBackend
{
    public static StoreBackend Sqlite { get; } = new SqliteBackend();

    public static StoreBackend Postgres { get; } = new PostgresBackend();

    /// <summary>A new, empty place for a store; opened as often as a test likes (reopening, two stores at once).</summary>
    public abstract StoreLocation NewLocation();

    private sealed class SqliteBackend : StoreBackend
    {
        public override StoreLocation NewLocation() => new SqliteLocation();
    }

    private sealed class PostgresBackend : StoreBackend
    {
        public override StoreLocation NewLocation() => new PostgresLocation(PostgresTestCluster.NewSchema("store"));
    }

    private sealed class SqliteLocation : StoreLocation
    {
        private readonly TempDirectory _directory = new();

        public override IDatasetStore Open(TimeProvider? clock = null) => DatasetStore.Open(_directory.Path, clock);

        public override string HostArgument => _directory.Path;

        public override DbConnection OpenRaw()
        {
            var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = _directory.DatabasePath, Pooling = false }.ToString());
            connection.Open();
            return connection;
        }

        public override void Dispose() => _directory.Dispose();
    }

    private sealed class PostgresLocation(string connectionString) : StoreLocation
    {
        public override IDatasetStore Open(TimeProvider? clock = null) => PostgresDatasetStore.Open(connectionString, clock);

        public override string HostArgument => HostStore.PostgresPrefix + connectionString;

        public override DbConnection OpenRaw()
        {
            var connection = new NpgsqlConnection(connectionString);
            connection.Open();
            return connection;
        }

        // The schema stays in the throwaway cluster, which goes as a whole.
        public override void Dispose()
        {
        }
    }
}

/// <summary>One store's place: a directory for SQLite, a schema for PostgreSQL.</summary>
public abstract class StoreLocation : IDisposable
{
    public abstract IDatasetStore Open(TimeProvider? clock = null);

    /// <summary>A plain connection to the store's tables (its schema, for PostgreSQL), for checks below the interface.</summary>
    public abstract DbConnection OpenRaw();

    /// <summary>The store argument of Hull.Store.CrashHost for this place.</summary>
    public abstract string HostArgument { get; }

    public abstract void Dispose();
}
