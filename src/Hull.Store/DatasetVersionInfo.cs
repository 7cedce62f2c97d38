namespace Hull.Store;

/// <summary>One dataset version and the provenance of the batch that created it.</summary>
/// <param name="Version">Version number; numbers are never reused within a dataset, even after deletion.</param>
/// <param name="CommittedAtUtc">When the batch was committed (UTC).</param>
/// <param name="SourceLabel">The batch's source label.</param>
/// <param name="Note">The batch's note.</param>
/// <param name="BatchEntryCount">Rows in the batch (inserted + replaced).</param>
/// <param name="Inserted">Rows that added a new id.</param>
/// <param name="Replaced">Rows that replaced an existing id.</param>
/// <param name="EntryCount">Entries visible at this version.</param>
public sealed record DatasetVersionInfo(
    long Version,
    DateTimeOffset CommittedAtUtc,
    string SourceLabel,
    string Note,
    int BatchEntryCount,
    int Inserted,
    int Replaced,
    long EntryCount);
