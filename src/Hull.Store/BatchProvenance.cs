namespace Hull.Store;

/// <summary>
/// Where a batch came from, as told by the caller. The Store adds the commit time (UTC) and the entry count.
/// </summary>
/// <param name="SourceLabel">Short label of the source, e.g. a file name or a client name; may be empty.</param>
/// <param name="Note">Free-text note; may be empty.</param>
public sealed record BatchProvenance(string SourceLabel, string Note)
{
    /// <summary>A provenance with no label and no note.</summary>
    public static BatchProvenance None { get; } = new(string.Empty, string.Empty);
}
