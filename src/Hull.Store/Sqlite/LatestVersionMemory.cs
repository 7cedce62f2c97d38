using System.Collections.Concurrent;
using System.Diagnostics;
using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// Remembers each dataset's latest live version until someone commits to the database. Two signals say so:
/// <list type="bullet">
/// <item>a commit by any store of this process on the same file bumps a counter that every memory on that file
/// reads (one memory read per question), so such a commit is seen by the very next question;</item>
/// <item>a commit by another process shows in SQLite's <c>PRAGMA data_version</c>, asked on a connection of its
/// own that never writes. Asking takes SQLite's read locks on the WAL index (system calls), a few microseconds
/// of CPU that used to be spent on every question and, worse, held a lock that every concurrent question queued
/// behind whenever the asking thread was descheduled; so it is asked at most once per
/// <see cref="CrossProcessWindow"/>, and another process's commit is seen within that window.</item>
/// </list>
/// On either signal everything remembered is forgotten.
/// </summary>
internal sealed class LatestVersionMemory : IDisposable
{
    /// <summary>
    /// How long a <c>PRAGMA data_version</c> answer stands for "no other process has committed": a millisecond is
    /// far below what a client can notice across processes (it must get another server's answer and send a new
    /// question in between), and amortises the check over the tens of questions a busy server answers in it.
    /// </summary>
    public static readonly TimeSpan DefaultCrossProcessWindow = TimeSpan.FromMilliseconds(1);

    // Commits made through any store of this process, per database file.
    private static readonly ConcurrentDictionary<string, StrongBox> LocalCommits = new(StringComparer.Ordinal);

    private readonly object _gate = new();
    private readonly SqliteConnection _watch;
    private readonly SqliteCommand _dataVersion;
    private readonly StrongBox _localCommits;
    private readonly long _windowTicks;
    private readonly Dictionary<string, long> _latest = new(StringComparer.Ordinal);
    private long _seenDataVersion = long.MinValue;
    private long _seenLocalCommits = long.MinValue;
    private long _checkedAt;
    // Bumped whenever the memory is cleared, so that a read begun before cannot be remembered after.
    private long _epoch;

    public LatestVersionMemory(ConnectionFactory connections, TimeSpan crossProcessWindow)
    {
        _watch = connections.OpenUnpooled();
        _dataVersion = _watch.CreateCommand();
        _dataVersion.CommandText = "PRAGMA data_version";
        _localCommits = LocalCommits.GetOrAdd(connections.DatabasePath, _ => new StrongBox());
        _windowTicks = (long)(crossProcessWindow.TotalSeconds * Stopwatch.Frequency);
        CrossProcessWindow = crossProcessWindow;
    }

    /// <summary>How long another process's commit may go unseen.</summary>
    public TimeSpan CrossProcessWindow { get; }

    /// <summary>Called by a store of this process after each of its commits to the file.</summary>
    public void CommittedHere() => Interlocked.Increment(ref _localCommits.Value);

    /// <summary>
    /// The latest version of <paramref name="dataset"/>: remembered when no commit is known since it was read,
    /// otherwise read by <paramref name="read"/> (outside any lock, so reads still run side by side) and remembered.
    /// A failing read (no such dataset) is not remembered.
    /// </summary>
    public long Get(string dataset, Func<string, long> read)
    {
        long epoch;
        lock (_gate)
        {
            long local = Volatile.Read(ref _localCommits.Value);
            if (local != _seenLocalCommits)
            {
                Forget();
                _seenLocalCommits = local;
            }

            long now = Stopwatch.GetTimestamp();
            if (now - _checkedAt >= _windowTicks || _seenDataVersion == long.MinValue)
            {
                // The time is taken before asking: the answer stands for the state at that moment or later.
                long dataVersion = (long)_dataVersion.ExecuteScalar()!;
                if (dataVersion != _seenDataVersion)
                {
                    Forget();
                    _seenDataVersion = dataVersion;
                }

                _checkedAt = now;
            }

            if (_latest.TryGetValue(dataset, out long remembered)) return remembered;
            epoch = _epoch;
        }

        // Read after both signals were taken: the answer is at least as new as the state they stand for, and a
        // commit after that changes a signal, which the next question sees.
        long version = read(dataset);
        lock (_gate)
        {
            if (_epoch == epoch) _latest[dataset] = version;
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

    private void Forget()
    {
        _latest.Clear();
        _epoch++;
    }

    /// <summary>A counter shared by the stores of this process on one file.</summary>
    private sealed class StrongBox
    {
        public long Value;
    }
}
