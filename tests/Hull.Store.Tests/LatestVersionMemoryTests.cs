using Hull.Store.Tests.Backends;
using System.Diagnostics;
using Hull.Store.CrashHost;

namespace Hull.Store.Tests;

/// <summary>
/// The latest version is kept in memory between commits (the backend's commit signal says when anyone committed):
/// every way a commit can happen must be seen by the next question, from this store, another store on the same
/// data, and another process (on SQLite, another process's commit once its 1 ms window has passed, which a writer
/// process's life always outlasts; see <see cref="SqliteCommitWindowTests"/> for the window itself).
/// </summary>
public abstract class LatestVersionMemoryTests : IDisposable
{
    private readonly StoreLocation _directory;
    private readonly IDatasetStore _store;

    protected LatestVersionMemoryTests(StoreBackend backend)
    {
        _directory = backend.NewLocation();
        _store = _directory.Open();
    }

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    [Fact]
    public void A_commit_by_another_process_is_seen_by_the_next_question()
    {
        string host = Path.Combine(AppContext.BaseDirectory, "Hull.Store.CrashHost.dll");
        RunWriter(host, batches: 1);
        Assert.Equal(1, _store.GetLatestVersion(CrashBatches.DatasetName));
        Assert.Equal(1, _store.GetLatestVersion(CrashBatches.DatasetName));

        // The host continues from version 1 and commits versions 2 and 3 in its own process.
        RunWriter(host, batches: 3);
        Assert.Equal(3, _store.GetLatestVersion(CrashBatches.DatasetName));
        Assert.Equal(3, _store.GetEntries(CrashBatches.DatasetName).Count / 4);
    }

    [Fact]
    public void Imports_deletions_and_sessions_through_this_or_another_store_are_seen()
    {
        _store.CreateDataset("d");
        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("d"));
        _store.ImportBatch("d", Rows.Many("a", 2), DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(1, _store.GetLatestVersion("d"));

        using (var other = _directory.Open())
        {
            Assert.Equal(1, other.GetLatestVersion("d"));
            other.ImportBatch("d", Rows.Many("b", 2), DuplicatePolicy.Reject, BatchProvenance.None);
            Assert.Equal(2, _store.GetLatestVersion("d"));
            Assert.Equal(2, other.GetLatestVersion("d"));
        }

        // A session's staged batches are commits too, but no version: the latest stays until the session commits.
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, TimeSpan.FromMinutes(5));
        _store.StageBatch(session.SessionId, Rows.Many("c", 3), TimeSpan.FromMinutes(5));
        Assert.Equal(2, _store.GetLatestVersion("d"));
        _store.CommitImport(session.SessionId);
        Assert.Equal(3, _store.GetLatestVersion("d"));

        _store.DeleteVersion("d", 3);
        Assert.Equal(2, _store.GetLatestVersion("d"));

        _store.DeleteDataset("d");
        Assert.Throws<DatasetNotFoundException>(() => _store.GetLatestVersion("d"));
    }

    private void RunWriter(string host, int batches)
    {
        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string argument in new[] { host, _directory.HostArgument, $"{batches}", "4" }) start.ArgumentList.Add(argument);
        using var process = Process.Start(start)!;
        string output = process.StandardOutput.ReadToEnd();
        string errors = process.StandardError.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"writer process failed ({process.ExitCode}): {errors}\n{output}");
    }
}

public sealed class LatestVersionMemoryTestsOnSqlite() : LatestVersionMemoryTests(StoreBackend.Sqlite)
{
}

public sealed class LatestVersionMemoryTestsOnPostgres() : LatestVersionMemoryTests(StoreBackend.Postgres)
{
}

/// <summary>
/// SQLite asks <c>PRAGMA data_version</c> at most once per window: inside it another process's commit goes unseen,
/// while any commit through a store of this process is seen at once by every store of it on the file.
/// </summary>
public sealed class SqliteCommitWindowTests : IDisposable
{
    /// <summary>A window no test outlasts: whatever such a store sees at once, it saw without asking SQLite again.</summary>
    private static readonly TimeSpan Hour = TimeSpan.FromHours(1);

    private readonly TempDirectory _directory = new();
    private readonly DatasetStore _store;

    public SqliteCommitWindowTests() => _store = DatasetStore.Open(_directory.Path, clock: null, Hour);

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    [Fact]
    public void Within_the_window_another_process_commit_goes_unseen_until_this_process_commits()
    {
        string host = Path.Combine(AppContext.BaseDirectory, "Hull.Store.CrashHost.dll");
        RunWriter(host, batches: 1);
        Assert.Equal(1, _store.GetLatestVersion(CrashBatches.DatasetName));

        // Inside the (hour-long) window SQLite is not asked again: the other process's versions 2 and 3 stay
        // unseen, which is the bound the window documents, while a store with the default window sees them.
        RunWriter(host, batches: 3);
        Assert.Equal(1, _store.GetLatestVersion(CrashBatches.DatasetName));
        using (DatasetStore fresh = DatasetStore.Open(_directory.Path))
        {
            Assert.Equal(3, fresh.GetLatestVersion(CrashBatches.DatasetName));

            // A commit through any store of this process clears what every store of it on the file remembers.
            fresh.CreateDataset("elsewhere");
        }

        Assert.Equal(3, _store.GetLatestVersion(CrashBatches.DatasetName));
    }

    private void RunWriter(string host, int batches)
    {
        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string argument in new[] { host, _directory.Path, $"{batches}", "4" }) start.ArgumentList.Add(argument);
        using var process = Process.Start(start)!;
        string output = process.StandardOutput.ReadToEnd();
        string errors = process.StandardError.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"writer process failed ({process.ExitCode}): {errors}\n{output}");
    }
}
