using Hull.Store.Tests.Backends;
namespace Hull.Store.Tests;

/// <summary>Defect studies are stored as immutable versions of their texts, exported byte for byte.</summary>
public abstract class DefectStudyStorageTests(StoreBackend backend)
{
    // Texts with what a careless store would change: a BOM, CRLF line ends, trailing spaces, non-ASCII, no final newline.
    private const string Json = "\uFEFF{\r\n  \"host\": \"ZnO\",  \r\n  \"note\": \"Δμ_O = −1 eV\"\r\n}";
    private const string Csv = "defect,charge,energy_ev\r\nV_O,2,-801.25\nV_O,0,-805.5  ";

    [Fact]
    public void Versions_are_kept_apart_and_read_back_exactly()
    {
        using var directory = backend.NewLocation();
        using var store = directory.Open();
        store.CreateDataset("oxides", "demo");
        var first = store.SaveDefectStudy("oxides", "zno-native", Json, Csv, new BatchProvenance("study.json", "first"));
        var second = store.SaveDefectStudy("oxides", "zno-native", Json.Replace("ZnO", "MgO"), "", new BatchProvenance("study.json", "second"));
        var other = store.SaveDefectStudy("oxides", "another", Json, Csv, BatchProvenance.None);
        Assert.Equal((1L, 2L, 1L), (first.Version, second.Version, other.Version));

        var readFirst = store.GetDefectStudy("oxides", "zno-native", 1);
        Assert.Equal(Json, readFirst.StudyJson);
        Assert.Equal(Csv, readFirst.ChargeStatesCsv);
        Assert.Equal(first, readFirst);
        Assert.Equal(second.StudyJson, store.GetDefectStudy("oxides", "zno-native").StudyJson);
        Assert.Equal(first.ContentSha256, other.ContentSha256);
        Assert.NotEqual(first.ContentSha256, second.ContentSha256);
        Assert.Equal([("another", 1L), ("zno-native", 2L)], store.ListDefectStudies("oxides"));
    }

    [Fact]
    public void Stored_versions_survive_reopening()
    {
        using var directory = backend.NewLocation();
        using (var store = directory.Open())
        {
            store.CreateDataset("oxides", "demo");
            store.SaveDefectStudy("oxides", "s", Json, Csv, BatchProvenance.None);
        }

        using var again = directory.Open();
        Assert.Equal(Csv, again.GetDefectStudy("oxides", "s", 1).ChargeStatesCsv);
    }

    [Fact]
    public void Bad_requests_write_nothing_and_say_what()
    {
        using var directory = backend.NewLocation();
        using var store = directory.Open();
        store.CreateDataset("oxides", "demo");
        Assert.Throws<DatasetNotFoundException>(() => store.SaveDefectStudy("missing", "s", Json, Csv, BatchProvenance.None));
        Assert.Equal("study_name", Assert.Throws<InvalidBatchException>(() => store.SaveDefectStudy("oxides", " ", Json, Csv, BatchProvenance.None)).Field);
        Assert.Equal("study_json", Assert.Throws<InvalidBatchException>(() => store.SaveDefectStudy("oxides", "s", "", Csv, BatchProvenance.None)).Field);
        Assert.Empty(store.ListDefectStudies("oxides"));
        var e = Assert.Throws<DefectStudyNotFoundException>(() => store.GetDefectStudy("oxides", "s", 3));
        Assert.Contains("no version 3 of defect study 's'", e.Message);
    }
}

public sealed class DefectStudyStorageTestsOnSqlite() : DefectStudyStorageTests(StoreBackend.Sqlite)
{
}

public sealed class DefectStudyStorageTestsOnPostgres() : DefectStudyStorageTests(StoreBackend.Postgres)
{
}
