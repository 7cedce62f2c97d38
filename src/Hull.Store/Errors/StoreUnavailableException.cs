namespace Hull.Store;

/// <summary>
/// The store's database server cannot be reached, or went away during the call: nothing of the call was written
/// (a write is one transaction, which the database rolls back when its connection is lost). Worth retrying.
/// </summary>
public sealed class StoreUnavailableException : StoreException
{
    public StoreUnavailableException(string location, string problem, Exception? inner = null)
        : base($"the store at {location} is not reachable: {problem}", inner)
    {
        Location = location;
    }

    public string Location { get; }
}
