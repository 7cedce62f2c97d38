using Hull.Store.Postgres;

namespace Hull.Store.CrashHost;

/// <summary>The host's store argument: a data directory (SQLite), or "postgresql:" and a connection string.</summary>
public static class HostStore
{
    public const string PostgresPrefix = "postgresql:";

    public static IDatasetStore Open(string argument) =>
        argument.StartsWith(PostgresPrefix, StringComparison.Ordinal)
            ? PostgresDatasetStore.Open(argument[PostgresPrefix.Length..])
            : DatasetStore.Open(argument);
}
