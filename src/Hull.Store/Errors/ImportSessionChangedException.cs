namespace Hull.Store;

/// <summary>
/// A commit was refused because rows were staged into the session after the caller checked it: committing them
/// would write rows nobody checked. Nothing was written and the session stays open.
/// </summary>
public sealed class ImportSessionChangedException : StoreException
{
    public ImportSessionChangedException(string sessionId, long checkedCount, long stagedCount)
        : base($"import session '{sessionId}' received more entries while its commit was being checked ({checkedCount} checked, "
            + $"{stagedCount} staged); nothing was written and the session is still open; commit again once every batch is staged")
    {
        SessionId = sessionId;
    }

    /// <summary>The session that was to be committed.</summary>
    public string SessionId { get; }
}
