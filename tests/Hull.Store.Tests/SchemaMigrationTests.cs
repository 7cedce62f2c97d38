using System.Security.Cryptography;
using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store.Tests;

/// <summary>Opening brings an older schema up to date, refuses a newer one untouched, and refuses foreign files.</summary>
public sealed class SchemaMigrationTests : IDisposable
{
    private readonly TempDirectory _directory = new();

    public void Dispose() => _directory.Dispose();

    [Fact]
    public void AFreshStoreIsAtTheLatestSchemaInWalMode()
    {
        using (DatasetStore.Open(_directory.Path))
        {
        }
        using SqliteConnection connection = Raw();
        Assert.Equal(Schema.Migrations.Select(m => (long)m.Version), Column<long>(connection, "SELECT version FROM schema_version ORDER BY version"));
        Assert.Equal("wal", Column<string>(connection, "PRAGMA journal_mode").Single());
    }

    [Fact]
    public void AVersionOneDatabaseWithDataIsMigratedAndKeepsItsData()
    {
        // A database as the first schema left it: version 1 holds a and b; version 2 replaced b and added c.
        using (SqliteConnection connection = Raw(create: true))
        {
            SchemaMigrator.Migrate(connection, _directory.DatabasePath, TimeProvider.System, targetVersion: 1);
            Execute(connection, """
                INSERT INTO datasets (dataset_id, name, description, created_at_utc, last_version_issued)
                VALUES (1, 'legacy', 'made by schema 1', '2024-05-01T08:00:00.0000000Z', 2);
                INSERT INTO dataset_versions VALUES
                    (1, 1, '2024-05-01T08:01:00.0000000Z', 'first.csv', '', 2, 2, 0, 2, NULL),
                    (1, 2, '2024-05-02T08:01:00.0000000Z', 'second.csv', 'fix b', 2, 1, 1, 3, NULL);
                INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, first_version, last_version_exclusive) VALUES
                    (1, 'a', 'Fe3O4', -1.5, 'total_per_formula_unit', '', 1, NULL),
                    (1, 'b', 'FeO', -2.5, 'formation_per_atom', 'old', 1, 2),
                    (1, 'b', 'FeO', -2.75, 'formation_per_atom', 'new', 2, NULL),
                    (1, 'c', 'O2', -4.25, 'total_per_atom', '', 2, NULL);
                """);
            Assert.Equal([1L], Column<long>(connection, "SELECT version FROM schema_version"));
        }
        SqliteConnection.ClearAllPools();

        EntryRow a = new("a", "Fe3O4", -1.5, "total_per_formula_unit", "");
        EntryRow oldB = new("b", "FeO", -2.5, "formation_per_atom", "old");
        EntryRow newB = new("b", "FeO", -2.75, "formation_per_atom", "new");
        EntryRow c = new("c", "O2", -4.25, "total_per_atom", "");
        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            Rows.AssertSame([a, oldB], store.GetEntries("legacy", 1));
            Rows.AssertSame([a, newB, c], store.GetEntries("legacy", 2));
            Assert.Equal(3, store.DescribeDataset("legacy").Summary.EntryCount);
            // The column schema 2 added works on the old versions.
            Assert.Equal(ContentFingerprint.Compute([a, newB, c]), store.GetFingerprint("legacy", 2));
            Assert.Equal(new ImportResult(3, 1, 0), store.ImportBatch("legacy", [Rows.Make("d")], DuplicatePolicy.Reject, BatchProvenance.None));
            Assert.True(store.CheckHealth());
        }

        using SqliteConnection after = Raw();
        Assert.Equal(Schema.Migrations.Select(m => (long)m.Version), Column<long>(after, "SELECT version FROM schema_version ORDER BY version"));
        Assert.Contains("content_sha256", Column<string>(after, "SELECT name FROM pragma_table_info('dataset_versions')"));
    }

    [Fact]
    public void ANewerSchemaIsRefusedAndTheFileLeftUntouched()
    {
        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            store.CreateDataset("kept");
        }
        int future = Schema.LatestVersion + 1;
        using (SqliteConnection connection = Raw())
        {
            Execute(connection, $"INSERT INTO schema_version VALUES ({future}, 'from a later build', '2030-01-01T00:00:00.0000000Z')");
        }
        SqliteConnection.ClearAllPools();
        byte[] before = SHA256.HashData(File.ReadAllBytes(_directory.DatabasePath));

        var e = Assert.Throws<UnsupportedSchemaVersionException>(() => DatasetStore.Open(_directory.Path));
        Assert.Equal(future, e.FoundVersion);
        Assert.Equal(Schema.LatestVersion, e.SupportedVersion);
        Assert.Contains($"schema version {future}, newer than the newest this build knows ({Schema.LatestVersion})", e.Message);

        SqliteConnection.ClearAllPools();
        Assert.Equal(before, SHA256.HashData(File.ReadAllBytes(_directory.DatabasePath)));
    }

    [Fact]
    public void AFileThatIsNotADatabaseIsRefused()
    {
        File.WriteAllText(_directory.DatabasePath, "id,formula,energy\nmp-1,Fe3O4,-1.5\n" + new string(' ', 200));
        var e = Assert.Throws<StoreCorruptException>(() => DatasetStore.Open(_directory.Path));
        Assert.Contains("not an SQLite database", e.Message);
        Assert.Contains(_directory.DatabasePath, e.Message);
    }

    [Fact]
    public void AnotherProgramsDatabaseIsRefused()
    {
        using (SqliteConnection connection = Raw(create: true))
        {
            Execute(connection, "CREATE TABLE customers (id INTEGER PRIMARY KEY, name TEXT)");
        }
        var e = Assert.Throws<StoreCorruptException>(() => DatasetStore.Open(_directory.Path));
        Assert.Contains("no schema_version table", e.Message);
    }

    [Fact]
    public void AStepSixDatabaseGainsMethodTagsAndCorrectionTablesAndKeepsItsFingerprints()
    {
        // A store as step 6 left it, with a version and a session begun then (its staging table has no method column).
        string sessionId;
        EntryRow a = new("a", "Cu2O", -10.5, "total_per_formula_unit", "", SigmaEvPerAtom: 0.01);
        string fingerprint;
        using (SqliteConnection connection = Raw(create: true))
        {
            SchemaMigrator.Migrate(connection, _directory.DatabasePath, TimeProvider.System, targetVersion: 6);
        }
        SqliteConnection.ClearAllPools();
        using (SqliteConnection connection = Raw())
        {
            Execute(connection, """
                INSERT INTO datasets (dataset_id, name, description, created_at_utc, last_version_issued)
                VALUES (1, 'old', 'made by schema 6', '2026-01-01T08:00:00.0000000Z', 1);
                INSERT INTO dataset_versions (dataset_id, version, committed_at_utc, source_label, note, batch_entry_count, inserted, replaced, entry_count)
                VALUES (1, 1, '2026-01-01T08:01:00.0000000Z', 'a.csv', '', 1, 1, 0, 1);
                INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, energy_sigma_ev_per_atom, first_version)
                VALUES (1, 'a', 'Cu2O', -10.5, 'total_per_formula_unit', '', 0.01, 1);
                INSERT INTO import_sessions (session_key, session_id, dataset_id, duplicate_policy, source_label, note, started_at_utc, expires_at_ms)
                VALUES (7, 's6', 1, 'replace', '', '', '2026-01-01T08:02:00.0000000Z', 99999999999999);
                CREATE TABLE staged_7 (entry_id TEXT NOT NULL, formula TEXT NOT NULL, energy_ev REAL NOT NULL, energy_basis TEXT NOT NULL,
                    metadata TEXT NOT NULL, model_formula TEXT NULL, standard_entropy_j_per_mol_k REAL NULL, free_energy_anchor TEXT NULL,
                    free_energy_points BLOB NULL, energy_sigma_ev_per_atom REAL NULL, correlation_group TEXT NULL);
                INSERT INTO staged_7 (entry_id, formula, energy_ev, energy_basis, metadata) VALUES ('b', 'Cu', -4.0, 'total_per_atom', '');
                UPDATE import_sessions SET staged_count = 1 WHERE session_key = 7;
                """);
            sessionId = "s6";
            fingerprint = ContentFingerprint.Compute([a]);
        }
        SqliteConnection.ClearAllPools();

        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            Rows.AssertSame([a], store.GetEntries("old", 1));
            Assert.Equal(fingerprint, store.GetFingerprint("old", 1));
            Assert.Null(store.GetVersionCorrections("old", 1));
            // The old session's rows come in untagged; a batch staged now brings its tag.
            store.StageBatch(sessionId, [new EntryRow("c", "O2", -9.8, "total_per_formula_unit", Method: "gga")], TimeSpan.FromMinutes(5));
            store.CommitImport(sessionId);
            Assert.Null(store.GetEntry("old", "b", 2)!.Method);
            Assert.Equal("gga", store.GetEntry("old", "c", 2)!.Method);
        }

        using SqliteConnection after = Raw();
        Assert.Contains("method", Column<string>(after, "SELECT name FROM pragma_table_info('entries')"));
        Assert.Equal(["correction_sets", "version_corrections"],
            Column<string>(after, "SELECT name FROM sqlite_master WHERE type = 'table' AND name LIKE '%correction%' ORDER BY name"));
    }

    [Fact]
    public void SchemaStepsAreNumberedInIncreasingOrderAndTheNextIsFoundByNumber()
    {
        var versions = Schema.Migrations.Select(m => m.Version).ToList();
        Assert.Equal(1, versions[0]);
        Assert.Equal(versions.Order(), versions);
        Assert.Equal(versions.Count, versions.Distinct().Count());
        Assert.Equal(versions, versions.Prepend(0).SkipLast(1).Select(v => Migration.NextAfter(Schema.Migrations, v).Version));

        Migration[] outOfOrder = [new(1, "a", ""), new(3, "c", ""), new(2, "b", "")];
        var e = Assert.Throws<InvalidOperationException>(() => Migration.NextAfter(outOfOrder, 1));
        Assert.Contains("step 2 is listed after step 3", e.Message);
        Assert.Throws<InvalidOperationException>(() => Migration.NextAfter(Schema.Migrations, Schema.LatestVersion));
    }

    [Fact]
    public void CurationRecordsGoWithTheirVersion()
    {
        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            store.CreateDataset("d", "");
        }
        using SqliteConnection connection = Raw();
        Execute(connection, "PRAGMA foreign_keys = ON");
        Execute(connection, "INSERT INTO dataset_versions VALUES (1, 1, 't', 's', '', 1, 1, 0, 1, NULL, NULL)");
        Execute(connection, "INSERT INTO curation_records VALUES (1, 1, 'raw', 3, 'ab', '{}', '[]')");
        Assert.Throws<SqliteException>(() => Execute(connection, "INSERT INTO curation_records VALUES (1, 2, 'raw', 3, 'ab', '{}', '[]')"));
        Execute(connection, "DELETE FROM dataset_versions WHERE version = 1");
        Assert.Equal([0L], Column<long>(connection, "SELECT count(*) FROM curation_records"));
    }

    private SqliteConnection Raw(bool create = false) => RawDatabase.Open(_directory.DatabasePath, create);

    private static void Execute(SqliteConnection connection, string sql) => RawDatabase.Execute(connection, sql);

    private static List<T> Column<T>(SqliteConnection connection, string sql) => RawDatabase.Column<T>(connection, sql);
}
