namespace Hull.Store;

/// <summary>No open import session has the given id: it never existed, was committed or cancelled, or lapsed.</summary>
public sealed class ImportSessionNotFoundException : StoreException
{
    public ImportSessionNotFoundException(string sessionId, bool expired)
        : base(expired
            ? $"import session '{sessionId}' expired and its staged rows were removed; nothing of it was written; start the import again"
            : $"no open import session '{sessionId}' (it was committed, cancelled or expired, or never existed); nothing of it is staged")
    {
        SessionId = sessionId;
        Expired = expired;
    }

    /// <summary>The id that was asked for.</summary>
    public string SessionId { get; }

    /// <summary>True when the session existed but had lapsed.</summary>
    public bool Expired { get; }
}
