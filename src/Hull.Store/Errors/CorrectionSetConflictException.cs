namespace Hull.Store;

/// <summary>Another body is already stored under the correction set's name and version; a stored set never changes.</summary>
public sealed class CorrectionSetConflictException(string setName, long setVersion)
    : StoreException($"correction set '{setName}' version {setVersion} is already stored with another body; a stored set never changes, so give the new one the next version")
{
    public string SetName { get; } = setName;

    public long SetVersion { get; } = setVersion;
}
