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
