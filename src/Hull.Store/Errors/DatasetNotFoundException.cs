namespace Hull.Store;

/// <summary>No dataset has the given name.</summary>
public sealed class DatasetNotFoundException : StoreException
{
    public DatasetNotFoundException(string datasetName)
        : base($"dataset '{datasetName}' does not exist")
    {
        DatasetName = datasetName;
    }

    /// <summary>The name that was asked for.</summary>
    public string DatasetName { get; }
}
