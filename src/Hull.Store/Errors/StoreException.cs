namespace Hull.Store;

/// <summary>Base of every error the Store reports about the caller's request or the database's state.</summary>
public abstract class StoreException : Exception
{
    protected StoreException(string message, Exception? inner = null) : base(message, inner)
    {
    }
}
