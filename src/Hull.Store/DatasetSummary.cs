namespace Hull.Store;

/// <summary>A dataset as listed.</summary>
/// <param name="Name">Dataset name.</param>
/// <param name="Description">Free-text description.</param>
/// <param name="CreatedAtUtc">When the dataset was created (UTC).</param>
/// <param name="LatestVersion">Latest live version, or <see cref="DatasetStore.NoVersion"/> when there is none.</param>
/// <param name="EntryCount">Entries visible at the latest version (0 when there is none).</param>
public sealed record DatasetSummary(
    string Name,
    string Description,
    DateTimeOffset CreatedAtUtc,
    long LatestVersion,
    long EntryCount);
