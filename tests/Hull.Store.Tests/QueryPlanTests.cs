using Microsoft.Data.Sqlite;

namespace Hull.Store.Tests;

/// <summary>Reading a version walks the (dataset, id, range) index in id order: no table scan, no sort of the result.</summary>
public sealed class QueryPlanTests : IDisposable
{
    private readonly TempDirectory _directory = new();

    public void Dispose() => _directory.Dispose();

    [Theory]
    [InlineData(false, false)]
    [InlineData(true, true)]
    public void AVersionIsReadThroughItsIndexWithoutSorting(bool afterId, bool limit)
    {
        using (DatasetStore store = DatasetStore.Open(_directory.Path))
        {
            store.CreateDataset("plan");
            store.ImportBatch("plan", Rows.Many("p", 500), DuplicatePolicy.Reject, BatchProvenance.None);
        }
        using var connection = new SqliteConnection($"Data Source={_directory.DatabasePath};Pooling=False");
        connection.Open();
        using SqliteCommand command = connection.CreateCommand();
        command.CommandText = "EXPLAIN QUERY PLAN " + DatasetStore.VisibleRowsSql(afterId, limit);
        command.Parameters.AddWithValue("$d", 1);
        command.Parameters.AddWithValue("$k", 1);
        if (afterId) command.Parameters.AddWithValue("$after", "p000100");
        if (limit) command.Parameters.AddWithValue("$limit", 10);
        var plan = new List<string>();
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            while (reader.Read()) plan.Add(reader.GetString(3));
        }
        // SQLite's plan text, e.g. "SEARCH entries USING INDEX entries_by_id_and_range (dataset_id=? AND entry_id>?)".
        string text = string.Join(" | ", plan);
        Assert.Contains("USING INDEX entries_by_id_and_range (dataset_id=?", text);
        Assert.DoesNotContain("TEMP B-TREE", text);
        Assert.DoesNotContain("SCAN entries", text);
        // The temperature models join by the row's key, one lookup per visible row.
        Assert.Contains("SEARCH m USING INTEGER PRIMARY KEY (rowid=?)", text);
    }
}
