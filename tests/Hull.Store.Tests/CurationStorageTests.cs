using Hull.Store.Tests.Backends;

namespace Hull.Store.Tests;

/// <summary>
/// Curated versions in the store: a session carrying a curation record commits exactly its staged rows as the new
/// version, with the record, in one transaction; cancelled or refused sessions leave neither; deleting the version
/// deletes its record. Run on every backend.
/// </summary>
public abstract class CurationStorageTests(StoreBackend backend) : IDisposable
{
    private static readonly TimeSpan Expiry = TimeSpan.FromMinutes(5);

    private readonly StoreLocation _location = backend.NewLocation();

    public void Dispose() => _location.Dispose();

    private static CurationRecord Record(IDatasetStore store, long source) =>
        new("d", source, store.GetFingerprint("d", source), """{"recipe_schema": 1, "steps": [{"kind": "drop_flagged", "flag": "flagged"}]}""",
            """[{"number": 1, "kind": "drop_flagged", "removed": 2}]""");

    [Fact]
    public void A_curated_commit_holds_exactly_the_staged_rows_and_its_record()
    {
        using IDatasetStore store = _location.Open();
        store.CreateDataset("d");
        IReadOnlyList<EntryRow> raw = Rows.Many("a", 5);
        store.ImportBatch("d", raw, DuplicatePolicy.Reject, BatchProvenance.None);
        store.ImportBatch("d", Rows.Many("b", 2), DuplicatePolicy.Reject, BatchProvenance.None);

        // Derived from version 1 while version 2 is the latest: the new version holds the staged rows, nothing of version 2.
        CurationRecord record = Record(store, 1);
        ImportSessionInfo session = store.BeginCuratedImport("d", record, new BatchProvenance("curated", "drop_flagged"), Expiry);
        EntryRow[] kept = [raw[0], raw[2], raw[4]];
        store.StageBatch(session.SessionId, kept, Expiry);
        ImportResult result = store.CommitImport(session.SessionId, 3);

        Assert.Equal(3, result.NewVersion);
        Rows.AssertSame(kept, store.GetEntries("d", 3), "derived version");
        Assert.Equal(3, store.ListVersions("d").Single(v => v.Version == 3).EntryCount);
        Assert.Equal(record, store.GetCurationRecord("d", 3));
        Assert.Null(store.GetCurationRecord("d", 1));
        Assert.Equal([3L], store.ListCurationRecords("d").Keys);
        // Older versions read as before; the curated content has the fingerprint of the same rows imported plainly.
        Rows.AssertSame(raw, store.GetEntries("d", 1), "source version");
        Assert.Equal(7, store.GetEntries("d", 2).Count);
        store.CreateDataset("plain");
        store.ImportBatch("plain", kept, DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(store.GetFingerprint("plain", 1), store.GetFingerprint("d", 3));

        // An import after it builds on the derived version.
        store.ImportBatch("d", Rows.Many("c", 1), DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(4, store.GetEntries("d", 4).Count);
        Assert.Null(store.GetCurationRecord("d", 4));
    }

    [Fact]
    public void A_cancelled_or_refused_curated_session_leaves_no_version_and_no_record()
    {
        using IDatasetStore store = _location.Open();
        store.CreateDataset("d");
        store.ImportBatch("d", Rows.Many("a", 3), DuplicatePolicy.Reject, BatchProvenance.None);

        ImportSessionInfo cancelled = store.BeginCuratedImport("d", Record(store, 1), BatchProvenance.None, Expiry);
        store.StageBatch(cancelled.SessionId, Rows.Many("a", 2), Expiry);
        store.CancelImport(cancelled.SessionId);

        ImportSessionInfo refused = store.BeginCuratedImport("d", Record(store, 1), BatchProvenance.None, Expiry);
        store.StageBatch(refused.SessionId, Rows.Many("a", 2), Expiry);
        store.StageBatch(refused.SessionId, Rows.Many("a", 1), Expiry);
        Assert.Throws<DuplicateEntryException>(() => store.CommitImport(refused.SessionId));

        Assert.Equal([1L], store.ListVersions("d").Select(v => v.Version));
        Assert.Empty(store.ListCurationRecords("d"));
        Assert.Equal(3, store.GetEntries("d").Count);
    }

    [Fact]
    public void Deleting_a_curated_version_deletes_its_record_and_restores_the_latest()
    {
        using IDatasetStore store = _location.Open();
        store.CreateDataset("d");
        store.ImportBatch("d", Rows.Many("a", 4), DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = store.BeginCuratedImport("d", Record(store, 1), BatchProvenance.None, Expiry);
        store.StageBatch(session.SessionId, Rows.Many("a", 1), Expiry);
        store.CommitImport(session.SessionId);
        Assert.Single(store.ListCurationRecords("d"));

        store.DeleteVersion("d", 2);
        Assert.Empty(store.ListCurationRecords("d"));
        Assert.Throws<VersionNotFoundException>(() => store.GetCurationRecord("d", 2));
        Assert.Equal(4, store.GetEntries("d").Count);
        Assert.Throws<VersionNotFoundException>(() => store.GetCurationRecord("d", 9));
        Assert.Throws<DatasetNotFoundException>(() => store.ListCurationRecords("nope"));
    }

    [Fact]
    public void A_faulty_record_is_refused_before_any_session_opens()
    {
        using IDatasetStore store = _location.Open();
        store.CreateDataset("d");
        Assert.Throws<ArgumentException>(() => store.BeginCuratedImport("d", new CurationRecord("d", 0, "ab", "{}", "[]"), BatchProvenance.None, Expiry));
        Assert.Throws<ArgumentException>(() => store.BeginCuratedImport("d", new CurationRecord("d", 1, "", "{}", "[]"), BatchProvenance.None, Expiry));
        Assert.Throws<InvalidBatchException>(() => store.BeginCuratedImport("d", new CurationRecord("d", 1, "ab", "{\0}", "[]"), BatchProvenance.None, Expiry));
        Assert.Empty(store.ListImports("d"));
    }
}

public sealed class CurationStorageTestsOnSqlite() : CurationStorageTests(StoreBackend.Sqlite)
{
}

public sealed class CurationStorageTestsOnPostgres() : CurationStorageTests(StoreBackend.Postgres)
{
}
