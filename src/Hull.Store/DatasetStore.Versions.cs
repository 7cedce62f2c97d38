using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Reading versions, deleting them, and their fingerprints.
public sealed partial class DatasetStore
{
    // One delegate for every question (a method group would allocate one each time).
    private Func<string, DatasetLatest>? _readLatest;
    // The rows visible at version $k (see Schema).
    private const string VisibleAtK = "first_version <= $k AND (last_version_exclusive IS NULL OR last_version_exclusive > $k)";
    // An entry's columns with its temperature model's (NULL when it has none), read FROM entries {TemperatureModelColumns.Join},
    // then its energy uncertainty's and its method tag.
    private const string EntryColumns =
        "entries.entry_id, entries.formula, entries.energy_ev, entries.energy_basis, entries.metadata, " + TemperatureModelColumns.Select
        + ", entries.energy_sigma_ev_per_atom, entries.correlation_group, entries.method";

    /// <summary>
    /// The latest live version, or <see cref="NoVersion"/> when the dataset has none. Kept in memory until the next
    /// commit to the database by any connection or process (see <see cref="LatestVersionMemory"/>).
    /// </summary>
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
        return new DatasetLatest(dataset.DatasetId, FindLatestLive(connection, transaction, dataset.DatasetId)?.Version ?? NoVersion);
    });

    /// <summary>Every live version with its provenance, oldest first.</summary>
    public IReadOnlyList<DatasetVersionInfo> ListVersions(string datasetName)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
            ReadVersions(connection, transaction, FindDataset(connection, transaction, datasetName).DatasetId));
    }

    /// <summary>All entries visible at <paramref name="version"/> (the latest when null), ordered by <see cref="EntryIdOrder"/>.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="VersionNotFoundException">No such version, a deleted one, or (for null) no live version.</exception>
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

    /// <summary>
    /// Up to <paramref name="limit"/> entries of a version with ids after <paramref name="afterId"/> (from the first
    /// when null), in <see cref="EntryIdOrder"/>. Read later pages with the returned version and NextAfterId.
    /// </summary>
    public EntryPage GetEntries(string datasetName, long? version, string? afterId, int limit)
    {
        DatasetName.Validate(datasetName);
        StoreArguments.CheckPageLimit(limit);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            var rows = new List<EntryRow>(Math.Min(limit + 1, (int)Math.Min(live.EntryCount, MaxPageSize + 1)));
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

    /// <summary>The entry with <paramref name="entryId"/> at a version (the latest when null), or null when it has none.</summary>
    public EntryRow? GetEntry(string datasetName, string entryId, long? version = null)
    {
        DatasetName.Validate(datasetName);
        ArgumentNullException.ThrowIfNull(entryId);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            using SqliteCommand command = connection.Command(transaction,
                    $"SELECT {EntryColumns} FROM entries {TemperatureModelColumns.Join} WHERE dataset_id = $d AND entry_id = $id AND {VisibleAtK}")
                .With("$d", dataset.DatasetId).With("$id", entryId).With("$k", live.Version);
            using SqliteDataReader reader = command.ExecuteReader();
            return reader.Read() ? ReadEntry(reader) : null;
        });
    }

    /// <summary>
    /// The content fingerprint of a version (see <see cref="ContentFingerprint"/>): computed from the rows on first
    /// request, then kept with the version, which never changes.
    /// </summary>
    public string GetFingerprint(string datasetName, long version)
    {
        DatasetName.Validate(datasetName);
        (long datasetId, string? stored, string? computed) = Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            using (SqliteCommand command = connection.Command(transaction,
                       "SELECT content_sha256 FROM dataset_versions WHERE dataset_id = $d AND version = $v"))
            {
                if (command.With("$d", dataset.DatasetId).With("$v", live.Version).ExecuteScalar() is string known)
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

    /// <summary>
    /// Deletes one version: it can no longer be read, and its number is never given again. Other versions read as
    /// before. When it is the latest live version, the next import builds on the live version before it.
    /// </summary>
    public void DeleteVersion(string datasetName, long version)
    {
        DatasetName.Validate(datasetName);
        DateTimeOffset now = _clock.GetUtcNow();
        Write((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            ResolveVersion(connection, transaction, dataset, version);
            Execute(connection, transaction,
                "UPDATE dataset_versions SET deleted_at_utc = $t WHERE dataset_id = $d AND version = $v",
                ("$t", UtcText.Write(now)), ("$d", dataset.DatasetId), ("$v", version));
            Execute(connection, transaction, "DELETE FROM curation_records WHERE dataset_id = $d AND version = $v",
                ("$d", dataset.DatasetId), ("$v", version));

            long latest = FindLatestLive(connection, transaction, dataset.DatasetId)?.Version ?? NoVersion;
            if (version > latest)
            {
                // It was the latest: roll the open rows back to the live version before it. Rows that begin after that
                // version are seen by deleted versions only; rows visible at it become the open (latest) state again.
                Execute(connection, transaction, "DELETE FROM entries WHERE dataset_id = $d AND first_version > $k",
                    ("$d", dataset.DatasetId), ("$k", latest));
                Execute(connection, transaction,
                    "UPDATE entries SET last_version_exclusive = NULL WHERE dataset_id = $d AND last_version_exclusive > $k",
                    ("$d", dataset.DatasetId), ("$k", latest));
            }
            else
            {
                // A version in the middle: drop the rows no live version can see any more.
                Execute(connection, transaction, $"""
                    DELETE FROM entries
                    WHERE dataset_id = $d AND {VisibleAtK} AND last_version_exclusive IS NOT NULL
                      AND NOT EXISTS (SELECT 1 FROM dataset_versions AS v
                                      WHERE v.dataset_id = entries.dataset_id AND v.deleted_at_utc IS NULL
                                        AND v.version >= entries.first_version
                                        AND v.version < entries.last_version_exclusive)
                    """, ("$d", dataset.DatasetId), ("$k", version));
            }
            return 0;
        });
    }

    private static LiveVersion? FindLatestLive(SqliteConnection connection, SqliteTransaction transaction, long datasetId)
    {
        using SqliteCommand command = connection.Command(transaction, """
            SELECT version, entry_count FROM dataset_versions
            WHERE dataset_id = $d AND deleted_at_utc IS NULL
            ORDER BY version DESC LIMIT 1
            """).With("$d", datasetId);
        using SqliteDataReader reader = command.ExecuteReader();
        return reader.Read() ? new LiveVersion(reader.GetInt64(0), reader.GetInt64(1)) : null;
    }

    /// <summary>The live version asked for (the latest when null), or a <see cref="VersionNotFoundException"/> saying why not.</summary>
    private static LiveVersion ResolveVersion(SqliteConnection connection, SqliteTransaction transaction, DatasetRecord dataset, long? version)
    {
        if (version is null)
        {
            return FindLatestLive(connection, transaction, dataset.DatasetId)
                   ?? throw StoreArguments.NoLiveVersion(dataset.Name, dataset.LastVersionIssued);
        }

        long k = version.Value;
        using SqliteCommand command = connection.Command(transaction,
            "SELECT entry_count, deleted_at_utc FROM dataset_versions WHERE dataset_id = $d AND version = $v")
            .With("$d", dataset.DatasetId).With("$v", k);
        using SqliteDataReader reader = command.ExecuteReader();
        if (!reader.Read()) throw StoreArguments.NoSuchVersion(dataset.Name, k, dataset.LastVersionIssued);
        if (!reader.IsDBNull(1)) throw StoreArguments.DeletedVersion(dataset.Name, k, reader.GetString(1));
        return new LiveVersion(k, reader.GetInt64(0));
    }

    /// <summary>Streams the rows visible at version k with ids after <paramref name="afterId"/>, in id order.</summary>
    private static void ReadVisible(SqliteConnection connection, SqliteTransaction transaction, long datasetId, long k,
        string? afterId, int? limit, Action<EntryRow> sink)
    {
        using SqliteCommand command = connection.Command(transaction, VisibleRowsSql(afterId is not null, limit is not null))
            .With("$d", datasetId).With("$k", k);
        if (afterId is not null) command.With("$after", afterId);
        if (limit is not null) command.With("$limit", limit.Value);
        using SqliteDataReader reader = command.ExecuteReader();
        while (reader.Read()) sink(ReadEntry(reader));
    }

    /// <summary>The query for one version's rows in id order; parameters $d, $k, and $after / $limit when asked for.</summary>
    internal static string VisibleRowsSql(bool afterId, bool limit) =>
        $"SELECT {EntryColumns} FROM entries {TemperatureModelColumns.Join} WHERE dataset_id = $d AND {VisibleAtK}" +
        (afterId ? " AND entry_id > $after" : string.Empty) + " ORDER BY entries.entry_id" + (limit ? " LIMIT $limit" : string.Empty);

    private static EntryRow ReadEntry(SqliteDataReader reader)
    {
        var (sigma, group) = UncertaintyColumns.Read(reader, 9);
        return new EntryRow(reader.GetString(0), reader.GetString(1), reader.GetDouble(2), reader.GetString(3), reader.GetString(4),
            TemperatureModelColumns.Read(reader, 5), sigma, group, MethodColumn.Read(reader, 11));
    }

    // Keeps a computed fingerprint with its version when no write is in progress; otherwise the next request computes
    // it again, which is correct, only slower. A read never waits for an import.
    private void TryKeepFingerprint(long datasetId, long version, string fingerprint)
    {
        if (Volatile.Read(ref _disposed) != 0 || !_writeGate.Wait(0)) return;
        try
        {
            using SqliteConnection connection = _connections.Open();
            using SqliteTransaction transaction = connection.BeginTransaction(deferred: false);
            Execute(connection, transaction, """
                UPDATE dataset_versions SET content_sha256 = $f
                WHERE dataset_id = $d AND version = $v AND content_sha256 IS NULL
                """, ("$f", fingerprint), ("$d", datasetId), ("$v", version));
            transaction.Commit();
            _signal.CommittedHere();
        }
        catch (SqliteException)
        {
            // Another process holds the write lock for long; keeping the fingerprint is only an optimisation.
        }
        finally
        {
            _writeGate.Release();
        }
    }

    private static int Execute(SqliteConnection connection, SqliteTransaction transaction, string sql, params (string Name, object? Value)[] parameters)
    {
        using SqliteCommand command = connection.Command(transaction, sql);
        foreach ((string name, object? value) in parameters) command.With(name, value);
        return command.ExecuteNonQuery();
    }
}
