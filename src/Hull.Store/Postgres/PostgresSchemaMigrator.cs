using Hull.Store.Sqlite;
using Npgsql;

namespace Hull.Store.Postgres;

/// <summary>Brings the store's schema (the first schema of the connection's search path) to this build's layout.</summary>
internal static class PostgresSchemaMigrator
{
    // Any number of servers may start at once on one database: the steps run under one advisory lock, so each
    // step runs once.
    private const long MigrationLockKey = PostgresSchemaCreation.MigrationLockKey;

    /// <summary>
    /// Creates or upgrades the schema, one recorded step per transaction. Refuses, before writing anything, a
    /// schema newer than this build knows, and a schema that holds tables but is not a store.
    /// </summary>
    public static void Migrate(NpgsqlConnection connection, string location, TimeProvider clock)
    {
        while (true)
        {
            using NpgsqlTransaction transaction = connection.BeginTransaction();
            using (NpgsqlCommand lockCommand = connection.Command(transaction, "SELECT pg_advisory_xact_lock(@k)").With("@k", MigrationLockKey))
            {
                lockCommand.ExecuteNonQuery();
            }
            long current = ReadVersion(connection, transaction, location);
            if (current > PostgresSchema.LatestVersion)
            {
                throw new UnsupportedSchemaVersionException(location, current, PostgresSchema.LatestVersion);
            }
            if (current == PostgresSchema.LatestVersion)
            {
                transaction.Commit();
                return;
            }

            Migration step = Migration.NextAfter(PostgresSchema.Migrations, current);
            connection.Execute(transaction, step.Sql);
            connection.Execute(transaction, "INSERT INTO schema_version (version, description, applied_at_utc) VALUES (@v, @d, @t)",
                ("@v", step.Version), ("@d", step.Description), ("@t", UtcText.Write(clock.GetUtcNow())));
            transaction.Commit();
        }
    }

    /// <summary>The schema version recorded: 0 for an empty schema, else the highest step applied.</summary>
    public static long ReadVersion(NpgsqlConnection connection, NpgsqlTransaction transaction, string location)
    {
        using (NpgsqlCommand schema = connection.Command(transaction, "SELECT current_schema()"))
        {
            if (schema.ExecuteScalar() is not string)
            {
                throw new StoreCorruptException(location, "no schema of the connection's search path exists to hold the store");
            }
        }
        using (NpgsqlCommand exists = connection.Command(transaction, "SELECT to_regclass(quote_ident(current_schema()) || '.schema_version') IS NOT NULL"))
        {
            if (!(bool)exists.ExecuteScalar()!)
            {
                using NpgsqlCommand tables = connection.Command(transaction,
                    "SELECT count(*) FROM pg_tables WHERE schemaname = current_schema()");
                if ((long)tables.ExecuteScalar()! != 0)
                {
                    throw new StoreCorruptException(location, "its schema has tables but no schema_version table, so it is not a dataset store");
                }
                return 0;
            }
        }
        using NpgsqlCommand max = connection.Command(transaction, "SELECT max(version) FROM schema_version");
        object? found = max.ExecuteScalar();
        if (found is not int version) throw new StoreCorruptException(location, "its schema_version table is empty");
        return version;
    }
}
