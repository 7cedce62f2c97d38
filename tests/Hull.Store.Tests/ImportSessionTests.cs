using Hull.Store.Tests.Backends;
namespace Hull.Store.Tests;

/// <summary>Import sessions: many staged batches become one version at commit; a cancel or a lapse leaves nothing.</summary>
public abstract class ImportSessionTests : IDisposable
{
    private static readonly TimeSpan Idle = TimeSpan.FromMinutes(10);
    private readonly StoreLocation _directory;
    private readonly SetClock _clock = new();
    private readonly IDatasetStore _store;

    protected ImportSessionTests(StoreBackend backend)
    {
        _directory = backend.NewLocation();
        _store = _directory.Open(_clock);
        _store.CreateDataset("d");
    }

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    [Fact]
    public void Staged_batches_are_invisible_until_the_commit_makes_them_one_version()
    {
        _store.ImportBatch("d", Rows.Many("old", 3), DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, new BatchProvenance("big.csv", "n"), Idle);
        var all = new List<EntryRow>();
        for (int b = 0; b < 5; b++)
        {
            IReadOnlyList<EntryRow> batch = Rows.Many($"b{b}-", 100);
            all.AddRange(batch);
            Assert.Equal((b + 1) * 100L, _store.StageBatch(session.SessionId, batch, Idle).StagedCount);
            Assert.Equal(1, _store.GetLatestVersion("d"));
            Assert.Equal(3, _store.GetEntries("d").Count);
        }

        ImportResult result = _store.CommitImport(session.SessionId);

        Assert.Equal(new ImportResult(2, 500, 0), result);
        DatasetVersionInfo version = _store.ListVersions("d")[^1];
        Assert.Equal((2L, 500, 503L, "big.csv"), (version.Version, version.BatchEntryCount, version.EntryCount, version.SourceLabel));
        Rows.AssertSame(Rows.Sorted([.. Rows.Many("old", 3), .. all]), _store.GetEntries("d", 2));
        Rows.AssertSame(Rows.Many("old", 3), _store.GetEntries("d", 1));
        Assert.Equal(0, _store.CountStagedRows());
        Assert.Throws<ImportSessionNotFoundException>(() => _store.CommitImport(session.SessionId));
    }

    [Fact]
    public void A_cancelled_session_leaves_no_version_and_no_row()
    {
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Idle);
        _store.StageBatch(session.SessionId, Rows.Many("a", 50), Idle);

        _store.CancelImport(session.SessionId);

        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("d"));
        Assert.Empty(_store.ListVersions("d"));
        Assert.Equal(0, _store.CountStagedRows());
        var e = Assert.Throws<ImportSessionNotFoundException>(() => _store.StageBatch(session.SessionId, Rows.Many("b", 1), Idle));
        Assert.False(e.Expired);
    }

    [Fact]
    public void A_session_lapses_after_its_idle_time_and_the_sweep_removes_its_rows()
    {
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, TimeSpan.FromSeconds(60));
        _clock.Now += TimeSpan.FromSeconds(50);
        // Each call starts the wait again: 50 s + 50 s is past the first expiry but not the renewed one.
        _store.StageBatch(session.SessionId, Rows.Many("a", 20), TimeSpan.FromSeconds(60));
        _clock.Now += TimeSpan.FromSeconds(50);
        Assert.Equal(0, _store.RemoveExpiredImports());
        Assert.Single(_store.ListImports("d"));

        _clock.Now += TimeSpan.FromSeconds(11);
        var lapsed = Assert.Throws<ImportSessionNotFoundException>(() => _store.CommitImport(session.SessionId));
        Assert.True(lapsed.Expired);
        Assert.Contains("expired", lapsed.Message);
        Assert.Equal(20, _store.CountStagedRows());

        Assert.Equal(1, _store.RemoveExpiredImports());
        Assert.Equal(0, _store.CountStagedRows());
        Assert.Empty(_store.ListImports("d"));
        Assert.Empty(_store.ListVersions("d"));
    }

    [Fact]
    public void Two_sessions_on_one_dataset_commit_in_commit_order_each_on_the_latest_version()
    {
        ImportSessionInfo first = _store.BeginImport("d", DuplicatePolicy.Reject, new BatchProvenance("first", ""), Idle);
        ImportSessionInfo second = _store.BeginImport("d", DuplicatePolicy.Reject, new BatchProvenance("second", ""), Idle);
        _store.StageBatch(first.SessionId, Rows.Many("f", 10), Idle);
        _store.StageBatch(second.SessionId, Rows.Many("s", 7), Idle);

        // The session begun second commits first and gets the first number.
        Assert.Equal(1, _store.CommitImport(second.SessionId).NewVersion);
        Assert.Equal(2, _store.CommitImport(first.SessionId).NewVersion);

        Assert.Equal(7, _store.GetEntries("d", 1).Count);
        Assert.Equal(17, _store.GetEntries("d", 2).Count);
        Assert.Equal(["second", "first"], _store.ListVersions("d").Select(v => v.SourceLabel));
    }

    [Fact]
    public void Under_reject_an_id_committed_by_another_session_meanwhile_fails_the_later_commit_and_writes_nothing()
    {
        ImportSessionInfo first = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Idle);
        ImportSessionInfo second = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Idle);
        _store.StageBatch(first.SessionId, [Rows.Make("x0"), Rows.Make("shared")], Idle);
        _store.StageBatch(second.SessionId, [Rows.Make("shared", -9)], Idle);
        _store.CommitImport(second.SessionId);

        var e = Assert.Throws<DuplicateEntryException>(() => _store.CommitImport(first.SessionId));

        Assert.Equal((1, "shared", 1L), (e.RowIndex, e.EntryId, e.ExistingVersion));
        Assert.Single(_store.ListVersions("d"));
        // The refused session stays open; cancelling it removes its rows.
        Assert.Equal(2, _store.ListImports("d").Single().StagedCount);
        _store.CancelImport(first.SessionId);
        Assert.Equal(0, _store.CountStagedRows());
    }

    [Fact]
    public void Under_replace_the_commit_supersedes_stored_ids_and_earlier_versions_read_as_before()
    {
        _store.ImportBatch("d", [Rows.Make("a", -1), Rows.Make("b", -2)], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Idle);
        _store.StageBatch(session.SessionId, [Rows.Make("b", -5)], Idle);
        _store.StageBatch(session.SessionId, [Rows.Make("c", -3)], Idle);

        Assert.Equal(new ImportResult(2, 1, 1), _store.CommitImport(session.SessionId));

        Rows.AssertSame([Rows.Make("a", -1), Rows.Make("b", -5), Rows.Make("c", -3)], _store.GetEntries("d", 2));
        Rows.AssertSame([Rows.Make("a", -1), Rows.Make("b", -2)], _store.GetEntries("d", 1));
        Assert.Equal(3, _store.ListVersions("d")[^1].EntryCount);
    }

    [Fact]
    public void A_repeated_or_stored_id_fails_the_commit_naming_its_place_in_the_session_and_writes_nothing()
    {
        _store.ImportBatch("d", [Rows.Make("stored")], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo repeats = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Idle);
        _store.StageBatch(repeats.SessionId, [Rows.Make("p"), Rows.Make("q")], Idle);
        _store.StageBatch(repeats.SessionId, [Rows.Make("r"), Rows.Make("q")], Idle);

        var again = Assert.Throws<DuplicateEntryException>(() => _store.CommitImport(repeats.SessionId));
        Assert.Equal((3, "q", (int?)1), (again.RowIndex, again.EntryId, again.FirstRowIndex));
        Assert.Contains("repeats entry 2 of this import", again.Message);

        ImportSessionInfo clash = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Idle);
        _store.StageBatch(clash.SessionId, [Rows.Make("s"), Rows.Make("stored")], Idle);
        var stored = Assert.Throws<DuplicateEntryException>(() => _store.CommitImport(clash.SessionId));
        Assert.Equal((1, "stored", 1L), (stored.RowIndex, stored.EntryId, stored.ExistingVersion));

        Assert.Single(_store.ListVersions("d"));
        Rows.AssertSame([Rows.Make("stored")], _store.GetEntries("d"));
        Assert.Equal([4L, 2L], _store.ListImports("d").Select(s => s.StagedCount));
        _store.CancelImport(repeats.SessionId);
        _store.CancelImport(clash.SessionId);
        Assert.Equal(0, _store.CountStagedRows());
    }

    [Fact]
    public void Deleting_the_dataset_drops_its_open_sessions_and_an_empty_session_cannot_commit()
    {
        ImportSessionInfo empty = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Idle);
        Assert.Throws<InvalidBatchException>(() => _store.CommitImport(empty.SessionId));
        _store.StageBatch(empty.SessionId, Rows.Many("a", 5), Idle);

        _store.DeleteDataset("d");

        Assert.Equal(0, _store.CountStagedRows());
        Assert.Throws<ImportSessionNotFoundException>(() => _store.CommitImport(empty.SessionId));
        Assert.Throws<DatasetNotFoundException>(() => _store.BeginImport("nope", DuplicatePolicy.Reject, BatchProvenance.None, Idle));
    }

    /// <summary>A clock the test moves.</summary>
    private sealed class SetClock : TimeProvider
    {
        public DateTimeOffset Now { get; set; } = new(2000, 1, 1, 0, 0, 0, TimeSpan.Zero);

        public override DateTimeOffset GetUtcNow() => Now;
    }
    [Fact]
    public void The_staged_rows_read_back_in_staging_order_and_a_batch_staged_after_that_read_refuses_the_commit()
    {
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Idle);
        var first = new[] { Rows.Make("z", -0.0), Rows.Make("a", 1e300, "O2", "total_per_atom", "note") };
        _store.StageBatch(session.SessionId, first, Idle);
        _store.StageBatch(session.SessionId, Rows.Many("m", 2), Idle);

        StagedImport staged = _store.ReadStagedImport(session.SessionId);

        Assert.Equal(("d", DuplicatePolicy.Replace, 4L), (staged.Session.DatasetName, staged.Session.Policy, staged.Session.StagedCount));
        // Staging order, not id order; -0.0 reads back as the +0 the store keeps.
        Rows.AssertSame([Rows.Make("z", 0.0), first[1], .. Rows.Many("m", 2)], staged.Rows.Select(r => r.Row).ToList());
        Assert.Equal([0, 1, 2, 3], staged.Rows.Select(r => r.Index));
        // Asked for one basis, the rows keep their places in the whole session.
        StagedRow only = Assert.Single(_store.ReadStagedImport(session.SessionId, ["total_per_atom", "total_per_atom"]).Rows);
        Assert.Equal((1, "a"), (only.Index, only.Row.Id));
        Assert.Empty(_store.ReadStagedImport(session.SessionId, []).Rows);
        Assert.Equal(4, _store.ReadStagedImport(session.SessionId, []).Session.StagedCount);

        _store.StageBatch(session.SessionId, Rows.Many("late", 1), Idle);
        var changed = Assert.Throws<ImportSessionChangedException>(() => _store.CommitImport(session.SessionId, staged.Session.StagedCount));
        Assert.Contains("4 checked, 5 staged", changed.Message);
        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("d"));
        Assert.Equal(5, _store.CountStagedRows());

        Assert.Equal(new ImportResult(1, 5, 0), _store.CommitImport(session.SessionId, _store.ReadStagedImport(session.SessionId).Session.StagedCount));
        Assert.Throws<ImportSessionNotFoundException>(() => _store.ReadStagedImport(session.SessionId));
    }
}

public sealed class ImportSessionTestsOnSqlite() : ImportSessionTests(StoreBackend.Sqlite)
{
}

public sealed class ImportSessionTestsOnPostgres() : ImportSessionTests(StoreBackend.Postgres)
{
}
