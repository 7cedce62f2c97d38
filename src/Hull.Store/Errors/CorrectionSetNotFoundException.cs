namespace Hull.Store;

/// <summary>No correction set is stored under the name and version asked for.</summary>
public sealed class CorrectionSetNotFoundException(string setName, long setVersion)
    : StoreException($"no correction set '{setName}' version {setVersion} is stored; put it first")
{
    public string SetName { get; } = setName;

    public long SetVersion { get; } = setVersion;
}
