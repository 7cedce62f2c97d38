namespace Hull.Store;

/// <summary>A dataset name breaks the rules of <see cref="Hull.Store.DatasetName"/>.</summary>
public sealed class InvalidDatasetNameException : StoreException
{
    public InvalidDatasetNameException(string name, string message)
        : base(message)
    {
        Name = name;
    }

    /// <summary>The rejected name.</summary>
    public string Name { get; }
}
