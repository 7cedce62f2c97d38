using Hull.Store.Tests.Backends;
namespace Hull.Store.Tests;

/// <summary>Unknown datasets, unknown or deleted versions and bad arguments get distinct errors that say what is wrong.</summary>
public abstract class ErrorTests : IDisposable
{
    private readonly StoreLocation _directory;
    private readonly IDatasetStore _store;

    protected ErrorTests(StoreBackend backend)
    {
        _directory = backend.NewLocation();
        _store = _directory.Open();
    }

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    public static TheoryData<string> OperationsOnADataset() =>
        ["describe", "delete", "import", "entries", "page", "entry", "versions", "delete-version", "latest", "fingerprint"];

    [Theory]
    [MemberData(nameof(OperationsOnADataset))]
    public void AnUnknownDatasetIsReportedByName(string operation)
    {
        var e = Assert.Throws<DatasetNotFoundException>(() => Run(_store, operation, "nowhere"));
        Assert.Equal("nowhere", e.DatasetName);
        Assert.Equal("dataset 'nowhere' does not exist", e.Message);
    }

    [Theory]
    [MemberData(nameof(OperationsOnADataset))]
    public void AnInvalidNameIsReportedBeforeAnyLookup(string operation)
    {
        var e = Assert.Throws<InvalidDatasetNameException>(() => Run(_store, operation, "No Such"));
        Assert.Contains("'N'", e.Message);
    }

    [Fact]
    public void VersionErrorsSayWhyTheVersionIsMissing()
    {
        _store.CreateDataset("d");
        var none = Assert.Throws<VersionNotFoundException>(() => _store.GetEntries("d"));
        Assert.Equal("dataset 'd' has no version yet; import a batch first", none.Message);
        Assert.Null(none.Version);
        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("d"));

        _store.ImportBatch("d", [Rows.Make("a")], DuplicatePolicy.Reject, BatchProvenance.None);
        _store.ImportBatch("d", [Rows.Make("b")], DuplicatePolicy.Reject, BatchProvenance.None);
        var beyond = Assert.Throws<VersionNotFoundException>(() => _store.GetEntries("d", 3));
        Assert.Equal("dataset 'd' has no version 3; its versions run from 1 to 2", beyond.Message);
        Assert.Equal(3, beyond.Version);
        Assert.Throws<VersionNotFoundException>(() => _store.GetEntries("d", 0));
        Assert.Throws<VersionNotFoundException>(() => _store.GetEntries("d", -1));

        _store.DeleteVersion("d", 1);
        var deleted = Assert.Throws<VersionNotFoundException>(() => _store.GetEntries("d", 1));
        Assert.StartsWith("version 1 of dataset 'd' was deleted at ", deleted.Message);
        Assert.Throws<VersionNotFoundException>(() => _store.DeleteVersion("d", 1));

        _store.DeleteVersion("d", 2);
        var allGone = Assert.Throws<VersionNotFoundException>(() => _store.GetEntries("d"));
        Assert.Equal("dataset 'd' has no live version: all of its 2 versions were deleted", allGone.Message);
        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("d"));

        // Numbers are never reused, and the dataset starts again from nothing.
        ImportResult next = _store.ImportBatch("d", [Rows.Make("c")], DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(new ImportResult(3, 1, 0), next);
        Rows.AssertSame([Rows.Make("c")], _store.GetEntries("d"));
    }

    [Fact]
    public void DeletingTheLatestVersionLetsTheNextImportBuildOnThePreviousOne()
    {
        _store.CreateDataset("d");
        _store.ImportBatch("d", [Rows.Make("a", -1), Rows.Make("b", -2)], DuplicatePolicy.Reject, BatchProvenance.None);
        _store.ImportBatch("d", [Rows.Make("b", -20), Rows.Make("c", -3)], DuplicatePolicy.Replace, BatchProvenance.None);
        _store.DeleteVersion("d", 2);
        Assert.Equal(1, _store.GetLatestVersion("d"));

        // 'c' came with the deleted version, so rejecting duplicates accepts it again; 'b' is back to version 1's row.
        ImportResult result = _store.ImportBatch("d", [Rows.Make("c", -30)], DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(new ImportResult(3, 1, 0), result);
        Rows.AssertSame([Rows.Make("a", -1), Rows.Make("b", -2), Rows.Make("c", -30)], _store.GetEntries("d", 3));
        Rows.AssertSame([Rows.Make("a", -1), Rows.Make("b", -2)], _store.GetEntries("d", 1));
    }

    [Fact]
    public void PageLimitsOutsideTheAllowedRangeAreRefused()
    {
        _store.CreateDataset("d");
        _store.ImportBatch("d", [Rows.Make("a")], DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Throws<ArgumentOutOfRangeException>(() => _store.GetEntries("d", null, null, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => _store.GetEntries("d", null, null, IDatasetStore.MaxPageSize + 1));
        Assert.Single(_store.GetEntries("d", null, null, IDatasetStore.MaxPageSize).Entries);
    }

    [Fact]
    public void AnUndefinedPolicyIsRefused()
    {
        _store.CreateDataset("d");
        Assert.Throws<ArgumentOutOfRangeException>(() => _store.ImportBatch("d", [Rows.Make("a")], (DuplicatePolicy)9, BatchProvenance.None));
    }

    [Fact]
    public void AClosedStoreRefusesWork()
    {
        _store.CreateDataset("d");
        _store.Dispose();
        Assert.Throws<ObjectDisposedException>(() => _store.ListDatasets());
        Assert.Throws<ObjectDisposedException>(() => _store.CreateDataset("e"));
        Assert.False(_store.CheckHealth(out string? problem));
        Assert.Equal("the store has been closed", problem);
    }

    private static void Run(IDatasetStore store, string operation, string name)
    {
        switch (operation)
        {
            case "describe": store.DescribeDataset(name); break;
            case "delete": store.DeleteDataset(name); break;
            case "import": store.ImportBatch(name, [Rows.Make("a")], DuplicatePolicy.Reject, BatchProvenance.None); break;
            case "entries": store.GetEntries(name); break;
            case "page": store.GetEntries(name, null, null, 10); break;
            case "entry": store.GetEntry(name, "a"); break;
            case "versions": store.ListVersions(name); break;
            case "delete-version": store.DeleteVersion(name, 1); break;
            case "latest": store.GetLatestVersion(name); break;
            case "fingerprint": store.GetFingerprint(name, 1); break;
            default: throw new ArgumentException(operation);
        }
    }
}

public sealed class ErrorTestsOnSqlite() : ErrorTests(StoreBackend.Sqlite)
{
}

public sealed class ErrorTestsOnPostgres() : ErrorTests(StoreBackend.Postgres)
{
}
