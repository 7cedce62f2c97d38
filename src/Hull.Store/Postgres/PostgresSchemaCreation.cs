using Npgsql;

namespace Hull.Store.Postgres;

/// <summary>
/// The schema a connection works in (the first of its search path), created where missing. The store and the
/// cluster's membership tables may share one schema, and servers start together: every creator takes the same lock.
/// </summary>
public static class PostgresSchemaCreation
{
    /// <summary>The store's migration lock (an arbitrary constant of ours), also held while a schema is created.</summary>
    internal const long MigrationLockKey = 0x4855_4C4C_4D49_4752;

    /// <summary>The first schema of a search path ("hull" of "hull, public"), null when it names none.</summary>
    public static string? FirstSchema(string? searchPath)
    {
        string? first = searchPath?.Split(',')[0].Trim().Trim('"');
        return string.IsNullOrEmpty(first) ? null : first;
    }

    /// <summary>
    /// Creates the first schema of <paramref name="searchPath"/> unless it exists, inside
    /// <paramref name="transaction"/>. CREATE SCHEMA IF NOT EXISTS alone is not safe when several servers start at once
    /// (two may both find it missing and one fails on the catalogue's unique key), so it runs under the migration lock,
    /// held until the transaction ends.
    /// </summary>
    public static void CreateFirstSchema(NpgsqlConnection connection, NpgsqlTransaction transaction, string? searchPath)
    {
        if (FirstSchema(searchPath) is not { } schema) return;
        using (NpgsqlCommand lockCommand = connection.Command(transaction, "SELECT pg_advisory_xact_lock(@k)").With("@k", MigrationLockKey))
        {
            lockCommand.ExecuteNonQuery();
        }

        using NpgsqlCommand create = connection.Command(transaction, $"CREATE SCHEMA IF NOT EXISTS {Quote(schema)}");
        create.ExecuteNonQuery();
    }

    private static string Quote(string name) => "\"" + name.Replace("\"", "\"\"", StringComparison.Ordinal) + "\"";
}
