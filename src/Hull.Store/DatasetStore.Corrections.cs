using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Energy corrections: stored correction sets and the set each derived version used (see IDatasetStore.Corrections.cs).
public sealed partial class DatasetStore
{
    /// <inheritdoc />
    public CorrectionSetRecord PutCorrectionSet(string setName, long setVersion, string setJson)
    {
        StoreArguments.CheckCorrectionSetName(setName, setVersion);
        StoreArguments.CheckCorrectionSetBody(setJson);
        DateTimeOffset now = _clock.GetUtcNow();
        return Write((connection, transaction) =>
        {
            if (FindCorrectionSet(connection, transaction, setName, setVersion) is { } stored)
            {
                return string.Equals(stored.SetJson, setJson, StringComparison.Ordinal)
                    ? stored
                    : throw new CorrectionSetConflictException(setName, setVersion);
            }
            using SqliteCommand insert = connection.Command(transaction, """
                INSERT INTO correction_sets (set_name, set_version, stored_at_utc, set_json) VALUES ($n, $v, $t, $json)
                """).With("$n", setName).With("$v", setVersion).With("$t", UtcText.Write(now)).With("$json", setJson);
            insert.ExecuteNonQuery();
            return new CorrectionSetRecord(setName, setVersion, setJson, UtcText.Read(UtcText.Write(now)));
        });
    }

    /// <inheritdoc />
    public CorrectionSetRecord GetCorrectionSet(string setName, long setVersion)
    {
        StoreArguments.CheckCorrectionSetName(setName, setVersion);
        return Read((connection, transaction) =>
            FindCorrectionSet(connection, transaction, setName, setVersion) ?? throw new CorrectionSetNotFoundException(setName, setVersion));
    }

    /// <inheritdoc />
    public IReadOnlyList<CorrectionSetRecord> ListCorrectionSets() => Read((connection, transaction) =>
    {
        using SqliteCommand command = connection.Command(transaction,
            "SELECT set_name, set_version, set_json, stored_at_utc FROM correction_sets ORDER BY set_name, set_version");
        using SqliteDataReader reader = command.ExecuteReader();
        var sets = new List<CorrectionSetRecord>();
        while (reader.Read()) sets.Add(ReadCorrectionSet(reader));
        return (IReadOnlyList<CorrectionSetRecord>)sets.AsReadOnly();
    });

    /// <inheritdoc />
    public void MarkImportCorrected(string sessionId, VersionCorrections record)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        ArgumentNullException.ThrowIfNull(record);
        StoreArguments.CheckCorrectionSetName(record.SetName, record.SetVersion);
        DateTimeOffset now = _clock.GetUtcNow();
        Write((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            if (FindCorrectionSet(connection, transaction, record.SetName, record.SetVersion) is null)
            {
                throw new CorrectionSetNotFoundException(record.SetName, record.SetVersion);
            }
            using SqliteCommand update = connection.Command(transaction, """
                UPDATE import_sessions SET correction_set_name = $n, correction_set_version = $v, correction_source_version = $s
                WHERE session_key = $k
                """).With("$n", record.SetName).With("$v", record.SetVersion).With("$s", record.SourceVersion).With("$k", session.Key);
            update.ExecuteNonQuery();
            return 0;
        });
    }

    /// <inheritdoc />
    public VersionCorrections? GetVersionCorrections(string datasetName, long version)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            LiveVersion live = ResolveVersion(connection, transaction, dataset, version);
            using SqliteCommand command = connection.Command(transaction,
                "SELECT set_name, set_version, source_version FROM version_corrections WHERE dataset_id = $d AND version = $v")
                .With("$d", dataset.DatasetId).With("$v", live.Version);
            using SqliteDataReader reader = command.ExecuteReader();
            return reader.Read() ? new VersionCorrections(reader.GetString(0), reader.GetInt64(1), reader.GetInt64(2)) : null;
        });
    }

    /// <inheritdoc />
    public IReadOnlyDictionary<long, VersionCorrections> ListVersionCorrections(string datasetName)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using SqliteCommand command = connection.Command(transaction, """
                SELECT c.version, c.set_name, c.set_version, c.source_version
                FROM version_corrections c JOIN dataset_versions v ON v.dataset_id = c.dataset_id AND v.version = c.version
                WHERE c.dataset_id = $d AND v.deleted_at_utc IS NULL ORDER BY c.version
                """).With("$d", dataset.DatasetId);
            using SqliteDataReader reader = command.ExecuteReader();
            var records = new Dictionary<long, VersionCorrections>();
            while (reader.Read()) records[reader.GetInt64(0)] = new VersionCorrections(reader.GetString(1), reader.GetInt64(2), reader.GetInt64(3));
            return (IReadOnlyDictionary<long, VersionCorrections>)records;
        });
    }

    /// <summary>In a commit: the session's correction record, when it has one, becomes the new version's.</summary>
    private static void RecordSessionCorrections(SqliteConnection connection, SqliteTransaction transaction, long sessionKey, long datasetId, long newVersion)
    {
        using SqliteCommand insert = connection.Command(transaction, """
            INSERT INTO version_corrections (dataset_id, version, set_name, set_version, source_version)
            SELECT $d, $v, correction_set_name, correction_set_version, correction_source_version FROM import_sessions
            WHERE session_key = $k AND correction_set_name IS NOT NULL
            """).With("$d", datasetId).With("$v", newVersion).With("$k", sessionKey);
        insert.ExecuteNonQuery();
    }

    private static CorrectionSetRecord? FindCorrectionSet(SqliteConnection connection, SqliteTransaction transaction, string setName, long setVersion)
    {
        using SqliteCommand command = connection.Command(transaction,
            "SELECT set_name, set_version, set_json, stored_at_utc FROM correction_sets WHERE set_name = $n AND set_version = $v")
            .With("$n", setName).With("$v", setVersion);
        using SqliteDataReader reader = command.ExecuteReader();
        return reader.Read() ? ReadCorrectionSet(reader) : null;
    }

    private static CorrectionSetRecord ReadCorrectionSet(SqliteDataReader reader) =>
        new(reader.GetString(0), reader.GetInt64(1), reader.GetString(2), UtcText.Read(reader.GetString(3)));
}
