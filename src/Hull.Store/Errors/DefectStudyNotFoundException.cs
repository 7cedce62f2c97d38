namespace Hull.Store;

/// <summary>A dataset has no defect study of the given name, or not the version asked for.</summary>
public sealed class DefectStudyNotFoundException : StoreException
{
    public DefectStudyNotFoundException(string datasetName, string studyName, long? version)
        : base(version is null
            ? $"dataset '{datasetName}' has no defect study '{studyName}'"
            : $"dataset '{datasetName}' has no version {version} of defect study '{studyName}'")
    {
        DatasetName = datasetName;
        StudyName = studyName;
        Version = version;
    }

    public string DatasetName { get; }

    public string StudyName { get; }

    /// <summary>The version asked for; null for the latest.</summary>
    public long? Version { get; }
}
