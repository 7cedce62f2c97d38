using System.Collections.Concurrent;
using System.Diagnostics;
using Microsoft.Data.Sqlite;

namespace Hull.Store.Sqlite;

/// <summary>
/// The SQLite store's commit signal, from two sources:
/// <list type="bullet">
/// <item>a commit by any store of this process on the same file bumps a counter shared by every signal on that
/// file (<see cref="CommittedHere"/>; one memory read per question), so such a commit is seen by the very next
/// question;</item>
/// <item>a commit by another process shows in SQLite's <c>PRAGMA data_version</c>, asked on a connection of its
/// own that never writes. Asking takes SQLite's read locks on the WAL index (system calls), a few microseconds of
/// CPU that used to be spent on every question, under a lock every concurrent question queued behind whenever the
/// asking thread was descheduled; so it is asked at most once per <see cref="CrossProcessWindow"/>, and another
/// process's commit is seen within that window.</item>
/// </list>
/// The number read changes whenever either source has.
/// </summary>
internal sealed class DataVersionSignal : ICommitSignal
{
    /// <summary>
    /// How long a <c>PRAGMA data_version</c> answer stands for "no other process has committed": a millisecond is
    /// far below what a client can notice across processes (it must get another server's answer and send a new
    /// question in between), and amortises the check over the tens of questions a busy server answers in it.
    /// </summary>
    public static readonly TimeSpan DefaultCrossProcessWindow = TimeSpan.FromMilliseconds(1);

    // Commits made through any store of this process, per database file.
    private static readonly ConcurrentDictionary<string, LocalCounter> LocalCommits = new(StringComparer.Ordinal);

    private readonly object _gate = new();
    private readonly SqliteConnection _watch;
    private readonly SqliteCommand _dataVersion;
    private readonly LocalCounter _localCommits;
    private readonly long _windowTicks;
    private long _seenDataVersion = long.MinValue;
    private long _seenLocalCommits = long.MinValue;
    private long _checkedAt;
    private long _generation;

    public DataVersionSignal(ConnectionFactory connections, TimeSpan crossProcessWindow)
    {
        _watch = connections.OpenUnpooled();
        _dataVersion = _watch.CreateCommand();
        _dataVersion.CommandText = "PRAGMA data_version";
        _localCommits = LocalCommits.GetOrAdd(connections.DatabasePath, _ => new LocalCounter());
        _windowTicks = (long)(crossProcessWindow.TotalSeconds * Stopwatch.Frequency);
        CrossProcessWindow = crossProcessWindow;
    }

    /// <summary>How long another process's commit may go unseen.</summary>
    public TimeSpan CrossProcessWindow { get; }

    /// <summary>Called by a store of this process after each of its commits to the file.</summary>
    public void CommittedHere() => Interlocked.Increment(ref _localCommits.Value);

    public long Read()
    {
        lock (_gate)
        {
            long local = Volatile.Read(ref _localCommits.Value);
            if (local != _seenLocalCommits)
            {
                _seenLocalCommits = local;
                _generation++;
            }

            long now = Stopwatch.GetTimestamp();
            if (now - _checkedAt >= _windowTicks || _seenDataVersion == long.MinValue)
            {
                // The time is taken before asking: the answer stands for the state at that moment or later.
                long dataVersion = (long)_dataVersion.ExecuteScalar()!;
                if (dataVersion != _seenDataVersion)
                {
                    _seenDataVersion = dataVersion;
                    _generation++;
                }

                _checkedAt = now;
            }

            return _generation;
        }
    }

    public void Dispose()
    {
        lock (_gate)
        {
            _dataVersion.Dispose();
            _watch.Dispose();
        }
    }

    /// <summary>A counter shared by the stores of this process on one file.</summary>
    private sealed class LocalCounter
    {
        public long Value;
    }
}
