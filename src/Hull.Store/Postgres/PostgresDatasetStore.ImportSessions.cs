using System.Globalization;
using System.Security.Cryptography;
using Hull.Store.Sqlite;
using Npgsql;
using NpgsqlTypes;

namespace Hull.Store.Postgres;

// Import sessions: many batches, one version (see IDatasetStore.ImportSessions.cs). As in the SQLite store, each
// session stages into a table of its own that no read looks at; its seq column is the row's 0-based place in the
// session, written from the staged count under the writers' queue, so it has no gaps even after a failed batch.
public sealed partial class PostgresDatasetStore
{
    /// <inheritdoc />
    public ImportSessionInfo BeginImport(string datasetName, DuplicatePolicy policy, BatchProvenance provenance, TimeSpan idleExpiry) =>
        BeginSession(datasetName, policy, provenance, idleExpiry, curationRecord: null);

    /// <summary>Opens a session; one with a curation record (its text) commits as a derived version.</summary>
    private ImportSessionInfo BeginSession(string datasetName, DuplicatePolicy policy, BatchProvenance provenance, TimeSpan idleExpiry, string? curationRecord)
    {
        DatasetName.Validate(datasetName);
        StoreArguments.CheckProvenance(provenance);
        StoreArguments.CheckPolicy(policy);
        StoreArguments.CheckExpiry(idleExpiry);
        DateTimeOffset now = _clock.GetUtcNow();
        DateTimeOffset expires = now + idleExpiry;
        string sessionId = Convert.ToHexStringLower(RandomNumberGenerator.GetBytes(16));
        return Write((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using NpgsqlCommand insert = connection.Command(transaction, """
                INSERT INTO import_sessions (session_id, dataset_id, duplicate_policy, source_label, note, started_at_utc, expires_at_ms, curation_record)
                VALUES (@s, @d, @p, @source, @note, @t, @e, @curation)
                RETURNING session_key
                """).With("@s", sessionId).With("@d", dataset.DatasetId).With("@p", StoreArguments.PolicyToken(policy))
                .With("@source", provenance.SourceLabel ?? string.Empty).With("@note", provenance.Note ?? string.Empty)
                .With("@t", UtcText.Write(now)).With("@e", expires.ToUnixTimeMilliseconds());
            insert.Parameters.Add(new NpgsqlParameter("@curation", NpgsqlDbType.Text) { Value = (object?)curationRecord ?? DBNull.Value });
            long key = (long)insert.ExecuteScalar()!;
            connection.Execute(transaction, $"""
                CREATE TABLE {StagingTable(key)} (
                    seq          bigint NOT NULL,
                    entry_id     text COLLATE "C" NOT NULL,
                    formula      text NOT NULL,
                    energy_ev    double precision NOT NULL,
                    energy_basis text NOT NULL,
                    metadata     text NOT NULL,
                    {StagingModelDefinitions},
                    {StagingUncertaintyDefinitions},
                    {StagingMethodDefinition}
                )
                """);
            return new ImportSessionInfo(sessionId, datasetName, policy, 0, expires);
        });
    }

    /// <inheritdoc />
    public ImportSessionInfo StageBatch(string sessionId, IReadOnlyList<EntryRow> rows, TimeSpan idleExpiry)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        ArgumentNullException.ThrowIfNull(rows);
        StoreArguments.CheckExpiry(idleExpiry);
        EntryRow[] batch = [.. rows];
        BatchValidator.Validate(batch);
        DateTimeOffset now = _clock.GetUtcNow();
        DateTimeOffset expires = now + idleExpiry;
        return Write((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            // A session begun before schema step 5 (6, 7) staged into a table without the model (uncertainty, method) columns.
            foreach (string definition in (StagingModelDefinitions + ", " + StagingUncertaintyDefinitions + ", " + StagingMethodDefinition)
                         .Split(',', StringSplitOptions.TrimEntries))
            {
                connection.Execute(transaction, $"ALTER TABLE {StagingTable(session.Key)} ADD COLUMN IF NOT EXISTS {definition}");
            }
            using (NpgsqlBinaryImporter copy = connection.BeginBinaryImport(
                       $"COPY {StagingTable(session.Key)} (seq, entry_id, formula, energy_ev, energy_basis, metadata, {TemperatureModelColumns.StagingNames}, {StagingUncertaintyNames}, method) FROM STDIN (FORMAT BINARY)"))
            {
                long seq = session.StagedCount;
                foreach (EntryRow row in batch)
                {
                    copy.StartRow();
                    copy.Write(seq++, NpgsqlDbType.Bigint);
                    copy.Write(row.Id, NpgsqlDbType.Text);
                    copy.Write(row.Formula, NpgsqlDbType.Text);
                    // As in CopyEntries: +0 for -0, so that staged rows read back as they will once committed.
                    copy.Write(row.EnergyEv + 0.0, NpgsqlDbType.Double);
                    copy.Write(row.Basis, NpgsqlDbType.Text);
                    copy.Write(row.Metadata ?? string.Empty, NpgsqlDbType.Text);
                    WriteModel(copy, row.TemperatureModel);
                    WriteUncertainty(copy, row);
                    WriteMethod(copy, row);
                }
                copy.Complete();
            }

            long staged = session.StagedCount + batch.Length;
            connection.Execute(transaction, "UPDATE import_sessions SET staged_count = @c, expires_at_ms = @e WHERE session_key = @k",
                ("@c", staged), ("@e", expires.ToUnixTimeMilliseconds()), ("@k", session.Key));
            return new ImportSessionInfo(sessionId, session.DatasetName, session.Policy, staged, expires);
        });
    }

    /// <inheritdoc />
    public StagedImport ReadStagedImport(string sessionId, IReadOnlyCollection<string>? bases = null)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        DateTimeOffset now = _clock.GetUtcNow();
        string[]? tokens = bases?.Distinct(StringComparer.Ordinal).ToArray();
        return Read((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            string filter = tokens is null ? string.Empty : "WHERE energy_basis = ANY(@bases)";
            string staging = StagingTable(session.Key);
            string models = StagingHasModelColumns(connection, transaction, staging) ? TemperatureModelColumns.StagingNames : "NULL, NULL, NULL, NULL";
            string uncertainties = StagingUncertaintySelect(connection, transaction, staging);
            string method = StagingMethodSelect(connection, transaction, staging);
            using NpgsqlCommand select = connection.Command(transaction,
                $"SELECT seq, entry_id, formula, energy_ev, energy_basis, metadata, {models}, {uncertainties}, {method} FROM {staging} {filter} ORDER BY seq");
            if (tokens is not null) select.With("@bases", tokens);
            using NpgsqlDataReader reader = select.ExecuteReader();
            var rows = new List<StagedRow>();
            while (reader.Read())
            {
                var row = new EntryRow(reader.GetString(1), reader.GetString(2), reader.GetDouble(3), reader.GetString(4), reader.GetString(5),
                    TemperatureModelColumns.Read(reader, 6), reader.IsDBNull(10) ? null : reader.GetDouble(10), reader.IsDBNull(11) ? null : reader.GetString(11),
                    reader.IsDBNull(12) ? null : reader.GetString(12));
                rows.Add(new StagedRow(checked((int)reader.GetInt64(0)), row));
            }
            return new StagedImport(
                new ImportSessionInfo(sessionId, session.DatasetName, session.Policy, session.StagedCount, session.ExpiresAtUtc), rows);
        });
    }

    /// <inheritdoc />
    public ImportResult CommitImport(string sessionId, long? checkedStagedCount = null, long? basedOn = null)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        DateTimeOffset now = _clock.GetUtcNow();
        return Write((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            if (session.StagedCount == 0) throw new InvalidBatchException($"import session '{sessionId}' has no staged entries; stage at least one before committing");
            if (checkedStagedCount is long expected && expected != session.StagedCount)
            {
                throw new ImportSessionChangedException(sessionId, expected, session.StagedCount);
            }
            LiveVersion? previous = FindLatestLive(connection, transaction, session.DatasetId);
            StoreArguments.CheckBase(session.DatasetName, basedOn, previous?.Version);
            long newVersion = session.LastVersionIssued + 1;
            string staging = StagingTable(session.Key);

            int replaced = 0;
            if (session.Policy == DuplicatePolicy.Replace)
            {
                replaced = connection.Execute(transaction, $"""
                    UPDATE entries SET last_version_exclusive = @v
                    WHERE dataset_id = @d AND last_version_exclusive IS NULL AND entry_id IN (SELECT entry_id FROM {staging})
                    """, ("@v", newVersion), ("@d", session.DatasetId));
            }
            if (session.CurationRecord is not null) CloseUnstagedRows(connection, transaction, session.DatasetId, newVersion);

            // The open-row index refuses a second open row of an id: a repeat inside the session, or (Reject) a stored
            // id. A failed statement spoils the transaction, so the move runs under a savepoint to ask which row it was.
            transaction.Save("move");
            try
            {
                connection.Execute(transaction, $"""
                    INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, {StagingUncertaintyNames}, method, first_version)
                    SELECT @d, entry_id, formula, energy_ev, energy_basis, metadata, {StagingUncertaintySelect(connection, transaction, staging)},
                           {StagingMethodSelect(connection, transaction, staging)}, @v FROM {staging} ORDER BY seq
                    """, ("@d", session.DatasetId), ("@v", newVersion));
            }
            catch (PostgresException e) when (e.SqlState == PostgresErrorCodes.UniqueViolation)
            {
                transaction.Rollback("move");
                throw DescribeCommitDuplicate(connection, transaction, session, staging, previous);
            }
            transaction.Release("move");

            // The models go to the rows just moved: ids are unique in the session, so (id, new version) finds each.
            if (StagingHasModelColumns(connection, transaction, staging))
            {
                connection.Execute(transaction, $"""
                    INSERT INTO entry_temperature_models (row_id, formula, standard_entropy_j_per_mol_k, free_energy_anchor, free_energy_points)
                    SELECT e.row_id, s.model_formula, s.standard_entropy_j_per_mol_k, s.free_energy_anchor, s.free_energy_points
                    FROM {staging} AS s JOIN entries AS e ON e.dataset_id = @d AND e.entry_id = s.entry_id AND e.first_version = @v
                    WHERE s.model_formula IS NOT NULL
                    """, ("@d", session.DatasetId), ("@v", newVersion));
            }

            int count = checked((int)session.StagedCount);
            int inserted = count - replaced;
            // A derived version holds the staged rows only.
            IssueVersion(connection, transaction, session.DatasetId, newVersion, now, session.Provenance, count, inserted, replaced,
                session.CurationRecord is null ? (previous?.EntryCount ?? 0) + inserted : count);
            RecordSessionCorrections(connection, transaction, session.Key, session.DatasetId, newVersion);
            if (session.CurationRecord is not null) InsertCurationRecord(connection, transaction, session.DatasetId, newVersion, session.CurationRecord);
            DropSession(connection, transaction, session.Key);
            return new ImportResult(newVersion, inserted, replaced);
        });
    }

    /// <inheritdoc />
    public void CancelImport(string sessionId)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        DateTimeOffset now = _clock.GetUtcNow();
        Write((connection, transaction) =>
        {
            DropSession(connection, transaction, FindOpenSession(connection, transaction, sessionId, now).Key);
            return 0;
        });
    }

    /// <inheritdoc />
    public IReadOnlyList<ImportSessionInfo> ListImports(string datasetName)
    {
        DatasetName.Validate(datasetName);
        long nowMs = _clock.GetUtcNow().ToUnixTimeMilliseconds();
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using NpgsqlCommand command = connection.Command(transaction, """
                SELECT session_id, duplicate_policy, staged_count, expires_at_ms FROM import_sessions
                WHERE dataset_id = @d AND expires_at_ms > @now ORDER BY session_key
                """).With("@d", dataset.DatasetId).With("@now", nowMs);
            using NpgsqlDataReader reader = command.ExecuteReader();
            var sessions = new List<ImportSessionInfo>();
            while (reader.Read())
            {
                sessions.Add(new ImportSessionInfo(reader.GetString(0), datasetName, StoreArguments.ParsePolicy(reader.GetString(1)),
                    reader.GetInt64(2), DateTimeOffset.FromUnixTimeMilliseconds(reader.GetInt64(3))));
            }
            return (IReadOnlyList<ImportSessionInfo>)sessions;
        });
    }

    /// <inheritdoc />
    public int RemoveExpiredImports()
    {
        long nowMs = _clock.GetUtcNow().ToUnixTimeMilliseconds();
        return Write((connection, transaction) =>
        {
            var lapsed = new List<long>();
            using (NpgsqlCommand select = connection.Command(transaction, "SELECT session_key FROM import_sessions WHERE expires_at_ms <= @now").With("@now", nowMs))
            using (NpgsqlDataReader reader = select.ExecuteReader())
            {
                while (reader.Read()) lapsed.Add(reader.GetInt64(0));
            }
            foreach (long key in lapsed) DropSession(connection, transaction, key);
            foreach (long key in OrphanStagingKeys(connection, transaction)) DropStagingTable(connection, transaction, key);
            return lapsed.Count;
        });
    }

    /// <inheritdoc />
    public long CountStagedRows() => Read((connection, transaction) =>
    {
        long total = 0;
        foreach (long key in StagingKeys(connection, transaction))
        {
            using NpgsqlCommand count = connection.Command(transaction, $"SELECT count(*) FROM {StagingTable(key)}");
            total += (long)count.ExecuteScalar()!;
        }
        return total;
    });

    private sealed record OpenSession(
        long Key, long DatasetId, string DatasetName, long LastVersionIssued, DuplicatePolicy Policy, BatchProvenance Provenance, long StagedCount,
        DateTimeOffset ExpiresAtUtc, string? CurationRecord = null);

    private const string StagingPrefix = "staged_";

    // The model columns of a staging table, as TemperatureModelColumns.StagingNames names them (all NULL for none).
    private const string StagingModelDefinitions =
        "model_formula text NULL, standard_entropy_j_per_mol_k double precision NULL, free_energy_anchor text NULL, free_energy_points bytea NULL";

    // The uncertainty columns of a staging table, named as in entries (both NULL for none).
    private const string StagingUncertaintyDefinitions = "energy_sigma_ev_per_atom double precision NULL, correlation_group text NULL";

    private const string StagingUncertaintyNames = "energy_sigma_ev_per_atom, correlation_group";

    // The staging table's uncertainty columns, or two NULLs for one made before schema step 6.
    private static string StagingUncertaintySelect(NpgsqlConnection connection, NpgsqlTransaction transaction, string staging)
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT count(*) FROM information_schema.columns
            WHERE table_schema = current_schema() AND table_name = @t AND column_name = 'correlation_group'
            """).With("@t", staging);
        return (long)command.ExecuteScalar()! == 1 ? StagingUncertaintyNames : "NULL, NULL";
    }

    // The method column of a staging table, named as in entries (NULL for untagged).
    private const string StagingMethodDefinition = "method text NULL";

    // The staging table's method column, or NULL for one made before schema step 7.
    private static string StagingMethodSelect(NpgsqlConnection connection, NpgsqlTransaction transaction, string staging)
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT count(*) FROM information_schema.columns
            WHERE table_schema = current_schema() AND table_name = @t AND column_name = 'method'
            """).With("@t", staging);
        return (long)command.ExecuteScalar()! == 1 ? "method" : "NULL";
    }

    private static bool StagingHasModelColumns(NpgsqlConnection connection, NpgsqlTransaction transaction, string staging)
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT count(*) FROM information_schema.columns
            WHERE table_schema = current_schema() AND table_name = @t AND column_name = 'free_energy_points'
            """).With("@t", staging);
        return (long)command.ExecuteScalar()! == 1;
    }

    private static void WriteModel(NpgsqlBinaryImporter copy, StoredTemperatureModel? model)
    {
        if (model is null)
        {
            for (int i = 0; i < 4; i++) copy.WriteNull();
            return;
        }
        copy.Write(model.Formula, NpgsqlDbType.Text);
        if (model.StandardEntropyJPerMolK is double entropy) copy.Write(entropy + 0.0, NpgsqlDbType.Double);
        else copy.WriteNull();
        if (model.FreeEnergyAnchor is string anchor) copy.Write(anchor, NpgsqlDbType.Text);
        else copy.WriteNull();
        if (model.IsFreeEnergyTable) copy.Write(TemperatureModelColumns.Encode(model.FreeEnergyPoints), NpgsqlDbType.Bytea);
        else copy.WriteNull();
    }

    /// <summary>The staging table of a session; the name is built from an integer key only, never from caller text.</summary>
    private static string StagingTable(long key) => StagingPrefix + key.ToString(CultureInfo.InvariantCulture);

    private static OpenSession FindOpenSession(NpgsqlConnection connection, NpgsqlTransaction transaction, string sessionId, DateTimeOffset now)
    {
        using NpgsqlCommand command = connection.Command(transaction, """
            SELECT s.session_key, s.dataset_id, d.name, d.last_version_issued, s.duplicate_policy, s.source_label, s.note, s.staged_count, s.expires_at_ms,
                   s.curation_record
            FROM import_sessions s JOIN datasets d ON d.dataset_id = s.dataset_id
            WHERE s.session_id = @s
            """).With("@s", sessionId);
        using NpgsqlDataReader reader = command.ExecuteReader();
        if (!reader.Read()) throw new ImportSessionNotFoundException(sessionId, expired: false);
        if (reader.GetInt64(8) <= now.ToUnixTimeMilliseconds()) throw new ImportSessionNotFoundException(sessionId, expired: true);
        return new OpenSession(reader.GetInt64(0), reader.GetInt64(1), reader.GetString(2), reader.GetInt64(3),
            StoreArguments.ParsePolicy(reader.GetString(4)), new BatchProvenance(reader.GetString(5), reader.GetString(6)), reader.GetInt64(7),
            DateTimeOffset.FromUnixTimeMilliseconds(reader.GetInt64(8)), reader.IsDBNull(9) ? null : reader.GetString(9));
    }

    /// <summary>Which staged row broke the open-row index: the first repeat inside the session, else the first stored id.</summary>
    private static DuplicateEntryException DescribeCommitDuplicate(
        NpgsqlConnection connection, NpgsqlTransaction transaction, OpenSession session, string staging, LiveVersion? previous)
    {
        using (NpgsqlCommand repeat = connection.Command(transaction, $"""
                   SELECT later.seq, later.entry_id, min(earlier.seq) FROM {staging} later
                   JOIN {staging} earlier ON earlier.entry_id = later.entry_id AND earlier.seq < later.seq
                   GROUP BY later.seq, later.entry_id ORDER BY later.seq LIMIT 1
                   """))
        using (NpgsqlDataReader reader = repeat.ExecuteReader())
        {
            if (reader.Read())
            {
                return StoreArguments.RepeatedInSession(checked((int)reader.GetInt64(0)), reader.GetString(1), checked((int)reader.GetInt64(2)));
            }
        }

        using NpgsqlCommand stored = connection.Command(transaction, $"""
            SELECT s.seq, s.entry_id FROM {staging} s
            JOIN entries e ON e.dataset_id = @d AND e.entry_id = s.entry_id AND e.last_version_exclusive IS NULL
            ORDER BY s.seq LIMIT 1
            """).With("@d", session.DatasetId);
        using NpgsqlDataReader found = stored.ExecuteReader();
        if (!found.Read()) throw new InvalidOperationException("a unique constraint failed at commit, but no staged id repeats or is stored");
        return StoreArguments.AlreadyStored(checked((int)found.GetInt64(0)), found.GetString(1), session.DatasetName, previous?.Version, rowPrefix: false);
    }

    private static void DropSession(NpgsqlConnection connection, NpgsqlTransaction transaction, long key)
    {
        DropStagingTable(connection, transaction, key);
        connection.Execute(transaction, "DELETE FROM import_sessions WHERE session_key = @k", ("@k", key));
    }

    private static void DropStagingTable(NpgsqlConnection connection, NpgsqlTransaction transaction, long key) =>
        connection.Execute(transaction, $"DROP TABLE IF EXISTS {StagingTable(key)}");

    /// <summary>The keys of every staging table in the store's schema.</summary>
    private static List<long> StagingKeys(NpgsqlConnection connection, NpgsqlTransaction transaction)
    {
        var keys = new List<long>();
        using NpgsqlCommand command = connection.Command(transaction,
            "SELECT tablename FROM pg_tables WHERE schemaname = current_schema() AND tablename LIKE 'staged\\_%'");
        using NpgsqlDataReader reader = command.ExecuteReader();
        while (reader.Read())
        {
            if (long.TryParse(reader.GetString(0).AsSpan(StagingPrefix.Length), NumberStyles.None, CultureInfo.InvariantCulture, out long key)) keys.Add(key);
        }
        return keys;
    }

    private static List<long> OrphanStagingKeys(NpgsqlConnection connection, NpgsqlTransaction transaction)
    {
        var open = new HashSet<long>();
        using (NpgsqlCommand command = connection.Command(transaction, "SELECT session_key FROM import_sessions"))
        using (NpgsqlDataReader reader = command.ExecuteReader())
        {
            while (reader.Read()) open.Add(reader.GetInt64(0));
        }
        return StagingKeys(connection, transaction).Where(k => !open.Contains(k)).ToList();
    }
}
