using Hull.Store.Sqlite;
using Npgsql;

namespace Hull.Store.Postgres;

// Creating, listing, describing and deleting datasets.
public sealed partial class PostgresDatasetStore
{
    /// <inheritdoc />
    public DatasetSummary CreateDataset(string name, string description = "")
    {
        DatasetName.Validate(name);
        description ??= string.Empty;
        StoreArguments.CheckStoredText(description, "description");
        DateTimeOffset now = _clock.GetUtcNow();
        return Write((connection, transaction) =>
        {
            using (NpgsqlCommand exists = connection.Command(transaction, "SELECT 1 FROM datasets WHERE name = @n").With("@n", name))
            {
                if (exists.ExecuteScalar() is not null) throw new DatasetAlreadyExistsException(name);
            }
            connection.Execute(transaction, "INSERT INTO datasets (name, description, created_at_utc) VALUES (@n, @d, @t)",
                ("@n", name), ("@d", description), ("@t", UtcText.Write(now)));
            return new DatasetSummary(name, description, UtcText.Read(UtcText.Write(now)), IDatasetStore.NoVersion, 0);
        });
    }

    /// <inheritdoc />
    public IReadOnlyList<DatasetSummary> ListDatasets() => Read((connection, transaction) =>
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT d.name, d.description, d.created_at_utc, v.version, v.entry_count
            FROM datasets AS d
            LEFT JOIN dataset_versions AS v
                ON v.dataset_id = d.dataset_id
               AND v.version = (SELECT max(version) FROM dataset_versions
                                WHERE dataset_id = d.dataset_id AND deleted_at_utc IS NULL)
            ORDER BY d.name
            """);
        using NpgsqlDataReader reader = command.ExecuteReader();
        var result = new List<DatasetSummary>();
        while (reader.Read())
        {
            result.Add(new DatasetSummary(
                reader.GetString(0),
                reader.GetString(1),
                UtcText.Read(reader.GetString(2)),
                reader.IsDBNull(3) ? IDatasetStore.NoVersion : reader.GetInt64(3),
                reader.IsDBNull(4) ? 0 : reader.GetInt64(4)));
        }
        return result.AsReadOnly();
    });

    /// <inheritdoc />
    public DatasetDescription DescribeDataset(string name)
    {
        DatasetName.Validate(name);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, name);
            IReadOnlyList<DatasetVersionInfo> versions = ReadVersions(connection, transaction, dataset.DatasetId);
            DatasetVersionInfo? latest = versions.Count == 0 ? null : versions[^1];
            var summary = new DatasetSummary(dataset.Name, dataset.Description, dataset.CreatedAtUtc,
                latest?.Version ?? IDatasetStore.NoVersion, latest?.EntryCount ?? 0);
            return new DatasetDescription(summary, versions);
        });
    }

    /// <inheritdoc />
    public void DeleteDataset(string name)
    {
        DatasetName.Validate(name);
        Write((connection, transaction) =>
        {
            if (connection.Execute(transaction, "DELETE FROM datasets WHERE name = @n", ("@n", name)) == 0) throw new DatasetNotFoundException(name);
            // The cascade removed the dataset's open import sessions; their staging tables go with them.
            foreach (long key in OrphanStagingKeys(connection, transaction)) DropStagingTable(connection, transaction, key);
            return 0;
        });
    }

    private static DatasetRecord FindDataset(NpgsqlConnection connection, NpgsqlTransaction transaction, string name)
    {
        using NpgsqlCommand command = connection.Command(transaction,
            "SELECT dataset_id, description, created_at_utc, last_version_issued FROM datasets WHERE name = @n").With("@n", name);
        using NpgsqlDataReader reader = command.ExecuteReader();
        if (!reader.Read()) throw new DatasetNotFoundException(name);
        return new DatasetRecord(reader.GetInt64(0), name, reader.GetString(1), UtcText.Read(reader.GetString(2)), reader.GetInt64(3));
    }

    private static IReadOnlyList<DatasetVersionInfo> ReadVersions(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId)
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT version, committed_at_utc, source_label, note, batch_entry_count, inserted, replaced, entry_count
            FROM dataset_versions
            WHERE dataset_id = @d AND deleted_at_utc IS NULL
            ORDER BY version
            """).With("@d", datasetId);
        using NpgsqlDataReader reader = command.ExecuteReader();
        var result = new List<DatasetVersionInfo>();
        while (reader.Read())
        {
            result.Add(new DatasetVersionInfo(
                reader.GetInt64(0),
                UtcText.Read(reader.GetString(1)),
                reader.GetString(2),
                reader.GetString(3),
                reader.GetInt32(4),
                reader.GetInt32(5),
                reader.GetInt32(6),
                reader.GetInt64(7)));
        }
        return result.AsReadOnly();
    }
}
