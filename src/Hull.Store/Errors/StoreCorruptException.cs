namespace Hull.Store;

/// <summary>The database file is not a store this build can use (not SQLite, or missing its schema table).</summary>
public sealed class StoreCorruptException : StoreException
{
    public StoreCorruptException(string databasePath, string problem, Exception? inner = null)
        : base($"database '{databasePath}' cannot be used: {problem}", inner)
    {
        DatabasePath = databasePath;
    }

    public string DatabasePath { get; }
}
