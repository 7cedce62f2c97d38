namespace Hull.Store.Postgres;

/// <summary>
/// The generation in <c>store_commits</c>, which every write transaction of every process increments before it
/// commits: it reads differently after anyone's commit, as soon as the commit has returned. One primary-key read on
/// a pooled connection. (A LISTEN/NOTIFY signal would save that read, but arrives some time after the commit, so a
/// question asked right after another server's import could be answered from before it.)
/// </summary>
internal sealed class CommitGenerationSignal(PostgresDatasetStore store) : ICommitSignal
{
    public long Read() => store.ReadCommitGeneration();

    public void Dispose()
    {
    }
}
