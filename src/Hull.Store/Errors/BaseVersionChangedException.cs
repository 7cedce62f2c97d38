namespace Hull.Store;

/// <summary>
/// An import was refused because the dataset's latest version is no longer the one the caller checked the batch
/// against: another writer (another server on the same store) committed or deleted a version in the meantime.
/// Nothing was written; check the batch again against the new latest version and retry.
/// </summary>
public sealed class BaseVersionChangedException : StoreException
{
    public BaseVersionChangedException(string datasetName, long checkedVersion, long latestVersion)
        : base($"dataset '{datasetName}' moved from version {checkedVersion} to {latestVersion} while the import was being checked; nothing was written")
    {
        DatasetName = datasetName;
        CheckedVersion = checkedVersion;
        LatestVersion = latestVersion;
    }

    public string DatasetName { get; }

    public long CheckedVersion { get; }

    public long LatestVersion { get; }
}
