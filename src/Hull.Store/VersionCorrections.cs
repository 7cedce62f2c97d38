namespace Hull.Store;

/// <summary>The correction set a dataset version was derived with, and the version of the same dataset it was derived from.</summary>
public sealed record VersionCorrections(string SetName, long SetVersion, long SourceVersion)
{
    /// <summary>"name v3", as answers name the set.</summary>
    public string Label => $"{SetName} v{SetVersion}";
}
