namespace Hull.Store;

/// <summary>
/// An import batch was refused and nothing was written. Names the row (0-based index in the batch), its id and
/// the field when the fault lies in one row.
/// </summary>
public class InvalidBatchException : StoreException
{
    public InvalidBatchException(string message, int? rowIndex = null, string? entryId = null, string? field = null)
        : base(message)
    {
        RowIndex = rowIndex;
        EntryId = entryId;
        Field = field;
    }

    /// <summary>0-based index of the offending row in the batch; null when the batch as a whole is at fault.</summary>
    public int? RowIndex { get; }

    /// <summary>Id of the offending row, when it has one.</summary>
    public string? EntryId { get; }

    /// <summary>Name of the offending field (as in <see cref="EntryRow"/>), when one field is at fault.</summary>
    public string? Field { get; }
}
