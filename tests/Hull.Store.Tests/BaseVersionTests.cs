using Hull.Store.Tests.Backends;

namespace Hull.Store.Tests;

/// <summary>
/// An import checked against one latest version is written on exactly that version, or refused with nothing
/// written when another writer moved the dataset on (what keeps check and write one step across servers); and the
/// dataset key tells a dataset from one made again under its name.
/// </summary>
public abstract class BaseVersionTests(StoreBackend backend) : IDisposable
{
    private readonly StoreLocation _location = backend.NewLocation();

    public void Dispose() => _location.Dispose();

    [Fact]
    public void A_batch_checked_against_an_older_latest_is_refused_and_writes_nothing()
    {
        using IDatasetStore store = _location.Open();
        using IDatasetStore other = _location.Open();
        store.CreateDataset("d");
        Assert.Equal(1, store.ImportBatch("d", Rows.Many("a", 2), DuplicatePolicy.Reject, BatchProvenance.None, basedOn: IDatasetStore.NoVersion).NewVersion);
        other.ImportBatch("d", Rows.Many("b", 2), DuplicatePolicy.Reject, BatchProvenance.None);

        var e = Assert.Throws<BaseVersionChangedException>(() =>
            store.ImportBatch("d", Rows.Many("c", 2), DuplicatePolicy.Reject, BatchProvenance.None, basedOn: 1));
        Assert.Equal((1L, 2L), (e.CheckedVersion, e.LatestVersion));
        Assert.Equal("dataset 'd' moved from version 1 to 2 while the import was being checked; nothing was written", e.Message);
        Assert.Equal([1L, 2L], store.ListVersions("d").Select(v => v.Version));
        Assert.Equal(3, store.ImportBatch("d", Rows.Many("c", 2), DuplicatePolicy.Reject, BatchProvenance.None, basedOn: 2).NewVersion);

        // A deleted latest version moves the base back.
        other.DeleteVersion("d", 3);
        Assert.Throws<BaseVersionChangedException>(() => store.ImportBatch("d", Rows.Many("e", 1), DuplicatePolicy.Reject, BatchProvenance.None, basedOn: 3));
        Assert.Equal(4, store.ImportBatch("d", Rows.Many("e", 1), DuplicatePolicy.Reject, BatchProvenance.None, basedOn: 2).NewVersion);
    }

    [Fact]
    public void A_session_checked_against_an_older_latest_stays_open_and_commits_once_checked_again()
    {
        using IDatasetStore store = _location.Open();
        store.CreateDataset("d");
        ImportSessionInfo session = store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, TimeSpan.FromMinutes(5));
        store.StageBatch(session.SessionId, Rows.Many("s", 3), TimeSpan.FromMinutes(5));
        store.ImportBatch("d", Rows.Many("a", 1), DuplicatePolicy.Reject, BatchProvenance.None);

        Assert.Throws<BaseVersionChangedException>(() => store.CommitImport(session.SessionId, 3, basedOn: IDatasetStore.NoVersion));
        Assert.Single(store.ListImports("d"));
        Assert.Equal(1, store.GetLatestVersion("d"));
        Assert.Equal(2, store.CommitImport(session.SessionId, 3, basedOn: 1).NewVersion);
        Assert.Equal(4, store.GetEntries("d").Count);
    }

    [Fact]
    public void A_dataset_made_again_under_its_name_has_another_key()
    {
        using IDatasetStore store = _location.Open();
        using IDatasetStore other = _location.Open();
        store.CreateDataset("d");
        store.ImportBatch("d", Rows.Many("a", 1), DuplicatePolicy.Reject, BatchProvenance.None);
        DatasetLatest first = store.GetLatest("d");
        Assert.Equal(1, first.Version);

        other.DeleteDataset("d");
        other.CreateDataset("d");
        other.ImportBatch("d", Rows.Many("b", 1), DuplicatePolicy.Reject, BatchProvenance.None);
        DatasetLatest second = store.GetLatest("d");
        Assert.Equal(1, second.Version);
        Assert.NotEqual(first.DatasetKey, second.DatasetKey);
    }
}

public sealed class BaseVersionTestsOnSqlite() : BaseVersionTests(StoreBackend.Sqlite)
{
}

public sealed class BaseVersionTestsOnPostgres() : BaseVersionTests(StoreBackend.Postgres)
{
}
