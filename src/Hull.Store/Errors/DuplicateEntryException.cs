namespace Hull.Store;

/// <summary>
/// A batch row repeats an id: either an earlier row of the same batch (<see cref="FirstRowIndex"/> set) or, under
/// <see cref="DuplicatePolicy.Reject"/>, an entry of the dataset's latest version (<see cref="ExistingVersion"/> set).
/// </summary>
public sealed class DuplicateEntryException : InvalidBatchException
{
    public DuplicateEntryException(string message, int rowIndex, string entryId, int? firstRowIndex, long? existingVersion)
        : base(message, rowIndex, entryId, nameof(EntryRow.Id))
    {
        FirstRowIndex = firstRowIndex;
        ExistingVersion = existingVersion;
    }

    /// <summary>The earlier row of the same batch with this id, when the repeat is inside the batch.</summary>
    public int? FirstRowIndex { get; }

    /// <summary>The latest version that already holds this id, when the repeat is against stored data.</summary>
    public long? ExistingVersion { get; }
}
