namespace Hull.Store.Tests;

/// <summary>An entry's energy uncertainty (σ, correlation group): kept per version like the rest of the row, through
/// a batch and through an import session; checked before anything is written; fingerprinted only where present.</summary>
public sealed class UncertaintyStorageTests : IDisposable
{
    private readonly TempDirectory _directory = new();
    private readonly DatasetStore _store;

    public UncertaintyStorageTests()
    {
        _store = DatasetStore.Open(_directory.Path);
        _store.CreateDataset("d");
    }

    public void Dispose()
    {
        _store.Dispose();
        _directory.Dispose();
    }

    [Fact]
    public void Sigma_and_group_are_kept_per_version_through_batches_and_sessions()
    {
        EntryRow plain = Rows.Make("a"), withSigma = Rows.Make("b") with { SigmaEvPerAtom = 0.025, CorrelationGroup = "ml" };
        _store.ImportBatch("d", [plain, withSigma], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, TimeSpan.FromMinutes(5));
        EntryRow replaced = Rows.Make("b") with { SigmaEvPerAtom = 0.0 };
        _store.StageBatch(session.SessionId, [replaced, Rows.Make("c") with { CorrelationGroup = "dft" }], TimeSpan.FromMinutes(5));
        _store.CommitImport(session.SessionId);

        Rows.AssertSame([plain, withSigma], _store.GetEntries("d", 1));
        Rows.AssertSame([plain, replaced, Rows.Make("c") with { CorrelationGroup = "dft" }], _store.GetEntries("d", 2));
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
        Assert.Equal(4, new[] { before, withSigma, withGroup, withZero }.Distinct().Count());
    }
}
