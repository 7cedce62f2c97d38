namespace Hull.Store;

// Import sessions: many batches, one version. Staged rows are invisible to every read until the commit moves them
// into one new version in one transaction; a session that is cancelled, lapses, or whose client or server dies
// leaves no version and no entry behind. Two sessions may be open on one dataset at once; version numbers follow
// commit order, and each commit applies its rows on top of the latest version at the moment it commits.
public partial interface IDatasetStore
{
    /// <summary>
    /// Opens an import session on a dataset. It lapses <paramref name="idleExpiry"/> after the last call that named it;
    /// <see cref="RemoveExpiredImports"/> then removes it with its staged rows.
    /// </summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    ImportSessionInfo BeginImport(string datasetName, DuplicatePolicy policy, BatchProvenance provenance, TimeSpan idleExpiry);

    /// <summary>Adds a batch to an open session, all or nothing, and extends its expiry by <paramref name="idleExpiry"/> from now.</summary>
    /// <exception cref="InvalidBatchException">Empty batch or a faulty row (index in this batch named), ids repeated in the batch.</exception>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    ImportSessionInfo StageBatch(string sessionId, IReadOnlyList<EntryRow> rows, TimeSpan idleExpiry);

    /// <summary>
    /// The open session with the rows staged so far, in staging order, each with its 0-based place in the whole
    /// session, so that the caller can check them as one batch before <see cref="CommitImport"/>.
    /// </summary>
    /// <param name="sessionId">The session.</param>
    /// <param name="bases">Only rows whose basis token is one of these (matched as text, not interpreted); null for every row.</param>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    StagedImport ReadStagedImport(string sessionId, IReadOnlyCollection<string>? bases = null);

    /// <summary>
    /// Writes every staged row of the session as one new version (latest issued version + 1) and closes the session,
    /// in one transaction. A refusal writes nothing and leaves the session open.
    /// </summary>
    /// <exception cref="InvalidBatchException">Nothing was staged.</exception>
    /// <exception cref="DuplicateEntryException">An id staged twice, or under Reject one the latest version holds.</exception>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    /// <exception cref="ImportSessionChangedException">The session no longer holds <paramref name="checkedStagedCount"/> rows.</exception>
    /// <exception cref="BaseVersionChangedException">The latest live version is not <paramref name="basedOn"/>; nothing written, the session stays open.</exception>
    ImportResult CommitImport(string sessionId, long? checkedStagedCount = null, long? basedOn = null);

    /// <summary>Drops an open session with its staged rows; nothing of it was ever visible.</summary>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    void CancelImport(string sessionId);

    /// <summary>The open sessions of a dataset, oldest first (lapsed ones not included).</summary>
    IReadOnlyList<ImportSessionInfo> ListImports(string datasetName);

    /// <summary>Removes every lapsed session with its staged rows (and staging left by deleted datasets); returns how many sessions went.</summary>
    int RemoveExpiredImports();

    /// <summary>Rows staged by sessions not yet removed, lapsed ones included: what staging holds.</summary>
    long CountStagedRows();
}
