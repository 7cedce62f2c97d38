using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// Remembers each dataset's latest live version for as long as nothing has been committed to the database, by
/// anyone. A connection of its own that never writes asks SQLite's <c>PRAGMA data_version</c>, whose value changes
/// whenever another connection (of this process or any other) has committed since it was last asked; on a change
/// everything remembered is forgotten. Asking costs a read of the WAL index in shared memory, no query and no
/// transaction, so repeated "latest" questions about an unchanged dataset do not read the tables again.
/// </summary>
internal sealed class LatestVersionMemory : IDisposable
{
    private readonly object _gate = new();
    private readonly SqliteConnection _watch;
    private readonly SqliteCommand _dataVersion;
    private readonly Dictionary<string, long> _latest = new(StringComparer.Ordinal);
    private long _seen = long.MinValue;

    public LatestVersionMemory(ConnectionFactory connections)
    {
        _watch = connections.OpenUnpooled();
        _dataVersion = _watch.CreateCommand();
        _dataVersion.CommandText = "PRAGMA data_version";
    }

    /// <summary>
    /// The latest version of <paramref name="dataset"/>: remembered when no commit happened since it was read,
    /// otherwise read by <paramref name="read"/> (outside any lock, so reads still run side by side) and remembered.
    /// A failing read (no such dataset) is not remembered.
    /// </summary>
    public long Get(string dataset, Func<long> read)
    {
        long now;
        lock (_gate)
        {
            now = (long)_dataVersion.ExecuteScalar()!;
            if (now != _seen)
            {
                _latest.Clear();
                _seen = now;
            }
            else if (_latest.TryGetValue(dataset, out long remembered))
            {
                return remembered;
            }
        }
        // Read after the data version was taken: the answer is at least as new as the state it stands for, and a
        // commit after that changes the data version, which the next question sees.
        long version = read();
        lock (_gate)
        {
            if (_seen == now) _latest[dataset] = version;
        }
        return version;
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
