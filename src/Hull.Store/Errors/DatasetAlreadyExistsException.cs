namespace Hull.Store;

/// <summary>A dataset with the given name exists already.</summary>
public sealed class DatasetAlreadyExistsException : StoreException
{
    public DatasetAlreadyExistsException(string datasetName)
        : base($"dataset '{datasetName}' already exists")
    {
        DatasetName = datasetName;
    }

    /// <summary>The name that is taken.</summary>
    public string DatasetName { get; }
}
