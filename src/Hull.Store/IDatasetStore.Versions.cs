namespace Hull.Store;

// Reading versions, deleting them, and their fingerprints. Rows come back exactly as imported, their temperature
// model (EntryRow.TemperatureModel) included: a model is versioned with its row (schema step 5 in every backend).
public partial interface IDatasetStore
{
    /// <summary>
    /// The latest live version, or <see cref="NoVersion"/> when the dataset has none. A backend may keep it in memory,
    /// but only until anyone (this store, another store or another process) commits a change.
    /// </summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    long GetLatestVersion(string datasetName);

    /// <summary>The latest live version with the dataset's key; remembered like <see cref="GetLatestVersion"/>.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    DatasetLatest GetLatest(string datasetName);

    /// <summary>Every live version with its provenance, oldest first.</summary>
    IReadOnlyList<DatasetVersionInfo> ListVersions(string datasetName);

    /// <summary>All entries visible at <paramref name="version"/> (the latest when null), ordered by <see cref="EntryIdOrder"/>.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="VersionNotFoundException">No such version, a deleted one, or (for null) no live version.</exception>
    IReadOnlyList<EntryRow> GetEntries(string datasetName, long? version = null);

    /// <summary>
    /// Up to <paramref name="limit"/> entries of a version with ids after <paramref name="afterId"/> (from the first
    /// when null), in <see cref="EntryIdOrder"/>. Read later pages with the returned version and NextAfterId.
    /// </summary>
    EntryPage GetEntries(string datasetName, long? version, string? afterId, int limit);

    /// <summary>The entry with <paramref name="entryId"/> at a version (the latest when null), or null when it has none.</summary>
    EntryRow? GetEntry(string datasetName, string entryId, long? version = null);

    /// <summary>The content fingerprint of a version (see <see cref="ContentFingerprint"/>).</summary>
    string GetFingerprint(string datasetName, long version);

    /// <summary>
    /// Deletes one version: it can no longer be read, and its number is never given again. Other versions read as
    /// before. When it is the latest live version, the next import builds on the live version before it.
    /// </summary>
    void DeleteVersion(string datasetName, long version);
}
