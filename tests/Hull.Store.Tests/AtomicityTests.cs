using Hull.Store.Tests.Backends;
namespace Hull.Store.Tests;

/// <summary>A batch with one bad row changes nothing, says which row, and burns no version number.</summary>
public abstract class AtomicityTests : IDisposable
{
    private const string Dataset = "atoms";
    private readonly StoreLocation _directory;
    private readonly IDatasetStore _store;
    private readonly IReadOnlyList<EntryRow> _before;

    protected AtomicityTests(StoreBackend backend)
    {
        _directory = backend.NewLocation();
        _store = _directory.Open();
        _store.CreateDataset(Dataset);
        _store.ImportBatch(Dataset, [Rows.Make("a", -1), Rows.Make("b", -2), Rows.Make("c", -3)], DuplicatePolicy.Reject, BatchProvenance.None);
        _before = _store.GetEntries(Dataset);
    }

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    public static TheoryData<string, EntryRow?, string?> BadRows() => new()
    {
        { "NaN energy", Rows.Make("x3", double.NaN), nameof(EntryRow.EnergyEv) },
        { "+infinite energy", Rows.Make("x3", double.PositiveInfinity), nameof(EntryRow.EnergyEv) },
        { "-infinite energy", Rows.Make("x3", double.NegativeInfinity), nameof(EntryRow.EnergyEv) },
        { "empty id", Rows.Make(""), nameof(EntryRow.Id) },
        { "blank id", Rows.Make("  \t"), nameof(EntryRow.Id) },
        { "empty formula", Rows.Make("x3", formula: ""), nameof(EntryRow.Formula) },
        { "undefined basis", Rows.Make("x3", basis: "total_per_electron"), nameof(EntryRow.Basis) },
        { "unpaired surrogate in metadata", Rows.Make("x3", metadata: "ok \uD800 broken"), nameof(EntryRow.Metadata) },
        { "unpaired surrogate in id", Rows.Make("x\uDC00"), nameof(EntryRow.Id) },
        { "U+0000 in metadata (PostgreSQL text cannot hold it)", Rows.Make("x3", metadata: "a\0b"), nameof(EntryRow.Metadata) },
        { "U+0000 in id", Rows.Make("x\0"), nameof(EntryRow.Id) },
        { "null row", null, null },
    };

    [Theory]
    [MemberData(nameof(BadRows))]
    public void ABadRowRefusesTheWholeBatch(string what, EntryRow? bad, string? field)
    {
        List<EntryRow> batch = [Rows.Make("x0"), Rows.Make("x1"), Rows.Make("x2"), bad!, Rows.Make("x4")];
        var e = Assert.Throws<InvalidBatchException>(() => _store.ImportBatch(Dataset, batch, DuplicatePolicy.Replace, BatchProvenance.None));
        Assert.Equal(3, e.RowIndex);
        Assert.Equal(field, e.Field);
        Assert.StartsWith("row 3", e.Message);
        AssertUnchanged(what);
    }

    [Fact]
    public void AnIdAlreadyStoredFailsARejectBatchAfterEarlierRowsWereWritten()
    {
        // Rows 0-2 are inserted inside the transaction before row 3 collides: they must all be rolled back.
        List<EntryRow> batch = [Rows.Make("x0"), Rows.Make("x1"), Rows.Make("x2"), Rows.Make("b", -9), Rows.Make("x4")];
        var e = Assert.Throws<DuplicateEntryException>(() => _store.ImportBatch(Dataset, batch, DuplicatePolicy.Reject, BatchProvenance.None));
        Assert.Equal(3, e.RowIndex);
        Assert.Equal("b", e.EntryId);
        Assert.Equal(1, e.ExistingVersion);
        Assert.Null(e.FirstRowIndex);
        Assert.Contains("'b'", e.Message);
        AssertUnchanged("duplicate of a stored id");
    }

    [Theory]
    [InlineData(DuplicatePolicy.Reject)]
    [InlineData(DuplicatePolicy.Replace)]
    public void AnIdRepeatedInsideTheBatchFailsItUnderEitherPolicy(DuplicatePolicy policy)
    {
        List<EntryRow> batch = [Rows.Make("x0"), Rows.Make("x1"), Rows.Make("x0", -5)];
        var e = Assert.Throws<DuplicateEntryException>(() => _store.ImportBatch(Dataset, batch, policy, BatchProvenance.None));
        Assert.Equal(2, e.RowIndex);
        Assert.Equal(0, e.FirstRowIndex);
        Assert.Equal("x0", e.EntryId);
        AssertUnchanged("repeat inside the batch");
    }

    [Fact]
    public void AnEmptyBatchIsRefused()
    {
        var e = Assert.Throws<InvalidBatchException>(() => _store.ImportBatch(Dataset, [], DuplicatePolicy.Reject, BatchProvenance.None));
        Assert.Null(e.RowIndex);
        Assert.Contains("empty", e.Message);
        AssertUnchanged("empty batch");
    }

    [Fact]
    public void ReplaceSupersedesOnlyFromTheNewVersionOn()
    {
        ImportResult result = _store.ImportBatch(Dataset, [Rows.Make("b", -7.5, metadata: "new"), Rows.Make("d", -4)],
            DuplicatePolicy.Replace, new BatchProvenance("second.csv", "fix b"));
        Assert.Equal(new ImportResult(2, 1, 1), result);
        Rows.AssertSame(_before, _store.GetEntries(Dataset, 1));
        Rows.AssertSame([Rows.Make("a", -1), Rows.Make("b", -7.5, metadata: "new"), Rows.Make("c", -3), Rows.Make("d", -4)],
            _store.GetEntries(Dataset, 2));
        Assert.Equal(Rows.Make("b", -2), _store.GetEntry(Dataset, "b", 1));
        DatasetVersionInfo info = _store.ListVersions(Dataset)[^1];
        Assert.Equal(("second.csv", "fix b", 2, 1, 1, 4L), (info.SourceLabel, info.Note, info.BatchEntryCount, info.Inserted, info.Replaced, info.EntryCount));
    }

    [Fact]
    public void NegativeZeroReadsBackAsZeroAndEnergiesRoundTripExactly()
    {
        double[] energies = [-0.0, double.Epsilon, -double.MaxValue, 1e-300, -8.123456789012345, 0.1 + 0.2];
        List<EntryRow> batch = energies.Select((e, i) => Rows.Make($"z{i}", e)).ToList();
        _store.ImportBatch(Dataset, batch, DuplicatePolicy.Reject, BatchProvenance.None);
        IReadOnlyList<EntryRow> stored = _store.GetEntries(Dataset).Where(r => r.Id.StartsWith('z')).ToList();
        // -0 is stored as +0 (the same energy; SQLite would return +0 anyway); every other value keeps all its bits.
        Rows.AssertSame(batch.Select(r => r with { EnergyEv = r.EnergyEv + 0.0 }).ToList(), stored);
        Assert.Equal(0L, BitConverter.DoubleToInt64Bits(stored[0].EnergyEv));
    }

    private void AssertUnchanged(string what)
    {
        Assert.True(_store.GetLatestVersion(Dataset) == 1, what);
        Assert.Single(_store.ListVersions(Dataset));
        Rows.AssertSame(_before, _store.GetEntries(Dataset), what);
        // No version number was used up by the failed batch.
        Assert.Equal(2, _store.ImportBatch(Dataset, [Rows.Make("after")], DuplicatePolicy.Reject, BatchProvenance.None).NewVersion);
    }
}

public sealed class AtomicityTestsOnSqlite() : AtomicityTests(StoreBackend.Sqlite)
{
}

public sealed class AtomicityTestsOnPostgres() : AtomicityTests(StoreBackend.Postgres)
{
}
