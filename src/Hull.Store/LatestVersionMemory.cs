using System.Collections.Concurrent;

namespace Hull.Store;

/// <summary>
/// Remembers each dataset's latest live version (and its key, see <see cref="DatasetLatest"/>) for as
/// long as nothing has been committed to the store, by anyone.
/// The backend's <see cref="ICommitSignal"/> gives a number that differs after any commit (of this process or any
/// other); a remembered answer is kept with the signal it was read under and given again only while the signal
/// still reads the same. Repeated "latest" questions about an unchanged store thus cost one signal read, not a
/// read of the tables.
/// </summary>
internal sealed class LatestVersionMemory(ICommitSignal signal) : IDisposable
{
    // Lock-free: every question of a busy server passes here (pinned ones too, for the dataset's key).
    private readonly ConcurrentDictionary<string, (long Signal, DatasetLatest Latest)> _latest = new(StringComparer.Ordinal);

    /// <summary>
    /// The latest version of <paramref name="dataset"/>: remembered when no commit happened since it was read,
    /// otherwise read by <paramref name="read"/> (given the dataset's name, so that callers can pass one cached
    /// delegate instead of a new closure per question) and remembered. A failing read (no such dataset) is not
    /// remembered.
    /// </summary>
    public DatasetLatest Get(string dataset, Func<string, DatasetLatest> read)
    {
        long now = signal.Read();
        if (_latest.TryGetValue(dataset, out var remembered) && remembered.Signal == now) return remembered.Latest;
        // Read after the signal was taken: the answer is at least as new as the state the signal stands for, and a
        // commit after that changes the signal, which the next question sees.
        DatasetLatest latest = read(dataset);
        // Kept with the signal it was read under: an answer from before a commit can only be given again while the
        // signal reads as it did then, i.e. never once anyone has committed since. Two threads storing at once
        // leave one of their answers, each right for the signal kept with it.
        _latest[dataset] = (now, latest);
        return latest;
    }

    public void Dispose() => signal.Dispose();
}
