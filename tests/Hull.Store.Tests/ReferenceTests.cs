using Hull.Store.Tests.Backends;
using System.Text;

namespace Hull.Store.Tests;

/// <summary>The fingerprint and the entry order, checked against general-purpose tools outside the project.</summary>
public abstract class ReferenceTests(StoreBackend backend) : IDisposable
{
    private readonly TempDirectory _directory = new();
    private readonly StoreLocation _location = backend.NewLocation();

    public void Dispose()
    {
        _location.Dispose();
        _directory.Dispose();
    }

    [Fact]
    public void TheFingerprintIsSha256OfTheDocumentedLayout()
    {
        // The documented layout written out by hand: prefix, then per row (id order) length-prefixed UTF-8 texts and
        // the energy's binary64 bits, little-endian.
        var bytes = new LayoutBytes()
            .Text("a").Text("Fe3O4")
            .Raw(0x00, 0x00, 0x00, 0x00, 0x00, 0x00, 0xF8, 0xBF) // -1.5 = 0xBFF8000000000000 (IEEE 754 binary64)
            .Text("formation_per_atom").Text("")
            .Text("b\U0001D518").Text("O2")
            .Raw(0, 0, 0, 0, 0, 0, 0, 0) // -0.0 is written as +0.0
            .Text("total_per_atom").Text("µ = −4.9 eV");
        string file = Path.Combine(_directory.Path, "layout.bin");
        File.WriteAllBytes(file, bytes.ToArray());

        // GNU coreutils sha256sum (SHA-256 as specified in FIPS 180-4) as the outside reference.
        string expected = ExternalTool.Run("/usr/bin/sha256sum", [file]).Split(' ')[0];
        Assert.Matches("^[0-9a-f]{64}$", expected);

        EntryRow a = new("a", "Fe3O4", -1.5, "formation_per_atom", "");
        EntryRow b = new("b\U0001D518", "O2", -0.0, "total_per_atom", "µ = −4.9 eV");
        Assert.Equal(expected, ContentFingerprint.Compute([b, a]));

        using IDatasetStore store = _location.Open();
        store.CreateDataset("fp");
        store.ImportBatch("fp", [b, a], DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(expected, store.GetFingerprint("fp", 1));
        // Kept with the version after the first request, and still the same.
        Assert.Equal(expected, store.GetFingerprint("fp", 1));
    }

    [Fact]
    public void FingerprintsFollowContentNotHistory()
    {
        using IDatasetStore store = _location.Open();
        store.CreateDataset("one");
        store.CreateDataset("two");
        store.ImportBatch("one", [Rows.Make("x", -1), Rows.Make("y", -2)], DuplicatePolicy.Reject, BatchProvenance.None);
        store.ImportBatch("two", [Rows.Make("y", -2)], DuplicatePolicy.Reject, BatchProvenance.None);
        store.ImportBatch("two", [Rows.Make("x", -1)], DuplicatePolicy.Reject, BatchProvenance.None);
        store.ImportBatch("two", [Rows.Make("x", -1.0000000000000002)], DuplicatePolicy.Replace, BatchProvenance.None);

        Assert.Equal(store.GetFingerprint("one", 1), store.GetFingerprint("two", 2));
        Assert.NotEqual(store.GetFingerprint("two", 2), store.GetFingerprint("two", 3)); // one ulp apart
        Assert.NotEqual(store.GetFingerprint("two", 1), store.GetFingerprint("two", 2));
    }

    [Fact]
    public void EntriesComeInByteOrderOfTheirUtf8Ids()
    {
        string[] ids =
        [
            "mp-10", "mp-9", "mp-1", "Mp-1", "a", "a b", "ab", "a-b", "é", "e\u0301", "Z", "_x", "~",
            "e\uE000", "e\U0001D518", "e\uFFFD", "日本", "10", "9", "α", "ω",
        ];
        using IDatasetStore store = _location.Open();
        store.CreateDataset("order");
        store.ImportBatch("order", ids.Select(id => Rows.Make(id)).ToList(), DuplicatePolicy.Reject, BatchProvenance.None);

        string file = Path.Combine(_directory.Path, "ids.txt");
        File.WriteAllText(file, string.Join("\n", ids) + "\n", new UTF8Encoding(false));
        // GNU coreutils sort in the C locale compares lines byte by byte.
        string[] sorted = ExternalTool.Run("/usr/bin/sort", [file], new Dictionary<string, string> { ["LC_ALL"] = "C" })
            .Split('\n', StringSplitOptions.RemoveEmptyEntries);

        Assert.Equal(sorted, store.GetEntries("order").Select(r => r.Id));
        Assert.Equal(sorted, ids.Order(EntryIdOrder.Comparer));
        // Where UTF-16 ordinal order differs: U+E000 sorts after a surrogate pair there, before it by code point.
        Assert.True(string.CompareOrdinal("e\uE000", "e\U0001D518") > 0);
        Assert.True(EntryIdOrder.Comparer.Compare("e\uE000", "e\U0001D518") < 0);
    }
}

public sealed class ReferenceTestsOnSqlite() : ReferenceTests(StoreBackend.Sqlite)
{
}

public sealed class ReferenceTestsOnPostgres() : ReferenceTests(StoreBackend.Postgres)
{
}
