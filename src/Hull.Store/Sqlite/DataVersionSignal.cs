using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// SQLite's <c>PRAGMA data_version</c> on a connection of its own that never writes: its value changes whenever
/// another connection (of this process or any other) has committed since it was last asked. Asking costs a read of
/// the WAL index in shared memory, no query and no transaction.
/// </summary>
internal sealed class DataVersionSignal : ICommitSignal
{
    private readonly object _gate = new();
    private readonly SqliteConnection _watch;
    private readonly SqliteCommand _dataVersion;

    public DataVersionSignal(ConnectionFactory connections)
    {
        _watch = connections.OpenUnpooled();
        _dataVersion = _watch.CreateCommand();
        _dataVersion.CommandText = "PRAGMA data_version";
    }

    public long Read()
    {
        // One connection, used by one thread at a time.
        lock (_gate) return (long)_dataVersion.ExecuteScalar()!;
    }

    public void Dispose()
    {
        lock (_gate)
        {
            _dataVersion.Dispose();
            _watch.Dispose();
        }
    }
}
