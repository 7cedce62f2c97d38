namespace Hull.Store;

// Creating, listing, describing and deleting datasets.
public partial interface IDatasetStore
{
    /// <summary>Creates an empty dataset (no version until the first import).</summary>
    /// <exception cref="InvalidDatasetNameException">The name breaks the rules of <see cref="DatasetName"/>.</exception>
    /// <exception cref="DatasetAlreadyExistsException">The name is taken.</exception>
    DatasetSummary CreateDataset(string name, string description = "");

    /// <summary>Every dataset, ordered by name.</summary>
    IReadOnlyList<DatasetSummary> ListDatasets();

    /// <summary>A dataset with its latest version, entry count and every live version with provenance.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    DatasetDescription DescribeDataset(string name);

    /// <summary>Deletes a dataset with all its versions, entries, open import sessions and defect studies.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    void DeleteDataset(string name);
}
