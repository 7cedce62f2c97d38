using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>Brings a database file to the schema this build uses, one recorded step per transaction.</summary>
internal static class SchemaMigrator
{
    // SQLite's result code for "file is not a database".
    private const int SqliteNotADatabase = 26;

    /// <summary>
    /// Creates or upgrades the schema up to <paramref name="targetVersion"/> and sets WAL mode. Refuses, before writing
    /// anything, a file whose schema is newer than this build knows.
    /// </summary>
    public static void Migrate(SqliteConnection connection, string databasePath, TimeProvider clock, int targetVersion)
    {
        if (targetVersion < 1 || targetVersion > Schema.LatestVersion)
        {
            throw new ArgumentOutOfRangeException(nameof(targetVersion), targetVersion, $"schema versions run from 1 to {Schema.LatestVersion}");
        }

        try
        {
            using (var probe = connection.BeginTransaction(deferred: true))
            {
                long found = ReadVersion(connection, probe, databasePath);
                if (found > Schema.LatestVersion) throw new UnsupportedSchemaVersionException(databasePath, found, Schema.LatestVersion);
                probe.Commit();
            }

            SetWriteAheadLog(connection, databasePath);

            while (true)
            {
                using var transaction = connection.BeginTransaction(deferred: false);
                // Read again under the write lock: another process may have migrated meanwhile.
                long current = ReadVersion(connection, transaction, databasePath);
                if (current > Schema.LatestVersion) throw new UnsupportedSchemaVersionException(databasePath, current, Schema.LatestVersion);
                if (current >= targetVersion)
                {
                    transaction.Commit();
                    return;
                }

                Migration step = Migration.NextAfter(Schema.Migrations, current);
                if (step.Version > targetVersion)
                {
                    transaction.Commit();
                    return;
                }
                using (var command = connection.CreateCommand())
                {
                    command.Transaction = transaction;
                    command.CommandText = step.Sql;
                    command.ExecuteNonQuery();
                    command.CommandText = "INSERT INTO schema_version (version, description, applied_at_utc) VALUES ($v, $d, $t)";
                    command.Parameters.AddWithValue("$v", step.Version);
                    command.Parameters.AddWithValue("$d", step.Description);
                    command.Parameters.AddWithValue("$t", UtcText.Write(clock.GetUtcNow()));
                    command.ExecuteNonQuery();
                }
                transaction.Commit();
            }
        }
        catch (SqliteException e) when (e.SqliteErrorCode == SqliteNotADatabase)
        {
            throw new StoreCorruptException(databasePath, "the file is not an SQLite database", e);
        }
    }

    /// <summary>The schema version recorded in the file: 0 for an empty file, else the highest step applied.</summary>
    public static long ReadVersion(SqliteConnection connection, SqliteTransaction transaction, string databasePath)
    {
        using var command = connection.CreateCommand();
        command.Transaction = transaction;
        command.CommandText = "SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = 'schema_version'";
        if ((long)command.ExecuteScalar()! == 0)
        {
            command.CommandText = "SELECT count(*) FROM sqlite_master WHERE name NOT LIKE 'sqlite%'";
            if ((long)command.ExecuteScalar()! != 0)
            {
                throw new StoreCorruptException(databasePath, "it has tables but no schema_version table, so it is not a dataset store");
            }
            return 0;
        }
        command.CommandText = "SELECT max(version) FROM schema_version";
        object? max = command.ExecuteScalar();
        if (max is not long version) throw new StoreCorruptException(databasePath, "its schema_version table is empty");
        return version;
    }

    // WAL lets readers go on while one writer commits, and a commit is one append to the log: a killed process
    // leaves either the whole transaction in the log or none of it. The mode is stored in the file.
    private static void SetWriteAheadLog(SqliteConnection connection, string databasePath)
    {
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA journal_mode = WAL";
        string? mode = command.ExecuteScalar() as string;
        if (!string.Equals(mode, "wal", StringComparison.OrdinalIgnoreCase))
        {
            throw new StoreCorruptException(databasePath, $"SQLite refused write-ahead logging (journal mode is '{mode}')");
        }
    }
}
