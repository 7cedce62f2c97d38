namespace Hull.Store;

/// <summary>A dataset with all its live versions (oldest first).</summary>
/// <param name="Summary">Name, description, latest version and its entry count.</param>
/// <param name="Versions">Every live version with its provenance, ascending.</param>
public sealed record DatasetDescription(DatasetSummary Summary, IReadOnlyList<DatasetVersionInfo> Versions);
