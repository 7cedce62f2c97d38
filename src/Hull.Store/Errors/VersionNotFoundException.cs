namespace Hull.Store;

/// <summary>The dataset exists but the requested version does not: never created, deleted, or no version yet.</summary>
public sealed class VersionNotFoundException : StoreException
{
    public VersionNotFoundException(string datasetName, long? version, string message)
        : base(message)
    {
        DatasetName = datasetName;
        Version = version;
    }

    /// <summary>The dataset asked about.</summary>
    public string DatasetName { get; }

    /// <summary>The version asked for; null when the latest was asked for and the dataset has no live version.</summary>
    public long? Version { get; }
}
