using Npgsql;

namespace Hull.Server.Cluster;

/// <summary>
/// The membership tables, made by the first member that starts (not a store migration step: the store never reads
/// them, and a cluster may keep its membership in a database apart from the store). They live in the first schema
/// of the connection's search path, beside the store's tables when both share one connection.
/// </summary>
internal static class MembershipTableSchema
{
    // Any fixed number: members starting at once take this lock, so only one of them creates the tables.
    private const long CreationLock = 0x68756c6c_636c7573;

    public static async Task CreateAsync(NpgsqlConnection connection, string connectionString)
    {
        await using NpgsqlTransaction transaction = await connection.BeginTransactionAsync();
        // The schema under the store's own lock, since a store beside these tables may be creating it at this moment.
        Hull.Store.Postgres.PostgresSchemaCreation.CreateFirstSchema(connection, transaction, new NpgsqlConnectionStringBuilder(connectionString).SearchPath);
        var statements = new List<string> { $"SELECT pg_advisory_xact_lock({CreationLock})" };
        statements.Add(
            "CREATE TABLE IF NOT EXISTS cluster_membership_versions (cluster_id text COLLATE \"C\" PRIMARY KEY, version integer NOT NULL, etag bigint NOT NULL)");
        statements.Add(
            "CREATE TABLE IF NOT EXISTS cluster_members (cluster_id text COLLATE \"C\" NOT NULL, address text COLLATE \"C\" NOT NULL, " +
            "silo_name text NOT NULL, host_name text NOT NULL, role_name text NOT NULL, status integer NOT NULL, proxy_port integer NOT NULL, " +
            "update_zone integer NOT NULL, fault_zone integer NOT NULL, start_time timestamptz NOT NULL, i_am_alive_time timestamptz NOT NULL, " +
            "last_update_time timestamptz NOT NULL, suspect_times text NOT NULL, row_etag bigint NOT NULL, PRIMARY KEY (cluster_id, address))");
        foreach (string sql in statements)
        {
            await using var command = new NpgsqlCommand(sql, connection, transaction);
            await command.ExecuteNonQueryAsync();
        }

        await transaction.CommitAsync();
    }
}
