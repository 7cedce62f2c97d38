namespace Hull.Store;

// Curated versions: a version derived from another by a recipe, written through an import session that carries its
// curation record until the commit. The commit writes the staged rows as the WHOLE new version (every row of the
// latest version that was not staged is closed at it) and the record, in one transaction: a failed or cancelled
// derivation, or one whose server dies, leaves neither version nor record. Deleting a version deletes its record.
public partial interface IDatasetStore
{
    /// <summary>
    /// Opens an import session whose commit makes a derived version: exactly the staged rows, with
    /// <paramref name="record"/> written beside it. Stage and commit it as any other session.
    /// </summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="ArgumentException">A record text that is empty, or a source version below 1.</exception>
    /// <exception cref="InvalidBatchException">A record text that holds U+0000 (field named).</exception>
    ImportSessionInfo BeginCuratedImport(string datasetName, CurationRecord record, BatchProvenance provenance, TimeSpan idleExpiry);

    /// <summary>The record of a live version, or null when the version was not derived by a recipe.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="VersionNotFoundException">No such version, or a deleted one.</exception>
    CurationRecord? GetCurationRecord(string datasetName, long version);

    /// <summary>The records of every live derived version of a dataset, by version.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    IReadOnlyDictionary<long, CurationRecord> ListCurationRecords(string datasetName);
}
