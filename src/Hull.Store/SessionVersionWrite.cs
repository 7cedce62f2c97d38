namespace Hull.Store;

/// <summary>
/// The rows of one whole version written through an import session the caller opened (a curated or a plain one):
/// staged in batches, optionally marked with the correction set they were derived with, then committed. Any failure
/// on the way cancels the session, so nothing stays staged; a process that dies on the way leaves a session that
/// lapses, never a version.
/// </summary>
public static class SessionVersionWrite
{
    /// <summary>Rows per staged batch: keeps each staging transaction short on a large version.</summary>
    public const int DefaultBatchRows = 10_000;

    /// <param name="store">The store the session is open in.</param>
    /// <param name="session">The open session, nothing staged yet.</param>
    /// <param name="rows">Every row of the new version's batch, in order.</param>
    /// <param name="idleExpiry">The session's idle expiry, renewed by each batch.</param>
    /// <param name="corrections">The correction record the commit writes for the new version; null for none.</param>
    /// <param name="basedOn">The latest version the rows were checked against; null commits on whatever is latest.</param>
    /// <param name="batchRows">Rows per staged batch (1 or more).</param>
    /// <returns>The commit's result.</returns>
    /// <exception cref="StoreException">What staging, marking or the commit refused (the session is cancelled first). A
    /// cancel that fails as well is not reported: the first failure is the one the caller needs, and the session lapses.</exception>
    public static ImportResult Run(IDatasetStore store, ImportSessionInfo session, IReadOnlyList<EntryRow> rows, TimeSpan idleExpiry,
        VersionCorrections? corrections = null, long? basedOn = null, int batchRows = DefaultBatchRows)
    {
        ArgumentNullException.ThrowIfNull(store);
        ArgumentNullException.ThrowIfNull(session);
        ArgumentNullException.ThrowIfNull(rows);
        ArgumentOutOfRangeException.ThrowIfLessThan(batchRows, 1);
        try
        {
            for (int start = 0; start < rows.Count; start += batchRows)
            {
                int count = Math.Min(batchRows, rows.Count - start);
                var batch = new EntryRow[count];
                for (int i = 0; i < count; i++) batch[i] = rows[start + i];
                store.StageBatch(session.SessionId, batch, idleExpiry);
            }

            if (corrections is not null) store.MarkImportCorrected(session.SessionId, corrections);
            return store.CommitImport(session.SessionId, rows.Count, basedOn);
        }
        catch
        {
            try
            {
                store.CancelImport(session.SessionId);
            }
            catch (Exception)
            {
                // Already gone, or the store is failing as well: the session lapses and is swept; the first failure is rethrown.
            }

            throw;
        }
    }
}
