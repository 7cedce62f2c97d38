using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Creating, listing, describing and deleting datasets.
public sealed partial class DatasetStore
{
    /// <summary>Creates an empty dataset (no version until the first import).</summary>
    /// <exception cref="InvalidDatasetNameException">The name breaks the rules of <see cref="DatasetName"/>.</exception>
    /// <exception cref="DatasetAlreadyExistsException">The name is taken.</exception>
    public DatasetSummary CreateDataset(string name, string description = "")
    {
        DatasetName.Validate(name);
        description ??= string.Empty;
        StoreArguments.CheckStoredText(description, "description");
        DateTimeOffset now = _clock.GetUtcNow();
        return Write((connection, transaction) =>
        {
            using (SqliteCommand exists = connection.Command(transaction, "SELECT 1 FROM datasets WHERE name = $n").With("$n", name))
            {
                if (exists.ExecuteScalar() is not null) throw new DatasetAlreadyExistsException(name);
            }
            using SqliteCommand insert = connection.Command(transaction,
                    "INSERT INTO datasets (name, description, created_at_utc) VALUES ($n, $d, $t)")
                .With("$n", name).With("$d", description).With("$t", UtcText.Write(now));
            insert.ExecuteNonQuery();
            // Round-trip the time through its stored text so the result equals what later reads return.
            return new DatasetSummary(name, description, UtcText.Read(UtcText.Write(now)), NoVersion, 0);
        });
    }

    /// <summary>Every dataset, ordered by name.</summary>
    public IReadOnlyList<DatasetSummary> ListDatasets() => Read((connection, transaction) =>
    {
        using SqliteCommand command = connection.Command(transaction, """
            SELECT d.name, d.description, d.created_at_utc, v.version, v.entry_count
            FROM datasets AS d
            LEFT JOIN dataset_versions AS v
                ON v.dataset_id = d.dataset_id
               AND v.version = (SELECT max(version) FROM dataset_versions
                                WHERE dataset_id = d.dataset_id AND deleted_at_utc IS NULL)
            ORDER BY d.name
            """);
        using SqliteDataReader reader = command.ExecuteReader();
        var result = new List<DatasetSummary>();
        while (reader.Read())
        {
            result.Add(new DatasetSummary(
                reader.GetString(0),
                reader.GetString(1),
                UtcText.Read(reader.GetString(2)),
                reader.IsDBNull(3) ? NoVersion : reader.GetInt64(3),
                reader.IsDBNull(4) ? 0 : reader.GetInt64(4)));
        }
        return result.AsReadOnly();
    });

    /// <summary>A dataset with its latest version, entry count and every live version with provenance.</summary>
    public DatasetDescription DescribeDataset(string name)
    {
        DatasetName.Validate(name);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, name);
            IReadOnlyList<DatasetVersionInfo> versions = ReadVersions(connection, transaction, dataset.DatasetId);
            DatasetVersionInfo? latest = versions.Count == 0 ? null : versions[^1];
            var summary = new DatasetSummary(dataset.Name, dataset.Description, dataset.CreatedAtUtc,
                latest?.Version ?? NoVersion, latest?.EntryCount ?? 0);
            return new DatasetDescription(summary, versions);
        });
    }

    /// <summary>Deletes a dataset with all its versions and entries.</summary>
    public void DeleteDataset(string name)
    {
        DatasetName.Validate(name);
        Write((connection, transaction) =>
        {
            using SqliteCommand delete = connection.Command(transaction, "DELETE FROM datasets WHERE name = $n").With("$n", name);
            if (delete.ExecuteNonQuery() == 0) throw new DatasetNotFoundException(name);
            // The cascade removed the dataset's open import sessions; their staging tables go with them.
            foreach (long key in OrphanStagingKeys(connection, transaction)) DropStagingTable(connection, transaction, key);
            return 0;
        });
    }

    private static DatasetRecord FindDataset(SqliteConnection connection, SqliteTransaction transaction, string name)
    {
        using SqliteCommand command = connection.Command(transaction,
            "SELECT dataset_id, description, created_at_utc, last_version_issued FROM datasets WHERE name = $n").With("$n", name);
        using SqliteDataReader reader = command.ExecuteReader();
        if (!reader.Read()) throw new DatasetNotFoundException(name);
        return new DatasetRecord(reader.GetInt64(0), name, reader.GetString(1), UtcText.Read(reader.GetString(2)), reader.GetInt64(3));
    }

    private static IReadOnlyList<DatasetVersionInfo> ReadVersions(SqliteConnection connection, SqliteTransaction transaction, long datasetId)
    {
        using SqliteCommand command = connection.Command(transaction, """
            SELECT version, committed_at_utc, source_label, note, batch_entry_count, inserted, replaced, entry_count
            FROM dataset_versions
            WHERE dataset_id = $d AND deleted_at_utc IS NULL
            ORDER BY version
            """).With("$d", datasetId);
        using SqliteDataReader reader = command.ExecuteReader();
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
