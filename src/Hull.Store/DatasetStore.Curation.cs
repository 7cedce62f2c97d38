using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Curated versions (see IDatasetStore.Curation.cs): a session that carries a curation record commits its staged rows
// as the whole new version, with the record, in the commit's one transaction.
public sealed partial class DatasetStore
{
    /// <inheritdoc />
    public ImportSessionInfo BeginCuratedImport(string datasetName, CurationRecord record, BatchProvenance provenance, TimeSpan idleExpiry)
    {
        CurationRecordText.Check(record);
        // Replace: a staged id the latest version holds is carried over, not refused; every other row is closed at the commit.
        return BeginSession(datasetName, DuplicatePolicy.Replace, provenance, idleExpiry, CurationRecordText.Write(record));
    }

    /// <inheritdoc />
    public CurationRecord? GetCurationRecord(string datasetName, long version)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            ResolveVersion(connection, transaction, dataset, version);
            return ReadCurationRecords(connection, transaction, dataset.DatasetId, version).Values.SingleOrDefault();
        });
    }

    /// <inheritdoc />
    public IReadOnlyDictionary<long, CurationRecord> ListCurationRecords(string datasetName)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
            ReadCurationRecords(connection, transaction, FindDataset(connection, transaction, datasetName).DatasetId, version: null));
    }

    /// <summary>The records of live versions (one version, or all when null).</summary>
    private static Dictionary<long, CurationRecord> ReadCurationRecords(SqliteConnection connection, SqliteTransaction transaction, long datasetId, long? version)
    {
        using SqliteCommand select = connection.Command(transaction, """
            SELECT c.version, c.source_dataset, c.source_version, c.source_sha256, c.recipe_json, c.steps_json
            FROM curation_records c JOIN dataset_versions v ON v.dataset_id = c.dataset_id AND v.version = c.version
            WHERE c.dataset_id = $d AND v.deleted_at_utc IS NULL AND ($v IS NULL OR c.version = $v)
            ORDER BY c.version
            """).With("$d", datasetId).With("$v", version);
        using SqliteDataReader reader = select.ExecuteReader();
        var records = new Dictionary<long, CurationRecord>();
        while (reader.Read())
        {
            records[reader.GetInt64(0)] = new CurationRecord(reader.GetString(1), reader.GetInt64(2), reader.GetString(3), reader.GetString(4), reader.GetString(5));
        }
        return records;
    }

    /// <summary>A derived version holds only its staged rows: every row still open (not replaced by a staged one) ends here.</summary>
    private static void CloseUnstagedRows(SqliteConnection connection, SqliteTransaction transaction, long datasetId, long newVersion)
    {
        using SqliteCommand close = connection.Command(transaction,
            "UPDATE entries SET last_version_exclusive = $v WHERE dataset_id = $d AND last_version_exclusive IS NULL");
        close.With("$v", newVersion).With("$d", datasetId).ExecuteNonQuery();
    }

    private static void InsertCurationRecord(SqliteConnection connection, SqliteTransaction transaction, long datasetId, long newVersion, string recordText)
    {
        CurationRecord record = CurationRecordText.Read(recordText);
        using SqliteCommand insert = connection.Command(transaction, """
            INSERT INTO curation_records (dataset_id, version, source_dataset, source_version, source_sha256, recipe_json, steps_json)
            VALUES ($d, $v, $sd, $sv, $sha, $recipe, $steps)
            """);
        insert.With("$d", datasetId).With("$v", newVersion).With("$sd", record.SourceDataset).With("$sv", record.SourceVersion)
            .With("$sha", record.SourceSha256).With("$recipe", record.RecipeJson).With("$steps", record.StepsJson).ExecuteNonQuery();
    }
}
