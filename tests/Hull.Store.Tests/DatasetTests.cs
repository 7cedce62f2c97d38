using Hull.Store.Tests.Backends;
namespace Hull.Store.Tests;

/// <summary>Dataset names, creation, listing, description and deletion.</summary>
public abstract class DatasetTests : IDisposable
{
    private readonly StoreBackend _backend;
    private readonly StoreLocation _directory;
    private readonly IDatasetStore _store;

    protected DatasetTests(StoreBackend backend)
    {
        _backend = backend;
        _directory = backend.NewLocation();
        _store = _directory.Open();
    }

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    [Theory]
    [InlineData("a")]
    [InlineData("0")]
    [InlineData("oxides.v2_final-3")]
    [InlineData("9lives")]
    [InlineData("a-")]
    [InlineData("abcdefghijklmnopqrstuvwxyz0123456789abcdefghijklmnopqrstuvwxyz01")] // 64 characters
    public void NamesWithinTheRulesAreAccepted(string name)
    {
        Assert.Null(DatasetName.Check(name));
        Assert.Equal(name, _store.CreateDataset(name).Name);
    }

    [Theory]
    [InlineData("", "dataset name is empty")]
    [InlineData("abcdefghijklmnopqrstuvwxyz0123456789abcdefghijklmnopqrstuvwxyz012", "has 65 characters")]
    [InlineData("Oxides", "starts with 'O'")]
    [InlineData(" a", "starts with U+0020")]
    [InlineData("-a", "starts with '-'")]
    [InlineData(".hidden", "starts with '.'")]
    [InlineData("_a", "starts with '_'")]
    [InlineData("my data", "has U+0020 at position 3")]
    [InlineData("a/b", "has '/' at position 2")]
    [InlineData("oxidE", "has 'E' at position 5")]
    [InlineData("fé", "has 'é' at position 2")]
    [InlineData("a\n", "has U+000A at position 2")]
    public void NamesBreakingTheRulesAreRefusedSayingWhere(string name, string problem)
    {
        var e = Assert.Throws<InvalidDatasetNameException>(() => _store.CreateDataset(name));
        Assert.Contains(problem, e.Message);
        Assert.Contains("use 1-64 characters from a-z, 0-9", e.Message);
        Assert.Equal(name, e.Name);
        Assert.Empty(_store.ListDatasets());
    }

    [Fact]
    public void ATakenNameIsRefused()
    {
        _store.CreateDataset("oxides", "first");
        var e = Assert.Throws<DatasetAlreadyExistsException>(() => _store.CreateDataset("oxides", "second"));
        Assert.Equal("dataset 'oxides' already exists", e.Message);
        Assert.Equal("first", _store.DescribeDataset("oxides").Summary.Description);
    }

    [Fact]
    public void DatasetsAreListedByNameWithTheirLatestVersion()
    {
        var clock = new SetClock();
        var t0 = new DateTimeOffset(2025, 3, 1, 12, 0, 0, TimeSpan.Zero);
        DateTimeOffset At(int seconds) => t0.AddSeconds(seconds).AddTicks(1234567); // sub-second part must survive too
        using StoreLocation clocked = _backend.NewLocation();
        using IDatasetStore store = clocked.Open(clock);
        clock.Now = At(0);
        store.CreateDataset("zeta", "last by name");
        clock.Now = At(1);
        store.CreateDataset("alpha", "first by name");
        clock.Now = At(2);
        store.ImportBatch("zeta", Rows.Many("z", 3), DuplicatePolicy.Reject, new BatchProvenance("z.csv", "three"));
        clock.Now = At(3);
        store.ImportBatch("zeta", Rows.Many("y", 2), DuplicatePolicy.Reject, new BatchProvenance("y.csv", "two more"));

        IReadOnlyList<DatasetSummary> list = store.ListDatasets();
        Assert.Equal(
            [
                new DatasetSummary("alpha", "first by name", At(1), IDatasetStore.NoVersion, 0),
                new DatasetSummary("zeta", "last by name", At(0), 2, 5),
            ],
            list);

        DatasetDescription zeta = store.DescribeDataset("zeta");
        Assert.Equal(list[1], zeta.Summary);
        Assert.Equal(
            [
                new DatasetVersionInfo(1, At(2), "z.csv", "three", 3, 3, 0, 3),
                new DatasetVersionInfo(2, At(3), "y.csv", "two more", 2, 2, 0, 5),
            ],
            zeta.Versions);
        Assert.Equal(zeta.Versions, store.ListVersions("zeta"));
    }

    [Fact]
    public void DeletingADatasetRemovesItAndFreesTheName()
    {
        _store.CreateDataset("tmp");
        _store.ImportBatch("tmp", Rows.Many("t", 50), DuplicatePolicy.Reject, BatchProvenance.None);
        _store.DeleteDataset("tmp");
        Assert.Empty(_store.ListDatasets());
        Assert.Throws<DatasetNotFoundException>(() => _store.GetEntries("tmp"));

        _store.CreateDataset("tmp");
        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("tmp"));
        Assert.Equal(1, _store.ImportBatch("tmp", Rows.Many("u", 1), DuplicatePolicy.Reject, BatchProvenance.None).NewVersion);
        Rows.AssertSame(Rows.Many("u", 1), _store.GetEntries("tmp"));
    }

    [Fact]
    public void LargeVersionsArePagedInIdOrderAndAPagerStaysOnItsVersion()
    {
        _store.CreateDataset("big");
        IReadOnlyList<EntryRow> rows = Rows.Many("r", 2_500);
        _store.ImportBatch("big", rows, DuplicatePolicy.Reject, BatchProvenance.None);

        var read = new List<EntryRow>();
        EntryPage page = _store.GetEntries("big", null, null, 1_000);
        read.AddRange(page.Entries);
        // A later import must not leak into the pages of version 1.
        _store.ImportBatch("big", [Rows.Make("r000000", 5), Rows.Make("r999999")], DuplicatePolicy.Replace, BatchProvenance.None);
        var sizes = new List<int> { page.Entries.Count };
        while (page.NextAfterId is not null)
        {
            page = _store.GetEntries("big", page.Version, page.NextAfterId, 1_000);
            sizes.Add(page.Entries.Count);
            read.AddRange(page.Entries);
        }
        Assert.Equal([1_000, 1_000, 500], sizes);
        Rows.AssertSame(rows, read);
    }

    /// <summary>A clock the test sets, so every stored time is known.</summary>
    private sealed class SetClock : TimeProvider
    {
        public DateTimeOffset Now { get; set; } = new(2000, 1, 1, 0, 0, 0, TimeSpan.Zero);

        public override DateTimeOffset GetUtcNow() => Now;
    }
}

public sealed class DatasetTestsOnSqlite() : DatasetTests(StoreBackend.Sqlite)
{
}

public sealed class DatasetTestsOnPostgres() : DatasetTests(StoreBackend.Postgres)
{
}
