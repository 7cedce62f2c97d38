using Microsoft.Data.Sqlite;

namespace Hull.Store.Tests;

/// <summary>The health check says yes only when the database can be read and written, and says why not otherwise.</summary>
public sealed class HealthTests : IDisposable
{
    private readonly TempDirectory _directory = new();

    public void Dispose() => _directory.Dispose();

    [Fact]
    public void AFreshStoreIsHealthyAndStaysSoUnderUse()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        Assert.True(store.CheckHealth(out string? problem), problem);
        Assert.Null(problem);
        store.CreateDataset("d");
        store.ImportBatch("d", Rows.Many("a", 10), DuplicatePolicy.Reject, BatchProvenance.None);
        Assert.True(store.CheckHealth());
    }

    [Fact]
    public void ADeletedDatabaseIsUnhealthy()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("d");
        Directory.Delete(_directory.Path, recursive: true);
        Assert.False(store.CheckHealth(out string? problem));
        Assert.Contains("is missing", problem);
    }

    [Fact]
    public void ALostSchemaTableIsUnhealthy()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        Assert.True(store.CheckHealth());
        using (var connection = new SqliteConnection($"Data Source={_directory.DatabasePath};Pooling=False"))
        {
            connection.Open();
            using SqliteCommand command = connection.CreateCommand();
            command.CommandText = "DROP TABLE schema_version";
            command.ExecuteNonQuery();
        }
        Assert.False(store.CheckHealth(out string? problem));
        Assert.Contains("no schema_version table", problem);
    }

    [Fact]
    public void ADatabaseReplacedByGarbageIsUnhealthy()
    {
        using DatasetStore store = DatasetStore.Open(_directory.Path);
        store.CreateDataset("d");
        foreach (string file in Directory.GetFiles(_directory.Path)) File.Delete(file);
        File.WriteAllText(_directory.DatabasePath, new string('x', 4096));
        Assert.False(store.CheckHealth(out string? problem));
        Assert.False(string.IsNullOrEmpty(problem));
    }
}
