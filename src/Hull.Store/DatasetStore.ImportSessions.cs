using System.Security.Cryptography;
using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Import sessions: many batches, one version. Batches are staged apart from the entries (invisible to every read)
// and the commit moves them all into one new version in one transaction, so a session that is cancelled, lapses,
// or whose client or server dies leaves no version and no entry behind.
//
// Two sessions may be open on one dataset at once. Each commit applies its rows on top of the latest version at the
// moment it commits; version numbers follow commit order. Under Reject, an id that another session committed in
// the meantime fails the later commit (nothing written, the session stays open to be cancelled or to lapse).
public sealed partial class DatasetStore
{
    /// <summary>
    /// Opens an import session on a dataset. It lapses <paramref name="idleExpiry"/> after the last call that named it;
    /// <see cref="RemoveExpiredImports"/> then removes it with its staged rows.
    /// </summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    public ImportSessionInfo BeginImport(string datasetName, DuplicatePolicy policy, BatchProvenance provenance, TimeSpan idleExpiry)
    {
        DatasetName.Validate(datasetName);
        ArgumentNullException.ThrowIfNull(provenance);
        CheckPolicy(policy);
        if (idleExpiry <= TimeSpan.Zero) throw new ArgumentOutOfRangeException(nameof(idleExpiry), idleExpiry, "must be positive");
        DateTimeOffset now = _clock.GetUtcNow();
        DateTimeOffset expires = now + idleExpiry;
        string sessionId = Convert.ToHexStringLower(RandomNumberGenerator.GetBytes(16));
        return Write((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using SqliteCommand insert = connection.Command(transaction, """
                INSERT INTO import_sessions (session_id, dataset_id, duplicate_policy, source_label, note, started_at_utc, expires_at_ms)
                VALUES ($s, $d, $p, $source, $note, $t, $e)
                """);
            insert.With("$s", sessionId).With("$d", dataset.DatasetId).With("$p", PolicyToken(policy))
                .With("$source", provenance.SourceLabel ?? string.Empty).With("$note", provenance.Note ?? string.Empty)
                .With("$t", UtcText.Write(now)).With("$e", expires.ToUnixTimeMilliseconds());
            insert.ExecuteNonQuery();
            return new ImportSessionInfo(sessionId, datasetName, policy, 0, expires);
        });
    }

    /// <summary>
    /// Adds a batch to an open session, all or nothing, and extends its expiry by <paramref name="idleExpiry"/> from now.
    /// Under Reject an id already in the latest version fails the batch here (and again at commit, for commits made meanwhile).
    /// </summary>
    /// <exception cref="InvalidBatchException">Empty batch or a faulty row (index in this batch named).</exception>
    /// <exception cref="DuplicateEntryException">An id repeated in the batch, already staged in the session, or (Reject) stored.</exception>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    public ImportSessionInfo StageBatch(string sessionId, IReadOnlyList<EntryRow> rows, TimeSpan idleExpiry)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        ArgumentNullException.ThrowIfNull(rows);
        if (idleExpiry <= TimeSpan.Zero) throw new ArgumentOutOfRangeException(nameof(idleExpiry), idleExpiry, "must be positive");
        EntryRow[] batch = [.. rows];
        BatchValidator.Validate(batch);
        DateTimeOffset now = _clock.GetUtcNow();
        DateTimeOffset expires = now + idleExpiry;
        return Write((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            using SqliteCommand insert = connection.Command(transaction, """
                INSERT INTO staged_entries (session_id, seq, entry_id, formula, energy_ev, energy_basis, metadata)
                VALUES ($s, $seq, $id, $formula, $energy, $basis, $metadata)
                """);
            insert.With("$s", sessionId);
            SqliteParameter seq = insert.Parameters.Add("$seq", SqliteType.Integer);
            SqliteParameter id = insert.Parameters.Add("$id", SqliteType.Text);
            SqliteParameter formula = insert.Parameters.Add("$formula", SqliteType.Text);
            SqliteParameter energy = insert.Parameters.Add("$energy", SqliteType.Real);
            SqliteParameter basis = insert.Parameters.Add("$basis", SqliteType.Text);
            SqliteParameter metadata = insert.Parameters.Add("$metadata", SqliteType.Text);
            insert.Prepare();
            for (int i = 0; i < batch.Length; i++)
            {
                EntryRow row = batch[i];
                seq.Value = session.StagedCount + i;
                id.Value = row.Id;
                formula.Value = row.Formula;
                // SQLite reads -0.0 back as 0.0; store the +0 it will return so the row reads back exactly.
                energy.Value = row.EnergyEv + 0.0;
                basis.Value = EnergyBasisTokens.ToToken(row.Basis);
                metadata.Value = row.Metadata ?? string.Empty;
                try
                {
                    insert.ExecuteNonQuery();
                }
                catch (SqliteException e) when (e.SqliteExtendedErrorCode == SqliteConstraintUnique)
                {
                    long earlier = StagedSeqOf(connection, transaction, sessionId, row.Id);
                    throw new DuplicateEntryException(
                        $"id '{row.Id}' was already staged in this import as its entry {earlier + 1}; ids must be unique within an import",
                        i, row.Id, firstRowIndex: null, existingVersion: null);
                }
            }

            if (session.Policy == DuplicatePolicy.Reject
                && FirstStoredDuplicate(connection, transaction, session, sessionId, fromSeq: session.StagedCount) is { } duplicate)
            {
                throw StoredDuplicate(connection, transaction, session, (int)(duplicate.Seq - session.StagedCount), duplicate.Id);
            }

            long staged = session.StagedCount + batch.Length;
            using (SqliteCommand update = connection.Command(transaction,
                       "UPDATE import_sessions SET staged_count = $c, expires_at_ms = $e WHERE session_id = $s"))
            {
                update.With("$c", staged).With("$e", expires.ToUnixTimeMilliseconds()).With("$s", sessionId).ExecuteNonQuery();
            }
            return new ImportSessionInfo(sessionId, session.DatasetName, session.Policy, staged, expires);
        });
    }

    /// <summary>
    /// Writes every staged row of the session as one new version (latest issued version + 1) and closes the session,
    /// in one transaction. A refusal writes nothing and leaves the session open.
    /// </summary>
    /// <exception cref="InvalidBatchException">Nothing was staged.</exception>
    /// <exception cref="DuplicateEntryException">Under Reject, a staged id that the latest version holds (row index = its position in the session).</exception>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    public ImportResult CommitImport(string sessionId)
    {
        ArgumentNullException.ThrowIfNull(sessionId);
        DateTimeOffset now = _clock.GetUtcNow();
        return Write((connection, transaction) =>
        {
            OpenSession session = FindOpenSession(connection, transaction, sessionId, now);
            if (session.StagedCount == 0) throw new InvalidBatchException($"import session '{sessionId}' has no staged entries; stage at least one before committing");
            LiveVersion? previous = FindLatestLive(connection, transaction, session.DatasetId);
            long newVersion = session.LastVersionIssued + 1;

            int replaced = 0;
            if (session.Policy == DuplicatePolicy.Reject)
            {
                if (FirstStoredDuplicate(connection, transaction, session, sessionId, fromSeq: 0) is { } duplicate)
                {
                    throw StoredDuplicate(connection, transaction, session, (int)duplicate.Seq, duplicate.Id);
                }
            }
            else
            {
                using SqliteCommand close = connection.Command(transaction, """
                    UPDATE entries SET last_version_exclusive = $v
                    WHERE dataset_id = $d AND last_version_exclusive IS NULL
                      AND entry_id IN (SELECT entry_id FROM staged_entries WHERE session_id = $s)
                    """);
                replaced = close.With("$v", newVersion).With("$d", session.DatasetId).With("$s", sessionId).ExecuteNonQuery();
            }

            using (SqliteCommand move = connection.Command(transaction, """
                       INSERT INTO entries (dataset_id, entry_id, formula, energy_ev, energy_basis, metadata, first_version)
                       SELECT $d, entry_id, formula, energy_ev, energy_basis, metadata, $v
                       FROM staged_entries WHERE session_id = $s ORDER BY seq
                       """))
            {
                move.With("$d", session.DatasetId).With("$v", newVersion).With("$s", sessionId).ExecuteNonQuery();
            }

            int count = checked((int)session.StagedCount);
            int inserted = count - replaced;
            IssueVersion(connection, transaction, session.DatasetId, newVersion, now, session.Provenance, count, inserted, replaced,
                (previous?.EntryCount ?? 0) + inserted);
            DeleteSession(connection, transaction, sessionId);
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
            FindOpenSession(connection, transaction, sessionId, now);
            DeleteSession(connection, transaction, sessionId);
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
                WHERE dataset_id = $d AND expires_at_ms > $now ORDER BY started_at_utc, session_id
                """).With("$d", dataset.DatasetId).With("$now", nowMs);
            using SqliteDataReader reader = command.ExecuteReader();
            var sessions = new List<ImportSessionInfo>();
            while (reader.Read())
            {
                sessions.Add(new ImportSessionInfo(reader.GetString(0), datasetName, ParsePolicy(reader.GetString(1)), reader.GetInt64(2),
                    DateTimeOffset.FromUnixTimeMilliseconds(reader.GetInt64(3))));
            }
            return sessions;
        });
    }

    /// <summary>Removes every lapsed session with its staged rows; returns how many sessions went.</summary>
    public int RemoveExpiredImports()
    {
        long nowMs = _clock.GetUtcNow().ToUnixTimeMilliseconds();
        return Write((connection, transaction) =>
        {
            // Staged rows go by the foreign key's cascade.
            using SqliteCommand delete = connection.Command(transaction, "DELETE FROM import_sessions WHERE expires_at_ms <= $now").With("$now", nowMs);
            return delete.ExecuteNonQuery();
        });
    }

    /// <summary>Rows staged by sessions that are not yet removed, lapsed ones included (what is still on disk).</summary>
    public long CountStagedRows() => Read((connection, transaction) =>
    {
        using SqliteCommand count = connection.Command(transaction, "SELECT count(*) FROM staged_entries");
        return (long)count.ExecuteScalar()!;
    });

    private sealed record OpenSession(
        long DatasetId, string DatasetName, long LastVersionIssued, DuplicatePolicy Policy, BatchProvenance Provenance, long StagedCount);

    /// <summary>The session under the write lock; a lapsed one is removed here and reported as expired.</summary>
    private static OpenSession FindOpenSession(SqliteConnection connection, SqliteTransaction transaction, string sessionId, DateTimeOffset now)
    {
        OpenSession session;
        long expiresMs;
        using (SqliteCommand command = connection.Command(transaction, """
                   SELECT s.dataset_id, d.name, d.last_version_issued, s.duplicate_policy, s.source_label, s.note, s.staged_count, s.expires_at_ms
                   FROM import_sessions s JOIN datasets d ON d.dataset_id = s.dataset_id
                   WHERE s.session_id = $s
                   """).With("$s", sessionId))
        {
            using SqliteDataReader reader = command.ExecuteReader();
            if (!reader.Read()) throw new ImportSessionNotFoundException(sessionId, expired: false);
            session = new OpenSession(reader.GetInt64(0), reader.GetString(1), reader.GetInt64(2), ParsePolicy(reader.GetString(3)),
                new BatchProvenance(reader.GetString(4), reader.GetString(5)), reader.GetInt64(6));
            expiresMs = reader.GetInt64(7);
        }

        if (expiresMs <= now.ToUnixTimeMilliseconds())
        {
            // The caller's transaction rolls back on the throw, so the removal is left to RemoveExpiredImports.
            throw new ImportSessionNotFoundException(sessionId, expired: true);
        }
        return session;
    }

    private static (long Seq, string Id)? FirstStoredDuplicate(SqliteConnection connection, SqliteTransaction transaction, OpenSession session, string sessionId, long fromSeq)
    {
        using SqliteCommand command = connection.Command(transaction, """
            SELECT s.seq, s.entry_id FROM staged_entries s
            JOIN entries e ON e.dataset_id = $d AND e.entry_id = s.entry_id AND e.last_version_exclusive IS NULL
            WHERE s.session_id = $s AND s.seq >= $from
            ORDER BY s.seq LIMIT 1
            """).With("$d", session.DatasetId).With("$s", sessionId).With("$from", fromSeq);
        using SqliteDataReader reader = command.ExecuteReader();
        return reader.Read() ? (reader.GetInt64(0), reader.GetString(1)) : null;
    }

    private static DuplicateEntryException StoredDuplicate(SqliteConnection connection, SqliteTransaction transaction, OpenSession session, int rowIndex, string id)
    {
        LiveVersion? latest = FindLatestLive(connection, transaction, session.DatasetId);
        return new DuplicateEntryException(
            $"id '{id}' is already in dataset '{session.DatasetName}' version {latest?.Version}",
            rowIndex, id, firstRowIndex: null, existingVersion: latest?.Version);
    }

    private static long StagedSeqOf(SqliteConnection connection, SqliteTransaction transaction, string sessionId, string entryId)
    {
        using SqliteCommand command = connection.Command(transaction,
            "SELECT seq FROM staged_entries WHERE session_id = $s AND entry_id = $id").With("$s", sessionId).With("$id", entryId);
        return (long)command.ExecuteScalar()!;
    }

    private static void DeleteSession(SqliteConnection connection, SqliteTransaction transaction, string sessionId)
    {
        using SqliteCommand delete = connection.Command(transaction, "DELETE FROM import_sessions WHERE session_id = $s").With("$s", sessionId);
        delete.ExecuteNonQuery();
    }

    private static void CheckPolicy(DuplicatePolicy policy)
    {
        if (policy is not (DuplicatePolicy.Reject or DuplicatePolicy.Replace))
        {
            throw new ArgumentOutOfRangeException(nameof(policy), policy, "not a defined duplicate policy");
        }
    }

    private static string PolicyToken(DuplicatePolicy policy) => policy == DuplicatePolicy.Replace ? "replace" : "reject";

    private static DuplicatePolicy ParsePolicy(string token) => token == "replace" ? DuplicatePolicy.Replace : DuplicatePolicy.Reject;
}
