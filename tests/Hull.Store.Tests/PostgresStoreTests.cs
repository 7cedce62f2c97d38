using Hull.Store.Postgres;
using Hull.Store.Sqlite;
using Hull.Store.Tests.Backends;
using Npgsql;

namespace Hull.Store.Tests;

/// <summary>What only the PostgreSQL backend has: its own schema list, its schema checks, health and an unreachable server.</summary>
public sealed class PostgresStoreTests
{
    [Fact]
    public void Both_backends_number_and_describe_their_schema_steps_alike()
    {
        Assert.Equal(Schema.Migrations.Select(m => (m.Version, m.Description)), PostgresSchema.Migrations.Select(m => (m.Version, m.Description)));
    }

    [Fact]
    public void A_fresh_schema_is_created_and_migrated_once_by_stores_opening_together()
    {
        string connection = PostgresTestCluster.NewSchema("open");
        PostgresDatasetStore[] stores = [.. Enumerable.Range(0, 4).AsParallel().Select(_ => PostgresDatasetStore.Open(connection))];
        try
        {
            Assert.Equal(PostgresSchema.Migrations.Select(m => m.Version), Query<int>(connection, "SELECT version FROM schema_version ORDER BY version"));
            Assert.All(stores, s => Assert.True(s.CheckHealth(out string? problem), problem));
            Assert.Contains("schema t_open_", stores[0].Location);
            Assert.DoesNotContain("assword", stores[0].Location);
        }
        finally
        {
            foreach (PostgresDatasetStore store in stores) store.Dispose();
        }
    }

    [Fact]
    public void A_newer_schema_is_refused_untouched()
    {
        string connection = PostgresTestCluster.NewSchema("newer");
        PostgresDatasetStore.Open(connection).Dispose();
        Execute(connection, "INSERT INTO schema_version VALUES (99, 'from a later build', '2099-01-01T00:00:00.0000000Z')");
        var e = Assert.Throws<UnsupportedSchemaVersionException>(() => PostgresDatasetStore.Open(connection));
        Assert.Equal(99, e.FoundVersion);
        Assert.Equal(PostgresSchema.LatestVersion, e.SupportedVersion);
        Assert.Equal(PostgresSchema.Migrations.Count + 1, Query<int>(connection, "SELECT version FROM schema_version").Count);
    }

    [Fact]
    public void A_schema_holding_other_tables_is_not_taken_for_a_store()
    {
        string connection = PostgresTestCluster.NewSchema("foreign");
        PostgresDatasetStore.Open(connection).Dispose();
        Execute(connection, "DROP TABLE schema_version");
        var e = Assert.Throws<StoreCorruptException>(() => PostgresDatasetStore.Open(connection));
        Assert.Contains("no schema_version table", e.Message);
    }

    [Fact]
    public void Health_says_what_is_wrong()
    {
        string connection = PostgresTestCluster.NewSchema("health");
        using PostgresDatasetStore store = PostgresDatasetStore.Open(connection);
        Assert.True(store.CheckHealth(out string? problem), problem);
        Execute(connection, "DROP TABLE schema_version");
        Assert.False(store.CheckHealth(out problem));
        Assert.Contains("no schema_version table", problem);
    }

    [Fact]
    public void An_unreachable_server_is_a_store_error_that_names_it()
    {
        // A loopback port nothing listens on: bound and released at once.
        using var probe = new System.Net.Sockets.TcpListener(System.Net.IPAddress.Loopback, 0);
        probe.Start();
        int port = ((System.Net.IPEndPoint)probe.LocalEndpoint).Port;
        probe.Stop();
        var e = Assert.Throws<StoreUnavailableException>(() =>
            PostgresDatasetStore.Open($"Host=127.0.0.1;Port={port};Username=hull;Password=secret;Database=postgres;Timeout=3"));
        Assert.Contains($"postgresql://hull@127.0.0.1:{port}/postgres", e.Message);
        Assert.DoesNotContain("secret", e.Message);
    }

    [Fact]
    public void An_unreadable_connection_string_says_so()
    {
        var e = Assert.Throws<ArgumentException>(() => PostgresDatasetStore.Open("Host=127.0.0.1;Colour=blue"));
        Assert.Contains("connection string cannot be read", e.Message);
    }

    private static void Execute(string connectionString, string sql)
    {
        using var connection = new NpgsqlConnection(connectionString);
        connection.Open();
        using var command = new NpgsqlCommand(sql, connection);
        command.ExecuteNonQuery();
    }

    private static List<T> Query<T>(string connectionString, string sql)
    {
        using var connection = new NpgsqlConnection(connectionString);
        connection.Open();
        using var command = new NpgsqlCommand(sql, connection);
        using NpgsqlDataReader reader = command.ExecuteReader();
        var result = new List<T>();
        while (reader.Read()) result.Add(reader.GetFieldValue<T>(0));
        return result;
    }
}
