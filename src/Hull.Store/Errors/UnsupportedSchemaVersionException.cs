namespace Hull.Store;

/// <summary>The database was written by a newer build whose schema this build does not know; it is left untouched.</summary>
public sealed class UnsupportedSchemaVersionException : StoreException
{
    public UnsupportedSchemaVersionException(string databasePath, long foundVersion, long supportedVersion)
        : base($"database '{databasePath}' has schema version {foundVersion}, newer than the newest this build knows " +
               $"({supportedVersion}); open it with a newer build of the service. The file was not changed.")
    {
        DatabasePath = databasePath;
        FoundVersion = foundVersion;
        SupportedVersion = supportedVersion;
    }

    public string DatabasePath { get; }

    public long FoundVersion { get; }

    public long SupportedVersion { get; }
}
