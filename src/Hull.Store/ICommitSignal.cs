namespace Hull.Store;

/// <summary>
/// A number that reads differently after anyone has committed to the store since it was last read (this store,
/// another store on the same data, another process). What <see cref="LatestVersionMemory"/> watches.
/// </summary>
internal interface ICommitSignal : IDisposable
{
    long Read();
}
