namespace Hull.Store;

// Defect studies: immutable versions of a study file, kept as given beside a dataset.
public partial interface IDatasetStore
{
    /// <summary>Longest study name accepted; names are labels, not documents.</summary>
    public const int MaxStudyNameLength = 200;

    /// <summary>
    /// Writes the study file's texts as a new version of <paramref name="studyName"/> in the dataset (1 for a new
    /// name), all or nothing. The Store keeps the texts as given; the caller has checked their content.
    /// </summary>
    /// <exception cref="InvalidBatchException">An empty or over-long name, or an empty text; nothing written.</exception>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    DefectStudyRecord SaveDefectStudy(string datasetName, string studyName, string studyJson, string chargeStatesCsv, BatchProvenance provenance);

    /// <summary>One version of a study (the latest when <paramref name="version"/> is null).</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="DefectStudyNotFoundException">No such study or version.</exception>
    DefectStudyRecord GetDefectStudy(string datasetName, string studyName, long? version = null);

    /// <summary>Every study name of the dataset with its latest version number, by name.</summary>
    IReadOnlyList<(string StudyName, long LatestVersion)> ListDefectStudies(string datasetName);
}
