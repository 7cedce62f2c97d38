namespace Hull.Store;

/// <summary>A dataset's latest live version, with the key that tells this dataset from any other of the same name.</summary>
/// <param name="DatasetKey">A number that names this dataset and no other, ever: a dataset deleted and created again
/// under the same name gets a new one. Memories of versions are keyed by it, since version numbers start again at 1.</param>
/// <param name="Version">The latest live version, or <see cref="IDatasetStore.NoVersion"/>.</param>
public readonly record struct DatasetLatest(long DatasetKey, long Version);
