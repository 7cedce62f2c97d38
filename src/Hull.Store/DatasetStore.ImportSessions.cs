using System.Globalization;
using System.Security.Cryptography;
using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Import sessions: many batches, one version. Batches are staged apart from the entries, in a table of the session's
// own that no read looks at, and the commit moves them all into one new version in one transaction, so a session
// that is cancelled, lapses, or whose client or server dies leaves no version and no entry behind.
//
// Two sessions may be open on one dataset at once. Each commit applies its rows on top of the latest version at the
// moment it commits; version numbers follow commit order. Under Reject, an id that another session committed in
// the meantime fails the later commit (nothing written, the session stays open to be cancelled or to lapse).
// Repeated and already-stored ids are found at the commit, which names the row by its place in the session.
// The server checks the staged rows (ReadStagedImport) before the commit; the commit takes the count it checked and
// refuses when a batch was staged since, so no row reaches a version unchecked.
public sealed partial class DatasetStore
{
    /// <summary>
    /// Opens an import session on a dataset. It lapses <paramref name="idleExpiry"/> after the last call that named it;
    /// <see cref="RemoveExpiredImports"/> then removes it with its staged rows.
    /// </summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
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
            using SqliteCommand insert = connection.Command(transaction, """
                INSERT INTO import_sessions (session_id, dataset_id, duplicate_policy, source_label, note, started_at_utc, expires_at_ms, curation_record)
                VALUES ($s, $d, $p, $source, $note, $t, $e, $curation)
                RETURNING session_key
                """);
            insert.Parameters.AddWithValue("$curation", (object?)curationRecord ?? DBNull.Value);
            insert.With("$s", sessionId).With("$d", dataset.DatasetId).With("$p", StoreArguments.PolicyToken(policy))
                .With("$source", provenance.SourceLabel ?? string.Empty).With("$note", provenance.Note ?? string.Empty)
                .With("$t", UtcText.Write(now)).With("$e", expires.ToUnixTimeMilliseconds());
            long key = (long)insert.ExecuteScalar()!;
            using SqliteCommand create = connection.Command(transaction, $"""
                CREATE TABLE {StagingTable(key)} (
                    entry_id     TEXT NOT NULL,
                    formula      TEXT NOT NULL,
                    energy_ev    REAL NOT NULL,
                    energy_basis TEXT NOT NULL,
                    metadata     TEXT NOT NULL,
                    {TemperatureModelColumns.StagingDefinitions},
                    {UncertaintyColumns.StagingDefinitions},
                    {MethodColumn.StagingDefinition}
                )
                """);
            create.ExecuteNonQuery();
            return new ImportSessionInfo(sessionId, datasetName, policy, 0, expires);
        });
    }

    /// <summary>
    /// Adds a batch to an open session, all or nothing, and extends its expiry by <paramref name="idleExpiry"/> from now.
    /// </summary>
    /// <exception cref="InvalidBatchException">Empty batch or a faulty row (index in this batch named), ids repeated in the batch.</exception>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
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
            TemperatureModelColumns.EnsureStagingColumns(connection, transaction, StagingTable(session.Key));
            UncertaintyColumns.EnsureStagingColumns(connection, transaction, StagingTable(session.Key));
            MethodColumn.EnsureStagingColumn(connection, transaction, StagingTable(session.Key));
            using SqliteCommand insert = connection.Command(transaction, $"""
                INSERT INTO {StagingTable(session.Key)} (entry_id, formula, energy_ev, energy_basis, metadata, {TemperatureModelColumns.StagingNames}, {UncertaintyColumns.Names}, {MethodColumn.Name})
                VALUES ($id, $formula, $energy, $basis, $metadata, $model_formula, $entropy, $anchor, $points, $sigma, $group, $method)
                """);
            SqliteParameter id = insert.Parameters.Add("$id", SqliteType.Text);
            SqliteParameter formula = insert.Parameters.Add("$formula", SqliteType.Text);
            SqliteParameter energy = insert.Parameters.Add("$energy", SqliteType.Real);
            SqliteParameter basis = insert.Parameters.Add("$basis", SqliteType.Text);
            SqliteParameter metadata = insert.Parameters.Add("$metadata", SqliteType.Text);
            var (modelFormula, entropy, anchor, points) = TemperatureModelColumns.AddParameters(insert);
            var (sigma, group) = UncertaintyColumns.AddParameters(insert);
            SqliteParameter method = MethodColumn.AddParameter(insert);
            insert.Prepare();
            foreach (EntryRow row in batch)
            {
                id.Value = row.Id;
                formula.Value = row.Formula;
                // SQLite reads -0.0 back as 0.0; store the +0 it will return so the row reads back exactly.
                energy.Value = row.EnergyEv + 0.0;
                basis.Value = row.Basis;
                metadata.Value = row.Metadata ?? string.Empty;
                TemperatureModelColumns.Bind(row.TemperatureModel, modelFormula, entropy, anchor, points);
                UncertaintyColumns.Bind(row, sigma, group);
                MethodColumn.Bind(row, method);
                insert.ExecuteNonQuery();
            }

            long staged = session.StagedCount + batch.Length;
            using (SqliteCommand update = connection.Command(transaction,
                       "UPDATE import_sessions SET staged_count = $c, expires_at_ms = $e WHERE session_key = $k"))
            {
                update.With("$c", staged).With("$e", expires.ToUnixTimeMilliseconds()).With("$k", session.Key).ExecuteNonQuery();
            }
            return new ImportSessionInfo(sessionId, session.DatasetName, session.Policy, staged, expires);
        });
    }

    /// <summary>
    /// The open session with the rows staged so far, in staging order, each with its 0-based place in the whole
    /// session (<c>staged[k]</c> in errors), so that the server can check them as one batch before
    /// <see cref="CommitImport"/>.
    /// </summary>
    /// <param name="sessionId">The session.</param>
    /// <param name="bases">Only rows whose basis token is one of these (matched as text, not interpreted); null for every row.</param>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    public StagedImport ReadStagedImport(string sessionId, IReadOnlyCollection<string>? bases = null)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        DateTimeOffset now = _clock.GetUtcNow();
        string[]? tokens = bases?.Distinct(StringComparer.Ordinal).ToArray();
        return Read((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            string filter = tokens is null ? string.Empty
                : tokens.Length == 0 ? "WHERE 0"
                : "WHERE energy_basis IN (" + string.Join(", ", tokens.Select((_, i) => $"$b{i}")) + ")";
            string staging = StagingTable(session.Key);
            // A session begun before migration 5 has no model columns: its rows have no models.
            string models = TemperatureModelColumns.StagingHasModelColumns(connection, transaction, staging)
                ? TemperatureModelColumns.StagingNames
                : "NULL, NULL, NULL, NULL";
            // One begun before migration 6 has no uncertainty columns: its rows have none.
            string uncertainties = UncertaintyColumns.StagingSelect(connection, transaction, staging);
            // And one begun before migration 7 has no method column: its rows are untagged.
            string method = MethodColumn.StagingSelect(connection, transaction, staging);
            using SqliteCommand select = connection.Command(transaction,
                $"SELECT rowid, entry_id, formula, energy_ev, energy_basis, metadata, {models}, {uncertainties}, {method} FROM {staging} {filter} ORDER BY rowid");
            for (int i = 0; i < (tokens?.Length ?? 0); i++) select.With($"$b{i}", tokens![i]);
            using SqliteDataReader reader = select.ExecuteReader();
            var rows = new List<StagedRow>();
            while (reader.Read())
            {
                // Staging tables are appended to only, so rowid k+1 is the session's row k.
                var (sigma, group) = UncertaintyColumns.Read(reader, 10);
                var row = new EntryRow(reader.GetString(1), reader.GetString(2), reader.GetDouble(3), reader.GetString(4), reader.GetString(5),
                    TemperatureModelColumns.Read(reader, 6), sigma, group, MethodColumn.Read(reader, 12));
                rows.Add(new StagedRow(checked((int)(reader.GetInt64(0) - 1)), row));
            }
            return new StagedImport(
                new ImportSessionInfo(sessionId, session.DatasetName, session.Policy, session.StagedCount, session.ExpiresAtUtc), rows);
        });
    }

    /// <summary>
    /// Writes every staged row of the session as one new version (latest issued version + 1) and closes the session,
    /// in one transaction. A refusal writes nothing and leaves the session open.
    /// </summary>
    /// <exception cref="InvalidBatchException">Nothing was staged.</exception>
    /// <exception cref="DuplicateEntryException">An id staged twice, or under Reject one the latest version holds; the row
    /// index is the row's 0-based place in the whole session.</exception>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    /// <exception cref="ImportSessionChangedException">The session no longer holds <paramref name="checkedStagedCount"/> rows.</exception>
    /// <param name="sessionId">The session to commit.</param>
    /// <param name="checkedStagedCount">How many rows the caller checked (from <see cref="ReadStagedImport"/>); a batch
    /// staged since then would be written unchecked, so the commit is refused. Null commits whatever is staged.</param>
    /// <param name="basedOn">The latest version the caller checked the rows against; null commits on whatever is latest.</param>
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
            string uncertainties = UncertaintyColumns.StagingSelect(connection, transaction, staging);
            string method = MethodColumn.StagingSelect(connection, transaction, staging);

            int replaced = 0;
            if (session.Policy == DuplicatePolicy.Replace)
            {
                using SqliteCommand close = connection.Command(transaction, $"""
                    UPDATE entries SET last_version_exclusive = $v
                    WHERE dataset_id = $d AND last_version_exclusive IS NULL AND entry_id IN (SELECT entry_id FROM {staging})
                    """);
                replaced = close.With("$v", newVersion).With("$d", session.DatasetId).ExecuteNonQuery();
            }
            if (session.CurationRecord is not null) CloseUnstagedRows(connection, transaction, session.DatasetId, newVersion);

            // The open-row index refuses a second open row of an id: a repeat inside the session, or (Reject) a stored id.
            using (SqliteCommand move = connection.Command(transaction, $"""
                       INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, {UncertaintyColumns.Names}, {MethodColumn.Name}, first_version)
                       SELECT $d, entry_id, formula, energy_ev, energy_basis, metadata, {uncertainties}, {method}, $v FROM {staging} ORDER BY rowid
                       """))
            {
                try
                {
                    move.With("$d", session.DatasetId).With("$v", newVersion).ExecuteNonQuery();
                }
                catch (SqliteException e) when (e.SqliteExtendedErrorCode == SqliteConstraintUnique)
                {
                    throw DescribeCommitDuplicate(connection, transaction, session, staging, previous);
                }
            }

            // The models go to the rows just moved: ids are unique in the session, so (id, new version) finds each.
            // CROSS JOIN keeps the staging table outside: each of its rows finds its entry by index, where the
            // planner's own order scanned the unindexed staging table once per entry row (quadratic in the import).
            if (TemperatureModelColumns.StagingHasModelColumns(connection, transaction, staging))
            {
                using SqliteCommand models = connection.Command(transaction, $"""
                    INSERT INTO entry_temperature_models (row_id, formula, standard_entropy_j_per_mol_k, free_energy_anchor, free_energy_points)
                    SELECT e.row_id, s.model_formula, s.standard_entropy_j_per_mol_k, s.free_energy_anchor, s.free_energy_points
                    FROM {staging} AS s CROSS JOIN entries AS e ON e.dataset_id = $d AND e.entry_id = s.entry_id AND e.first_version = $v
                    WHERE s.model_formula IS NOT NULL
                    """);
                models.With("$d", session.DatasetId).With("$v", newVersion).ExecuteNonQuery();
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

    /// <summary>Drops an open session with its staged rows; nothing of it was ever visible.</summary>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
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

    /// <summary>The open sessions of a dataset, oldest first (lapsed ones not included).</summary>
    public IReadOnlyList<ImportSessionInfo> ListImports(string datasetName)
    {
        DatasetName.Validate(datasetName);
        long nowMs = _clock.GetUtcNow().ToUnixTimeMilliseconds();
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using SqliteCommand command = connection.Command(transaction, """
                SELECT session_id, duplicate_policy, staged_count, expires_at_ms FROM import_sessions
                WHERE dataset_id = $d AND expires_at_ms > $now ORDER BY session_key
                """).With("$d", dataset.DatasetId).With("$now", nowMs);
            using SqliteDataReader reader = command.ExecuteReader();
            var sessions = new List<ImportSessionInfo>();
            while (reader.Read())
            {
                sessions.Add(new ImportSessionInfo(reader.GetString(0), datasetName, StoreArguments.ParsePolicy(reader.GetString(1)), reader.GetInt64(2),
                    DateTimeOffset.FromUnixTimeMilliseconds(reader.GetInt64(3))));
            }
            return sessions;
        });
    }

    /// <summary>
    /// Removes every lapsed session with its staged rows, and any staging table whose session is gone (a dataset
    /// deleted under it); returns how many sessions went.
    /// </summary>
    public int RemoveExpiredImports()
    {
        long nowMs = _clock.GetUtcNow().ToUnixTimeMilliseconds();
        return Write((connection, transaction) =>
        {
            var lapsed = new List<long>();
            using (SqliteCommand select = connection.Command(transaction, "SELECT session_key FROM import_sessions WHERE expires_at_ms <= $now").With("$now", nowMs))
            using (SqliteDataReader reader = select.ExecuteReader())
            {
                while (reader.Read()) lapsed.Add(reader.GetInt64(0));
            }
            foreach (long key in lapsed) DropSession(connection, transaction, key);
            foreach (long key in OrphanStagingKeys(connection, transaction)) DropStagingTable(connection, transaction, key);
            return lapsed.Count;
        });
    }

    /// <summary>Rows staged by sessions not yet removed, lapsed ones included: what staging holds on disk.</summary>
    public long CountStagedRows() => Read((connection, transaction) =>
    {
        long total = 0;
        foreach (long key in StagingKeys(connection, transaction))
        {
            using SqliteCommand count = connection.Command(transaction, $"SELECT count(*) FROM {StagingTable(key)}");
            total += (long)count.ExecuteScalar()!;
        }
        return total;
    });

    private sealed record OpenSession(
        long Key, long DatasetId, string DatasetName, long LastVersionIssued, DuplicatePolicy Policy, BatchProvenance Provenance, long StagedCount,
        DateTimeOffset ExpiresAtUtc, string? CurationRecord = null);

    private const string StagingPrefix = "staged_";

    /// <summary>The staging table of a session; the name is built from an integer key only, never from caller text.</summary>
    private static string StagingTable(long key) => StagingPrefix + key.ToString(CultureInfo.InvariantCulture);

    /// <summary>The session under the write lock; a lapsed one is reported as expired (and left to the sweep).</summary>
    private static OpenSession FindOpenSession(SqliteConnection connection, SqliteTransaction transaction, string sessionId, DateTimeOffset now)
    {
        using SqliteCommand command = connection.Command(transaction, """
            SELECT s.session_key, s.dataset_id, d.name, d.last_version_issued, s.duplicate_policy, s.source_label, s.note, s.staged_count, s.expires_at_ms,
                   s.curation_record
            FROM import_sessions s JOIN datasets d ON d.dataset_id = s.dataset_id
            WHERE s.session_id = $s
            """).With("$s", sessionId);
        using SqliteDataReader reader = command.ExecuteReader();
        if (!reader.Read()) throw new ImportSessionNotFoundException(sessionId, expired: false);
        if (reader.GetInt64(8) <= now.ToUnixTimeMilliseconds()) throw new ImportSessionNotFoundException(sessionId, expired: true);
        return new OpenSession(reader.GetInt64(0), reader.GetInt64(1), reader.GetString(2), reader.GetInt64(3), StoreArguments.ParsePolicy(reader.GetString(4)),
            new BatchProvenance(reader.GetString(5), reader.GetString(6)), reader.GetInt64(7), DateTimeOffset.FromUnixTimeMilliseconds(reader.GetInt64(8)),
            reader.IsDBNull(9) ? null : reader.GetString(9));
    }

    /// <summary>Which staged row broke the open-row index: the first repeat inside the session, else the first stored id.</summary>
    private static DuplicateEntryException DescribeCommitDuplicate(
        SqliteConnection connection, SqliteTransaction transaction, OpenSession session, string staging, LiveVersion? previous)
    {
        using (SqliteCommand repeat = connection.Command(transaction, $"""
                   SELECT later.rowid, later.entry_id, min(earlier.rowid) FROM {staging} later
                   JOIN {staging} earlier ON earlier.entry_id = later.entry_id AND earlier.rowid < later.rowid
                   GROUP BY later.rowid ORDER BY later.rowid LIMIT 1
                   """))
        using (SqliteDataReader reader = repeat.ExecuteReader())
        {
            if (reader.Read())
            {
                int index = checked((int)(reader.GetInt64(0) - 1));
                int first = checked((int)(reader.GetInt64(2) - 1));
                return StoreArguments.RepeatedInSession(index, reader.GetString(1), first);
            }
        }

        using SqliteCommand stored = connection.Command(transaction, $"""
            SELECT s.rowid, s.entry_id FROM {staging} s
            JOIN entries e ON e.dataset_id = $d AND e.entry_id = s.entry_id AND e.last_version_exclusive IS NULL
            ORDER BY s.rowid LIMIT 1
            """).With("$d", session.DatasetId);
        using SqliteDataReader found = stored.ExecuteReader();
        if (!found.Read()) throw new InvalidOperationException("a unique constraint failed at commit, but no staged id repeats or is stored");
        int row = checked((int)(found.GetInt64(0) - 1));
        string id = found.GetString(1);
        return StoreArguments.AlreadyStored(row, id, session.DatasetName, previous?.Version, rowPrefix: false);
    }

    private static void DropSession(SqliteConnection connection, SqliteTransaction transaction, long key)
    {
        DropStagingTable(connection, transaction, key);
        using SqliteCommand delete = connection.Command(transaction, "DELETE FROM import_sessions WHERE session_key = $k").With("$k", key);
        delete.ExecuteNonQuery();
    }

    private static void DropStagingTable(SqliteConnection connection, SqliteTransaction transaction, long key)
    {
        using SqliteCommand drop = connection.Command(transaction, $"DROP TABLE IF EXISTS {StagingTable(key)}");
        drop.ExecuteNonQuery();
    }

    /// <summary>The keys of every staging table in the file.</summary>
    private static List<long> StagingKeys(SqliteConnection connection, SqliteTransaction transaction)
    {
        var keys = new List<long>();
        using SqliteCommand command = connection.Command(transaction,
            "SELECT name FROM sqlite_master WHERE type = 'table' AND name LIKE 'staged\\_%' ESCAPE '\\'");
        using SqliteDataReader reader = command.ExecuteReader();
        while (reader.Read())
        {
            if (long.TryParse(reader.GetString(0).AsSpan(StagingPrefix.Length), NumberStyles.None, CultureInfo.InvariantCulture, out long key)) keys.Add(key);
        }
        return keys;
    }

    private static List<long> OrphanStagingKeys(SqliteConnection connection, SqliteTransaction transaction)
    {
        var open = new HashSet<long>();
        using (SqliteCommand command = connection.Command(transaction, "SELECT session_key FROM import_sessions"))
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            while (reader.Read()) open.Add(reader.GetInt64(0));
        }
        return StagingKeys(connection, transaction).Where(k => !open.Contains(k)).ToList();
    }
}
