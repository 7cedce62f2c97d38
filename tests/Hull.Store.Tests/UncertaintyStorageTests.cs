using Hull.Store.Tests.Backends;

namespace Hull.Store.Tests;

/// <summary>An entry's energy uncertainty (σ, correlation group): kept per version like the rest of the row, through
/// a batch and through an import session, on every backend; checked before anything is written; fingerprinted only
/// where present, after the temperature model when a row has both, and alike whichever backend keeps the rows.</summary>
public abstract class UncertaintyStorageTests : IDisposable
{
    private readonly StoreLocation _location;
    private readonly IDatasetStore _store;

    protected UncertaintyStorageTests(StoreBackend backend)
    {
        _location = backend.NewLocation();
        _store = _location.Open();
        _store.CreateDataset("d");
    }

    public void Dispose()
    {
        _store.Dispose();
        _location.Dispose();
    }

    [Fact]
    public void Sigma_and_group_are_kept_per_version_through_batches_and_sessions()
    {
        EntryRow plain = Rows.Make("a"), withSigma = Rows.Make("b") with { SigmaEvPerAtom = 0.025, CorrelationGroup = "ml" };
        _store.ImportBatch("d", [plain, withSigma], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, TimeSpan.FromMinutes(5));
        EntryRow replaced = Rows.Make("b") with { SigmaEvPerAtom = 0.0 };
        _store.StageBatch(session.SessionId, [replaced, Rows.Make("c") with { CorrelationGroup = "dft" }], TimeSpan.FromMinutes(5));
        Rows.AssertSame([replaced, Rows.Make("c") with { CorrelationGroup = "dft" }],
            _store.ReadStagedImport(session.SessionId).Rows.Select(r => r.Row).ToList());
        _store.CommitImport(session.SessionId);

        Rows.AssertSame([plain, withSigma], _store.GetEntries("d", 1));
        Rows.AssertSame([plain, replaced, Rows.Make("c") with { CorrelationGroup = "dft" }], _store.GetEntries("d", 2));
        Assert.Equal(0.0, _store.GetEntry("d", "b", 2)!.SigmaEvPerAtom);
        Assert.Null(_store.GetEntry("d", "c", 2)!.SigmaEvPerAtom);
    }

    [Fact]
    public void A_row_with_a_model_and_an_uncertainty_keeps_both_and_fingerprints_as_on_sqlite()
    {
        EntryRow both = Rows.Make("m") with
        {
            TemperatureModel = StoredTemperatureModel.StandardEntropy(121.3, "Ag2O"), SigmaEvPerAtom = -0.0, CorrelationGroup = "ml",
        };
        _store.ImportBatch("d", [both, Rows.Make("n") with { SigmaEvPerAtom = 0.03 }], DuplicatePolicy.Reject, BatchProvenance.None);
        IReadOnlyList<EntryRow> stored = _store.GetEntries("d", 1);
        Rows.AssertSame([both with { SigmaEvPerAtom = 0.0 }, Rows.Make("n") with { SigmaEvPerAtom = 0.03 }], stored);
        Assert.Equal(both.TemperatureModel, stored[0].TemperatureModel);
        // -0 is kept as the +0 SQLite reads back, so that both backends give the same row.
        Assert.Equal(0L, BitConverter.DoubleToInt64Bits(stored[0].SigmaEvPerAtom!.Value));

        using StoreLocation sqlite = StoreBackend.Sqlite.NewLocation();
        using IDatasetStore reference = sqlite.Open();
        reference.CreateDataset("d");
        reference.ImportBatch("d", [both, Rows.Make("n") with { SigmaEvPerAtom = 0.03 }], DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(reference.GetFingerprint("d", 1), _store.GetFingerprint("d", 1));
        Assert.Equal(ContentFingerprint.Compute(stored), _store.GetFingerprint("d", 1));
    }

    [Fact]
    public void A_bad_sigma_or_blank_group_is_refused_and_nothing_is_written()
    {
        foreach (EntryRow bad in new[] { Rows.Make("x") with { SigmaEvPerAtom = -0.01 }, Rows.Make("x") with { SigmaEvPerAtom = double.PositiveInfinity },
                     Rows.Make("x") with { CorrelationGroup = " " } })
        {
            var e = Assert.Throws<InvalidBatchException>(() => _store.ImportBatch("d", [Rows.Make("ok"), bad], DuplicatePolicy.Reject, BatchProvenance.None));
            Assert.Contains("row 1 (id 'x')", e.Message);
        }

        Assert.Equal(0, _store.GetLatestVersion("d"));
    }

    [Fact]
    public void Rows_without_uncertainty_keep_their_fingerprint_and_rows_with_it_change_it()
    {
        EntryRow plain = Rows.Make("a");
        string before = ContentFingerprint.Compute([plain]);
        Assert.Equal(before, ContentFingerprint.Compute([plain with { SigmaEvPerAtom = null, CorrelationGroup = null }]));
        string withSigma = ContentFingerprint.Compute([plain with { SigmaEvPerAtom = 0.02 }]);
        string withGroup = ContentFingerprint.Compute([plain with { CorrelationGroup = "ml" }]);
        string withZero = ContentFingerprint.Compute([plain with { SigmaEvPerAtom = 0.0 }]);
        var model = StoredTemperatureModel.StandardEntropy(42.55);
        string withModel = ContentFingerprint.Compute([plain with { TemperatureModel = model }]);
        string withBoth = ContentFingerprint.Compute([plain with { TemperatureModel = model, SigmaEvPerAtom = 0.02 }]);
        Assert.Equal(6, new[] { before, withSigma, withGroup, withZero, withModel, withBoth }.Distinct().Count());
    }
}

public sealed class UncertaintyStorageTestsOnSqlite() : UncertaintyStorageTests(StoreBackend.Sqlite);

public sealed class UncertaintyStorageTestsOnPostgres() : UncertaintyStorageTests(StoreBackend.Postgres);
