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

    // Bits of the number read that carry this process's commit count; the count of data_version changes sits above
    // them. 2^40 local commits between two reads would be needed for two different states to read the same.
    private const int LocalBits = 40;
    private const long LocalMask = (1L << LocalBits) - 1;

    private readonly object _gate = new();
    private readonly SqliteConnection _watch;
    private readonly SqliteCommand _dataVersion;
    private readonly LocalCounter _localCommits;
    private readonly long _windowTicks;
    // The last data_version answer, replaced whole (never changed in place) so that questions inside the window
    // read it without a lock; null until the first question.
    private Check? _lastCheck;

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

    /// <summary>
    /// Lock-free inside the window (two memory reads and a clock read): every concurrent question of a busy server
    /// asks this, pinned ones too, so a lock here made them queue behind each other.
    /// </summary>
    public long Read()
    {
        // The local count is read first: a commit of this process that the number does not show yet happened after
        // this question began, so the caller's read of the tables may or may not see it, and the next question will.
        long local = Volatile.Read(ref _localCommits.Value);
        Check? check = Volatile.Read(ref _lastCheck);
        if (check is null || Stopwatch.GetTimestamp() - check.CheckedAt >= _windowTicks) check = Recheck();
        return (check.Changes << LocalBits) | (local & LocalMask);
    }

    // Asks data_version again, one thread at a time; a thread that waited finds the answer another has just given.
    private Check Recheck()
    {
        lock (_gate)
        {
            Check? last = _lastCheck;
            long now = Stopwatch.GetTimestamp();
            if (last is not null && now - last.CheckedAt < _windowTicks) return last;
            // The time is taken before asking: the answer stands for the state at that moment or later.
            long dataVersion = (long)_dataVersion.ExecuteScalar()!;
            long changes = last is null ? 0 : last.Changes + (dataVersion == last.DataVersion ? 0 : 1);
            var check = new Check(dataVersion, now, changes);
            Volatile.Write(ref _lastCheck, check);
            return check;
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

    /// <summary>One data_version answer, when it was asked (stopwatch ticks) and how many changes have been seen.</summary>
    private sealed record Check(long DataVersion, long CheckedAt, long Changes);

    /// <summary>A counter shared by the stores of this process on one file.</summary>
    private sealed class LocalCounter
    {
        public long Value;
    }
}
