using Hull.Store.Sqlite;
using Npgsql;

namespace Hull.Store.Postgres;

// Curated versions (see IDatasetStore.Curation.cs), as in the SQLite store.
public sealed partial class PostgresDatasetStore
{
    /// <inheritdoc />
    public ImportSessionInfo BeginCuratedImport(string datasetName, CurationRecord record, BatchProvenance provenance, TimeSpan idleExpiry)
    {
        CurationRecordText.Check(record);
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
            (IReadOnlyDictionary<long, CurationRecord>)ReadCurationRecords(connection, transaction, FindDataset(connection, transaction, datasetName).DatasetId, version: null));
    }

    private static Dictionary<long, CurationRecord> ReadCurationRecords(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId, long? version)
    {
        using NpgsqlCommand select = connection.Command(transaction, """
            SELECT c.version, c.source_dataset, c.source_version, c.source_sha256, c.recipe_json, c.steps_json
            FROM curation_records c JOIN dataset_versions v ON v.dataset_id = c.dataset_id AND v.version = c.version
            WHERE c.dataset_id = @d AND v.deleted_at_utc IS NULL AND (@v::bigint IS NULL OR c.version = @v::bigint)
            ORDER BY c.version
            """).With("@d", datasetId).WithOptional("@v", version);
        using NpgsqlDataReader reader = select.ExecuteReader();
        var records = new Dictionary<long, CurationRecord>();
        while (reader.Read())
        {
            records[reader.GetInt64(0)] = new CurationRecord(reader.GetString(1), reader.GetInt64(2), reader.GetString(3), reader.GetString(4), reader.GetString(5));
        }
        return records;
    }

    /// <summary>A derived version holds only its staged rows: every row still open (not replaced by a staged one) ends here.</summary>
    private static void CloseUnstagedRows(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId, long newVersion) =>
        connection.Execute(transaction, "UPDATE entries SET last_version_exclusive = @v WHERE dataset_id = @d AND last_version_exclusive IS NULL",
            ("@v", newVersion), ("@d", datasetId));

    private static void InsertCurationRecord(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId, long newVersion, string recordText)
    {
        CurationRecord record = CurationRecordText.Read(recordText);
        connection.Execute(transaction, """
            INSERT INTO curation_records (dataset_id, version, source_dataset, source_version, source_sha256, recipe_json, steps_json)
            VALUES (@d, @v, @sd, @sv, @sha, @recipe, @steps)
            """, ("@d", datasetId), ("@v", newVersion), ("@sd", record.SourceDataset), ("@sv", record.SourceVersion),
            ("@sha", record.SourceSha256), ("@recipe", record.RecipeJson), ("@steps", record.StepsJson));
    }
}
