using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store.Tests;

/// <summary>
/// Entries' temperature models are versioned exactly like the entries: stored with the row, visible in its versions,
/// replaced and deleted with it, carried by import sessions, covered by the fingerprint, kept across the migration.
/// </summary>
public sealed class TemperatureModelStorageTests : IDisposable
{
    // NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982), S°(298.15 K) — from memory:
    // Ag2O(s) 121.3 J/(mol K), Ag(s) 42.55 J/(mol K).
    private static readonly StoredTemperatureModel SilverOxideEntropy = StoredTemperatureModel.StandardEntropy(121.3, "Ag2O");
    private static readonly StoredTemperatureModel SilverEntropy = StoredTemperatureModel.StandardEntropy(42.55);

    // G(T) − H°(298.15 K) = −T S° of Ag2O in the Ellingham approximation: −T × 121.3 / 96485.33212 eV (e N_A, CODATA
    // 2018), worked by hand at 300, 500 and 700 K.
    private static readonly StoredTemperatureModel SilverOxideTable = StoredTemperatureModel.FreeEnergyTable("fitted_298k",
        [new(300, -0.377156), new(500, -0.628594), new(700, -0.880031)], "Ag2O");

    private readonly TempDirectory _directory = new();

    public void Dispose() => _directory.Dispose();

    private static EntryRow Oxide(StoredTemperatureModel? model, double energyEv = -0.3218) =>
        new("ag2o", "Ag2O", energyEv, "formation_per_formula_unit", "", model);

    private static EntryRow Silver(StoredTemperatureModel? model = null) => new("ag", "Ag", 0.0, "formation_per_atom", "", model);

    [Fact]
    public void ModelsReadBackExactlyFromEveryReadPath()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("silver");
        EntryRow plain = new("o2", "O2", 0.0, "formation_per_atom");
        EntryRow[] rows = [Oxide(SilverOxideTable), Silver(SilverEntropy), plain];
        store.ImportBatch("silver", rows, DuplicatePolicy.Reject, BatchProvenance.None);

        Rows.AssertSame(Rows.Sorted(rows), store.GetEntries("silver"));
        Assert.Equal(SilverOxideTable, store.GetEntry("silver", "ag2o")!.TemperatureModel);
        Assert.Equal(SilverEntropy, store.GetEntry("silver", "ag")!.TemperatureModel);
        Assert.Null(store.GetEntry("silver", "o2")!.TemperatureModel);
        EntryPage page = store.GetEntries("silver", null, "ag", 1);
        Assert.Equal(SilverOxideTable, page.Entries.Single().TemperatureModel);
        Assert.Equal([new StoredFreeEnergyPoint(300, -0.377156), new(500, -0.628594), new(700, -0.880031)],
            store.GetEntry("silver", "ag2o")!.TemperatureModel!.FreeEnergyPoints.ToArray());
    }

    [Fact]
    public void AModelFollowsItsRowThroughReplaceAndDelete()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("silver");
        store.ImportBatch("silver", [Oxide(SilverOxideEntropy), Silver(SilverEntropy)], DuplicatePolicy.Reject, BatchProvenance.None); // v1
        store.ImportBatch("silver", [Oxide(SilverOxideTable)], DuplicatePolicy.Replace, BatchProvenance.None);                           // v2
        store.ImportBatch("silver", [Oxide(null, -0.33)], DuplicatePolicy.Replace, BatchProvenance.None);                                // v3

        Assert.Equal(SilverOxideEntropy, store.GetEntry("silver", "ag2o", 1)!.TemperatureModel);
        Assert.Equal(SilverOxideTable, store.GetEntry("silver", "ag2o", 2)!.TemperatureModel);
        Assert.Null(store.GetEntry("silver", "ag2o", 3)!.TemperatureModel);
        // The untouched entry keeps its model in every version.
        foreach (long v in new long[] { 1, 2, 3 }) Assert.Equal(SilverEntropy, store.GetEntry("silver", "ag", v)!.TemperatureModel);
        Assert.Equal(3, ModelRowCount());

        // A version in the middle: its row goes, and its model with it; the others read as before.
        store.DeleteVersion("silver", 2);
        Assert.Equal(2, ModelRowCount());
        Rows.AssertSame([Silver(SilverEntropy), Oxide(SilverOxideEntropy)], store.GetEntries("silver", 1));
        Rows.AssertSame([Silver(SilverEntropy), Oxide(null, -0.33)], store.GetEntries("silver", 3));

        // The latest: the rows of v1 become the open state again, models included, and a replace builds on them.
        store.DeleteVersion("silver", 3);
        Rows.AssertSame([Silver(SilverEntropy), Oxide(SilverOxideEntropy)], store.GetEntries("silver"));
        store.ImportBatch("silver", [Oxide(SilverOxideTable)], DuplicatePolicy.Replace, BatchProvenance.None); // v4
        Rows.AssertSame([Silver(SilverEntropy), Oxide(SilverOxideTable)], store.GetEntries("silver", 4));
        Rows.AssertSame([Silver(SilverEntropy), Oxide(SilverOxideEntropy)], store.GetEntries("silver", 1));

        store.DeleteDataset("silver");
        Assert.Equal(0, ModelRowCount());
    }

    [Fact]
    public void AnImportSessionCarriesModelsIntoItsVersion()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("silver");
        store.ImportBatch("silver", [Oxide(SilverOxideEntropy)], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = store.BeginImport("silver", DuplicatePolicy.Replace, BatchProvenance.None, TimeSpan.FromMinutes(5));
        store.StageBatch(session.SessionId, [Oxide(SilverOxideTable)], TimeSpan.FromMinutes(5));
        store.StageBatch(session.SessionId, [Silver(SilverEntropy), new EntryRow("o2", "O2", 0.0, "formation_per_atom")], TimeSpan.FromMinutes(5));

        StagedImport staged = store.ReadStagedImport(session.SessionId);
        Assert.Equal([SilverOxideTable, SilverEntropy, null], staged.Rows.Select(r => r.Row.TemperatureModel));
        Assert.Equal(new ImportResult(2, 2, 1), store.CommitImport(session.SessionId, staged.Session.StagedCount));

        Assert.Equal(SilverOxideEntropy, store.GetEntry("silver", "ag2o", 1)!.TemperatureModel);
        Assert.Equal(SilverOxideTable, store.GetEntry("silver", "ag2o", 2)!.TemperatureModel);
        Assert.Equal(SilverEntropy, store.GetEntry("silver", "ag", 2)!.TemperatureModel);
        Assert.Null(store.GetEntry("silver", "o2", 2)!.TemperatureModel);
    }

    [Fact]
    public void BadModelsAreRefusedAndNothingIsWritten()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("silver");
        store.ImportBatch("silver", [Silver(SilverEntropy)], DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = store.BeginImport("silver", DuplicatePolicy.Reject, BatchProvenance.None, TimeSpan.FromMinutes(5));

        (StoredTemperatureModel Model, string Message)[] bad =
        [
            (StoredTemperatureModel.StandardEntropy(-1.0), "the standard entropy is -1 J/(mol K); it must be finite and not negative"),
            (StoredTemperatureModel.StandardEntropy(double.NaN), "the standard entropy is NaN J/(mol K)"),
            (StoredTemperatureModel.FreeEnergyTable("fitted_298k", [new(300, -0.38)]), "the G(T) table has 1 point; it needs at least 2"),
            (StoredTemperatureModel.FreeEnergyTable("fitted_298k", [new(500, -0.63), new(300, -0.38)]), "G(T) point 2 (300 K, -0.38 eV)"),
            (StoredTemperatureModel.FreeEnergyTable("fitted_298k", [new(300, -0.38), new(300, -0.38)]), "G(T) point 2 (300 K"),
            (StoredTemperatureModel.FreeEnergyTable("fitted_298k", [new(0, 0), new(300, -0.38)]), "G(T) point 1 (0 K"),
            (StoredTemperatureModel.FreeEnergyTable("room", [new(300, -0.38), new(500, -0.63)]), "free-energy anchor 'room' is not one of computed_0k, fitted_298k"),
        ];
        foreach ((StoredTemperatureModel model, string message) in bad)
        {
            EntryRow[] batch = [new("ok", "Ag", 0.0, "formation_per_atom"), Oxide(model)];
            var e = Assert.Throws<InvalidBatchException>(() => store.ImportBatch("silver", batch, DuplicatePolicy.Reject, BatchProvenance.None));
            Assert.Contains("row 1 (id 'ag2o'): " + message, e.Message);
            Assert.Equal(1, e.RowIndex);
            Assert.Equal(nameof(EntryRow.TemperatureModel), e.Field);
            Assert.Throws<InvalidBatchException>(() => store.StageBatch(session.SessionId, batch, TimeSpan.FromMinutes(5)));
        }

        Assert.Equal(1, store.GetLatestVersion("silver"));
        Rows.AssertSame([Silver(SilverEntropy)], store.GetEntries("silver"));
        Assert.Empty(store.ReadStagedImport(session.SessionId).Rows);
        Assert.Equal(1, ModelRowCount());
    }

    [Fact]
    public void TheFileItselfRefusesTwoKindsOrNoneOnOneModel()
    {
        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            store.CreateDataset("silver");
            store.ImportBatch("silver", [Silver()], DuplicatePolicy.Reject, BatchProvenance.None);
        }
        using SqliteConnection connection = Raw();
        string both = "INSERT INTO entry_temperature_models VALUES (1, '', 42.55, 'fitted_298k', zeroblob(32))";
        string none = "INSERT INTO entry_temperature_models VALUES (1, '', NULL, NULL, NULL)";
        string shortTable = "INSERT INTO entry_temperature_models VALUES (1, '', NULL, 'fitted_298k', zeroblob(16))";
        string orphan = "INSERT INTO entry_temperature_models VALUES (99, '', 42.55, NULL, NULL)";
        foreach (string sql in new[] { both, none, shortTable, orphan })
        {
            using SqliteCommand command = connection.CreateCommand();
            command.CommandText = "PRAGMA foreign_keys = ON; " + sql;
            Assert.Throws<SqliteException>(() => command.ExecuteNonQuery());
        }
    }

    [Fact]
    public void TheFingerprintOfAModelRowIsSha256OfTheDocumentedLayout()
    {
        var bytes = new LayoutBytes()
            // ag: no model, so exactly the bytes of the layout before models existed.
            .Text("ag").Text("Ag").Double(0.0).Text("formation_per_atom").Text("")
            // ag2o: the marker, kind 2 (table), formula, anchor, point count, points.
            .Text("ag2o").Text("Ag2O").Double(-0.3218).Text("formation_per_formula_unit").Text("")
            .Raw(0xFF, 0xFF, 0xFF, 0xFF, 0x02).Text("Ag2O").Text("fitted_298k").Raw(BitConverter.GetBytes(3))
            .Double(300).Double(-0.377156).Double(500).Double(-0.628594).Double(700).Double(-0.880031)
            // o2: kind 1 (entropy), empty formula, S° 205.138 (NBS 1982, from memory; here only a number to hash).
            .Text("o2").Text("O2").Double(0.0).Text("formation_per_atom").Text("")
            .Raw(0xFF, 0xFF, 0xFF, 0xFF, 0x01).Text("").Double(205.138);
        string file = Path.Combine(_directory.Path, "layout.bin");
        File.WriteAllBytes(file, bytes.ToArray());

        // GNU coreutils sha256sum (SHA-256 as specified in FIPS 180-4) as the outside reference.
        string expected = ExternalTool.Run("/usr/bin/sha256sum", [file]).Split(' ')[0];
        EntryRow o2 = new("o2", "O2", 0.0, "formation_per_atom", "", StoredTemperatureModel.StandardEntropy(205.138));
        EntryRow[] rows = [o2, Oxide(SilverOxideTable), Silver()];
        Assert.Equal(expected, ContentFingerprint.Compute(rows));

        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("fp");
        store.ImportBatch("fp", rows, DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.Equal(expected, store.GetFingerprint("fp", 1));

        // A model changes the fingerprint; so does any change inside it; the rows without models hash as before.
        Assert.NotEqual(ContentFingerprint.Compute([Oxide(null)]), ContentFingerprint.Compute([Oxide(SilverOxideEntropy)]));
        Assert.NotEqual(ContentFingerprint.Compute([Oxide(SilverOxideEntropy)]),
            ContentFingerprint.Compute([Oxide(StoredTemperatureModel.StandardEntropy(121.3))]));
        Assert.NotEqual(ContentFingerprint.Compute([Oxide(SilverOxideTable)]), ContentFingerprint.Compute([Oxide(
            StoredTemperatureModel.FreeEnergyTable("computed_0k", SilverOxideTable.FreeEnergyPoints, "Ag2O"))]));
    }

    [Fact]
    public void AStoreOfTheSchemaBeforeModelsOpensKeepsItsDataAndItsFingerprints()
    {
        // A store as schema 4 left it, with a version whose fingerprint was kept, and an import session in progress
        // whose staging table has no model columns.
        EntryRow a = new("a", "Ag2O", -0.3218, "formation_per_formula_unit", "handbook");
        EntryRow b = new("b", "Ag", 0.0, "formation_per_atom", "");
        string before;
        using (SqliteConnection connection = Raw(create: true))
        {
            SchemaMigrator.Migrate(connection, _directory.DatabasePath, TimeProvider.System, targetVersion: 4);
            Execute(connection, """
                INSERT INTO datasets (dataset_id, name, description, created_at_utc, last_version_issued)
                VALUES (1, 'legacy', 'made by schema 4', '2026-11-01T08:00:00.0000000Z', 1);
                INSERT INTO dataset_versions (dataset_id, version, committed_at_utc, source_label, note, batch_entry_count, inserted, replaced, entry_count)
                VALUES (1, 1, '2026-11-01T08:01:00.0000000Z', 'first.csv', '', 2, 2, 0, 2);
                INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, first_version) VALUES
                    (1, 'a', 'Ag2O', -0.3218, 'formation_per_formula_unit', 'handbook', 1),
                    (1, 'b', 'Ag', 0.0, 'formation_per_atom', '', 1);
                INSERT INTO import_sessions (session_key, session_id, dataset_id, duplicate_policy, source_label, note, started_at_utc, expires_at_ms)
                VALUES (7, 'oldsession', 1, 'replace', 'second.csv', '', '2026-11-01T09:00:00.0000000Z', 32503680000000);
                CREATE TABLE staged_7 (entry_id TEXT NOT NULL, formula TEXT NOT NULL, energy_ev REAL NOT NULL,
                                       energy_basis TEXT NOT NULL, metadata TEXT NOT NULL);
                INSERT INTO staged_7 VALUES ('c', 'O2', 0.0, 'formation_per_atom', 'staged before');
                UPDATE import_sessions SET staged_count = 1 WHERE session_key = 7;
                """);
            before = ContentFingerprint.Compute([a, b]);
            Execute(connection, $"UPDATE dataset_versions SET content_sha256 = '{before}'");
        }
        SqliteConnection.ClearAllPools();

        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            Rows.AssertSame([a, b], store.GetEntries("legacy", 1));
            Assert.Equal(before, store.GetFingerprint("legacy", 1));
            // The rows alone, hashed afresh, give the fingerprint kept before the migration.
            using (SqliteConnection connection = Raw()) Execute(connection, "UPDATE dataset_versions SET content_sha256 = NULL");
            Assert.Equal(before, store.GetFingerprint("legacy", 1));

            // The old session reads, takes a batch with a model, and commits both.
            Assert.Null(store.ReadStagedImport("oldsession").Rows.Single().Row.TemperatureModel);
            store.StageBatch("oldsession", [Oxide(SilverOxideEntropy) with { Id = "a" }], TimeSpan.FromMinutes(5));
            Assert.Equal(new ImportResult(2, 1, 1), store.CommitImport("oldsession", 2));
            Rows.AssertSame([Oxide(SilverOxideEntropy) with { Id = "a" }, b, new EntryRow("c", "O2", 0.0, "formation_per_atom", "staged before")],
                store.GetEntries("legacy", 2));
            Rows.AssertSame([a, b], store.GetEntries("legacy", 1));
            Assert.True(store.CheckHealth());
        }
    }

    private long ModelRowCount()
    {
        using SqliteConnection connection = Raw();
        using SqliteCommand command = connection.CreateCommand();
        command.CommandText = "SELECT count(*) FROM entry_temperature_models";
        return (long)command.ExecuteScalar()!;
    }

    private SqliteConnection Raw(bool create = false) => RawDatabase.Open(_directory.DatabasePath, create);

    private static void Execute(SqliteConnection connection, string sql) => RawDatabase.Execute(connection, sql);
}
