namespace Hull.Store;

// Importing a batch: one transaction, one new version.
public partial interface IDatasetStore
{
    /// <summary>
    /// Writes <paramref name="rows"/> as a new version of the dataset (latest issued version + 1), all or nothing.
    /// The new version holds the latest live version's entries plus the batch. Under <see cref="DuplicatePolicy.Reject"/>
    /// an id already in the latest version fails the batch; under <see cref="DuplicatePolicy.Replace"/> the batch's row
    /// supersedes it from the new version on. An id repeated inside the batch always fails it.
    /// </summary>
    /// <exception cref="InvalidBatchException">Empty batch or a faulty row (index, id and field named); nothing written.</exception>
    /// <exception cref="DuplicateEntryException">A repeated id, as above; nothing written.</exception>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="BaseVersionChangedException">The latest live version is not <paramref name="basedOn"/>; nothing written.</exception>
    /// <remarks><c>basedOn</c>: the latest version the caller checked the batch against (<see cref="NoVersion"/> for
    /// none); null writes on whatever is latest. With several servers on one store, this makes check and write one step.</remarks>
    ImportResult ImportBatch(string datasetName, IReadOnlyList<EntryRow> rows, DuplicatePolicy policy, BatchProvenance provenance, long? basedOn = null);
}
