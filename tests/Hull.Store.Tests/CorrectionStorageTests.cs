using Hull.Store.Tests.Backends;

namespace Hull.Store.Tests;

/// <summary>Schema step 7 on every backend: an entry's method tag kept per version through batches and sessions and
/// fingerprinted only where present; correction sets kept by (name, version) and never changed; a derived version's
/// record written by the commit that issues it, or not at all.</summary>
public abstract class CorrectionStorageTests : IDisposable
{
    private readonly TempDirectory _directory = new();
    private readonly StoreLocation _location;
    private readonly IDatasetStore _store;

    protected CorrectionStorageTests(StoreBackend backend)
    {
        _location = backend.NewLocation();
        _store = _location.Open();
        _store.CreateDataset("d");
    }

    public void Dispose()
    {
        _store.Dispose();
        _location.Dispose();
        _directory.Dispose();
    }

    private static readonly TimeSpan Expiry = TimeSpan.FromMinutes(5);

    [Fact]
    public void Method_tags_are_kept_per_version_through_batches_and_sessions()
    {
        EntryRow plain = Rows.Make("a"), tagged = Rows.Make("b") with { Method = "gga+u", SigmaEvPerAtom = 0.02 };
        _store.ImportBatch("d", [plain, tagged], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Expiry);
        EntryRow retagged = Rows.Make("b") with { Method = "hybrid" }, added = Rows.Make("c") with { Method = "gga" };
        _store.StageBatch(session.SessionId, [retagged, added], Expiry);
        Rows.AssertSame([retagged, added], _store.ReadStagedImport(session.SessionId).Rows.Select(r => r.Row).ToList());
        _store.CommitImport(session.SessionId);

        Rows.AssertSame([plain, tagged], _store.GetEntries("d", 1));
        Rows.AssertSame([plain, retagged, added], _store.GetEntries("d", 2));
        Assert.Equal("gga+u", _store.GetEntry("d", "b", 1)!.Method);
        Assert.Null(_store.GetEntry("d", "a", 2)!.Method);
    }

    [Fact]
    public void The_fingerprint_gains_the_documented_method_marker_only_for_tagged_rows()
    {
        EntryRow plain = new("a", "Fe3O4", -1.5, "formation_per_atom", "");
        // The documented layout: the row as before, then FE FF FF FF (-2, little-endian) and the tag as a text.
        byte[] untagged = new LayoutBytes().Text("a").Text("Fe3O4").Double(-1.5).Text("formation_per_atom").Text("").ToArray();
        byte[] withTag = new LayoutBytes().Text("a").Text("Fe3O4").Double(-1.5).Text("formation_per_atom").Text("")
            .Raw(0xFE, 0xFF, 0xFF, 0xFF).Text("r2scan").ToArray();
        string untaggedFile = Path.Combine(_directory.Path, "untagged.bin"), taggedFile = Path.Combine(_directory.Path, "tagged.bin");
        File.WriteAllBytes(untaggedFile, untagged);
        File.WriteAllBytes(taggedFile, withTag);

        // GNU coreutils sha256sum (SHA-256 as specified in FIPS 180-4) as the outside reference.
        Assert.Equal(ExternalTool.Run("/usr/bin/sha256sum", [untaggedFile]).Split(' ')[0], ContentFingerprint.Compute([plain]));
        Assert.Equal(ExternalTool.Run("/usr/bin/sha256sum", [taggedFile]).Split(' ')[0], ContentFingerprint.Compute([plain with { Method = "r2scan" }]));

        _store.ImportBatch("d", [plain with { Method = "r2scan" }], DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(ContentFingerprint.Compute([plain with { Method = "r2scan" }]), _store.GetFingerprint("d", 1));
    }

    [Fact]
    public void A_blank_method_is_refused_and_nothing_is_written()
    {
        var e = Assert.Throws<InvalidBatchException>(() =>
            _store.ImportBatch("d", [Rows.Make("ok"), Rows.Make("x") with { Method = " " }], DuplicatePolicy.Reject, BatchProvenance.None));
        Assert.Contains("row 1 (id 'x')", e.Message);
        Assert.Equal(nameof(EntryRow.Method), e.Field);
        Assert.Equal(IDatasetStore.NoVersion, _store.GetLatestVersion("d"));
    }

    [Fact]
    public void A_correction_set_is_kept_once_and_never_changed()
    {
        CorrectionSetRecord first = _store.PutCorrectionSet("fit", 1, """{"base_method":"gga"}""");
        Assert.Equal(first, _store.PutCorrectionSet("fit", 1, """{"base_method":"gga"}"""));
        _store.PutCorrectionSet("fit", 2, """{"base_method":"r2scan"}""");
        _store.PutCorrectionSet("alpha", 1, "{}");

        var conflict = Assert.Throws<CorrectionSetConflictException>(() => _store.PutCorrectionSet("fit", 1, """{"base_method":"pbe"}"""));
        Assert.Contains("'fit' version 1", conflict.Message);
        Assert.Equal("""{"base_method":"gga"}""", _store.GetCorrectionSet("fit", 1).SetJson);
        Assert.Equal([("alpha", 1L), ("fit", 1L), ("fit", 2L)], _store.ListCorrectionSets().Select(s => (s.SetName, s.SetVersion)));
        Assert.Throws<CorrectionSetNotFoundException>(() => _store.GetCorrectionSet("fit", 3));
        Assert.Equal("version", Assert.Throws<InvalidBatchException>(() => _store.PutCorrectionSet("fit", 0, "{}")).Field);
        Assert.Equal("name", Assert.Throws<InvalidBatchException>(() => _store.PutCorrectionSet(" ", 1, "{}")).Field);
        Assert.Equal("set_json", Assert.Throws<InvalidBatchException>(() => _store.PutCorrectionSet("fit", 4, "{\"a\":\"\0\"}")).Field);
    }

    [Fact]
    public void A_marked_session_writes_its_record_with_its_version_and_an_unmarked_one_none()
    {
        _store.ImportBatch("d", [Rows.Make("a") with { Method = "gga" }], DuplicatePolicy.Reject, BatchProvenance.None);
        _store.PutCorrectionSet("fit", 1, "{}");
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, new BatchProvenance("d@1 corrected", ""), Expiry);
        _store.StageBatch(session.SessionId, [Rows.Make("a", -1.5) with { Method = "gga" }], Expiry);
        Assert.Throws<CorrectionSetNotFoundException>(() => _store.MarkImportCorrected(session.SessionId, new VersionCorrections("fit", 2, 1)));
        _store.MarkImportCorrected(session.SessionId, new VersionCorrections("fit", 1, 1));
        Assert.Equal(2, _store.CommitImport(session.SessionId).NewVersion);

        Assert.Null(_store.GetVersionCorrections("d", 1));
        Assert.Equal(new VersionCorrections("fit", 1, 1), _store.GetVersionCorrections("d", 2));
        Assert.Throws<VersionNotFoundException>(() => _store.GetVersionCorrections("d", 3));
        Assert.Throws<ImportSessionNotFoundException>(() => _store.MarkImportCorrected("no-such-session", new VersionCorrections("fit", 1, 1)));
    }

    [Fact]
    public void The_records_of_a_datasets_live_versions_are_listed_by_version()
    {
        _store.PutCorrectionSet("fit", 1, "{}");
        _store.PutCorrectionSet("fit", 2, "{ }");
        _store.ImportBatch("d", Rows.Many("a", 3), DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Empty(_store.ListVersionCorrections("d"));
        foreach ((long set, long source) in new[] { (1L, 1L), (2L, 1L), (1L, 3L) })
        {
            ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Expiry);
            SessionVersionWrite.Run(_store, session, Rows.Many("a", 3, offsetEv: -0.1 * set), Expiry, new VersionCorrections("fit", set, source));
        }

        _store.ImportBatch("d", Rows.Many("b", 1), DuplicatePolicy.Reject, BatchProvenance.None);
        _store.DeleteVersion("d", 3);

        // Versions 2 and 4 were corrected and are live; 3 was deleted; 1 and 5 were imported as given.
        IReadOnlyDictionary<long, VersionCorrections> listed = _store.ListVersionCorrections("d");
        Assert.Equal([2L, 4L], listed.Keys.Order());
        Assert.Equal(new VersionCorrections("fit", 1, 1), listed[2]);
        Assert.Equal(new VersionCorrections("fit", 1, 3), listed[4]);
        Assert.Equal(listed[4], _store.GetVersionCorrections("d", 4));
        Assert.Throws<DatasetNotFoundException>(() => _store.ListVersionCorrections("nope"));
    }

    [Fact]
    public void A_refused_commit_of_a_marked_session_writes_neither_version_nor_record()
    {
        _store.ImportBatch("d", [Rows.Make("a")], DuplicatePolicy.Reject, BatchProvenance.None);
        _store.PutCorrectionSet("fit", 1, "{}");
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Expiry);
        _store.StageBatch(session.SessionId, [Rows.Make("a", -2.0)], Expiry);
        _store.MarkImportCorrected(session.SessionId, new VersionCorrections("fit", 1, 1));
        _store.ImportBatch("d", [Rows.Make("b")], DuplicatePolicy.Reject, BatchProvenance.None);

        Assert.Throws<BaseVersionChangedException>(() => _store.CommitImport(session.SessionId, basedOn: 1));
        Assert.Equal(2, _store.GetLatestVersion("d"));
        Assert.Null(_store.GetVersionCorrections("d", 2));
        _store.CancelImport(session.SessionId);
        Assert.Equal(2, _store.GetLatestVersion("d"));
    }
}

public sealed class CorrectionStorageTestsOnSqlite() : CorrectionStorageTests(StoreBackend.Sqlite);

public sealed class CorrectionStorageTestsOnPostgres() : CorrectionStorageTests(StoreBackend.Postgres);
