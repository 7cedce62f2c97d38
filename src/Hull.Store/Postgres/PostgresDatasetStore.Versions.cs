using Hull.Store.Sqlite;
using Npgsql;

namespace Hull.Store.Postgres;

// Reading versions, deleting them, and their fingerprints.
public sealed partial class PostgresDatasetStore
{
    // One delegate for every question (a method group would allocate one each time).
    private Func<string, DatasetLatest>? _readLatest;
    // The rows visible at version @k (see PostgresSchema and Schema).
    private const string VisibleAtK = "first_version <= @k AND (last_version_exclusive IS NULL OR last_version_exclusive > @k)";
    // An entry's columns with its temperature model's (NULL when it has none), read FROM entries {TemperatureModelColumns.Join},
    // then its energy uncertainty's and its method tag.
    private const string EntryColumns =
        "entries.entry_id, entries.formula, entries.energy_ev, entries.energy_basis, entries.metadata, " + TemperatureModelColumns.Select
        + ", entries.energy_sigma_ev_per_atom, entries.correlation_group, entries.method";

    /// <inheritdoc />
    public long GetLatestVersion(string datasetName) => GetLatest(datasetName).Version;

    /// <inheritdoc />
    public DatasetLatest GetLatest(string datasetName)
    {
        DatasetName.Validate(datasetName);
        ObjectDisposedException.ThrowIf(Volatile.Read(ref _disposed) != 0, this);
        return _latest.Get(datasetName, _readLatest ??= ReadLatest);
    }

    // What the latest-version memory reads when it has no answer for the current commit signal.
    private DatasetLatest ReadLatest(string datasetName) => Read((connection, transaction) =>
    {
        DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
        return new DatasetLatest(dataset.DatasetId, FindLatestLive(connection, transaction, dataset.DatasetId)?.Version ?? IDatasetStore.NoVersion);
    });

    /// <inheritdoc />
    public IReadOnlyList<DatasetVersionInfo> ListVersions(string datasetName)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
            ReadVersions(connection, transaction, FindDataset(connection, transaction, datasetName).DatasetId));
    }

    /// <inheritdoc />
    public IReadOnlyList<EntryRow> GetEntries(string datasetName, long? version = null)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            var result = new List<EntryRow>(checked((int)live.EntryCount));
            ReadVisible(connection, transaction, dataset.DatasetId, live.Version, afterId: null, limit: null, result.Add);
            return result.AsReadOnly();
        });
    }

    /// <inheritdoc />
    public EntryPage GetEntries(string datasetName, long? version, string? afterId, int limit)
    {
        DatasetName.Validate(datasetName);
        StoreArguments.CheckPageLimit(limit);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            var rows = new List<EntryRow>(Math.Min(limit + 1, (int)Math.Min(live.EntryCount, IDatasetStore.MaxPageSize + 1)));
            // One row more than asked tells whether another page follows.
            ReadVisible(connection, transaction, dataset.DatasetId, live.Version, afterId, limit + 1, rows.Add);
            string? next = null;
            if (rows.Count > limit)
            {
                rows.RemoveAt(limit);
                next = rows[^1].Id;
            }
            return new EntryPage(live.Version, rows.AsReadOnly(), next);
        });
    }

    /// <inheritdoc />
    public EntryRow? GetEntry(string datasetName, string entryId, long? version = null)
    {
        DatasetName.Validate(datasetName);
        ArgumentNullException.ThrowIfNull(entryId);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            using NpgsqlCommand command = connection.Command(transaction,
                    $"SELECT {EntryColumns} FROM entries {TemperatureModelColumns.Join} WHERE dataset_id = @d AND entry_id = @id AND {VisibleAtK}")
                .With("@d", dataset.DatasetId).With("@id", entryId).With("@k", live.Version);
            using NpgsqlDataReader reader = command.ExecuteReader();
            return reader.Read() ? ReadEntry(reader) : null;
        });
    }

    /// <inheritdoc />
    public string GetFingerprint(string datasetName, long version)
    {
        DatasetName.Validate(datasetName);
        (long datasetId, string? stored, string? computed) = Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            using (NpgsqlCommand command = connection.Command(transaction,
                       "SELECT content_sha256 FROM dataset_versions WHERE dataset_id = @d AND version = @v"))
            {
                if (command.With("@d", dataset.DatasetId).With("@v", live.Version).ExecuteScalar() is string known)
                {
                    return (dataset.DatasetId, known, (string?)null);
                }
            }
            using var builder = new ContentFingerprint.Builder();
            ReadVisible(connection, transaction, dataset.DatasetId, live.Version, afterId: null, limit: null, builder.Append);
            return (dataset.DatasetId, (string?)null, builder.Finish());
        });
        if (stored is not null) return stored;
        TryKeepFingerprint(datasetId, version, computed!);
        return computed!;
    }

    /// <inheritdoc />
    public void DeleteVersion(string datasetName, long version)
    {
        DatasetName.Validate(datasetName);
        DateTimeOffset now = _clock.GetUtcNow();
        Write((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            ResolveVersion(connection, transaction, dataset, version);
            connection.Execute(transaction,
                "UPDATE dataset_versions SET deleted_at_utc = @t WHERE dataset_id = @d AND version = @v",
                ("@t", UtcText.Write(now)), ("@d", dataset.DatasetId), ("@v", version));
            connection.Execute(transaction, "DELETE FROM curation_records WHERE dataset_id = @d AND version = @v",
                ("@d", dataset.DatasetId), ("@v", version));

            long latest = FindLatestLive(connection, transaction, dataset.DatasetId)?.Version ?? IDatasetStore.NoVersion;
            if (version > latest)
            {
                // It was the latest: roll the open rows back to the live version before it (as the SQLite store does).
                connection.Execute(transaction, "DELETE FROM entries WHERE dataset_id = @d AND first_version > @k",
                    ("@d", dataset.DatasetId), ("@k", latest));
                connection.Execute(transaction,
                    "UPDATE entries SET last_version_exclusive = NULL WHERE dataset_id = @d AND last_version_exclusive > @k",
                    ("@d", dataset.DatasetId), ("@k", latest));
            }
            else
            {
                // A version in the middle: drop the rows no live version can see any more.
                connection.Execute(transaction, $"""
                    DELETE FROM entries
                    WHERE dataset_id = @d AND {VisibleAtK} AND last_version_exclusive IS NOT NULL
                      AND NOT EXISTS (SELECT 1 FROM dataset_versions AS v
                                      WHERE v.dataset_id = entries.dataset_id AND v.deleted_at_utc IS NULL
                                        AND v.version >= entries.first_version
                                        AND v.version < entries.last_version_exclusive)
                    """, ("@d", dataset.DatasetId), ("@k", version));
            }
            return 0;
        });
    }

    private static LiveVersion? FindLatestLive(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId)
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT version, entry_count FROM dataset_versions
            WHERE dataset_id = @d AND deleted_at_utc IS NULL
            ORDER BY version DESC LIMIT 1
            """).With("@d", datasetId);
        using NpgsqlDataReader reader = command.ExecuteReader();
        return reader.Read() ? new LiveVersion(reader.GetInt64(0), reader.GetInt64(1)) : null;
    }

    private static LiveVersion ResolveVersion(NpgsqlConnection connection, NpgsqlTransaction transaction, DatasetRecord dataset, long? version)
    {
        if (version is null)
        {
            return FindLatestLive(connection, transaction, dataset.DatasetId)
                   ?? throw StoreArguments.NoLiveVersion(dataset.Name, dataset.LastVersionIssued);
        }

        long k = version.Value;
        using NpgsqlCommand command = connection.Command(transaction,
            "SELECT entry_count, deleted_at_utc FROM dataset_versions WHERE dataset_id = @d AND version = @v")
            .With("@d", dataset.DatasetId).With("@v", k);
        using NpgsqlDataReader reader = command.ExecuteReader();
        if (!reader.Read()) throw StoreArguments.NoSuchVersion(dataset.Name, k, dataset.LastVersionIssued);
        if (!reader.IsDBNull(1)) throw StoreArguments.DeletedVersion(dataset.Name, k, reader.GetString(1));
        return new LiveVersion(k, reader.GetInt64(0));
    }

    private static void ReadVisible(NpgsqlConnection connection, NpgsqlTransaction transaction, long datasetId, long k,
        string? afterId, int? limit, Action<EntryRow> sink)
    {
        string sql = $"SELECT {EntryColumns} FROM entries {TemperatureModelColumns.Join} WHERE dataset_id = @d AND {VisibleAtK}" +
                     (afterId is not null ? " AND entries.entry_id > @after" : string.Empty) + " ORDER BY entries.entry_id" +
                     (limit is not null ? " LIMIT @limit" : string.Empty);
        using NpgsqlCommand command = connection.Command(transaction, sql).With("@d", datasetId).With("@k", k);
        if (afterId is not null) command.With("@after", afterId);
        if (limit is not null) command.With("@limit", limit.Value);
        using NpgsqlDataReader reader = command.ExecuteReader();
        while (reader.Read()) sink(ReadEntry(reader));
    }

    private static EntryRow ReadEntry(NpgsqlDataReader reader) =>
        new(reader.GetString(0), reader.GetString(1), reader.GetDouble(2), reader.GetString(3), reader.GetString(4),
            TemperatureModelColumns.Read(reader, 5), reader.IsDBNull(9) ? null : reader.GetDouble(9), reader.IsDBNull(10) ? null : reader.GetString(10),
            reader.IsDBNull(11) ? null : reader.GetString(11));

    // Keeps a computed fingerprint with its version, outside the writers' queue: it changes no content, and a
    // version's rows never change. Failing to keep it is only slower (the next request computes it again).
    private void TryKeepFingerprint(long datasetId, long version, string fingerprint)
    {
        if (Volatile.Read(ref _disposed) != 0) return;
        try
        {
            using NpgsqlConnection connection = _source.OpenConnection();
            using NpgsqlCommand command = connection.Command(null, """
                UPDATE dataset_versions SET content_sha256 = @f
                WHERE dataset_id = @d AND version = @v AND content_sha256 IS NULL
                """).With("@f", fingerprint).With("@d", datasetId).With("@v", version);
            command.ExecuteNonQuery();
        }
        catch (NpgsqlException)
        {
        }
    }
}
