namespace Hull.Store;

/// <summary>One stored version of a defect study: the study file's two texts exactly as imported, and provenance.</summary>
/// <param name="StudyName">The study's name within its dataset.</param>
/// <param name="Version">1 for the first import of the name, then 2, 3, ...</param>
/// <param name="CommittedAtUtc">When the version was written.</param>
/// <param name="SourceLabel">Where it came from, as told by the caller.</param>
/// <param name="Note">Free text from the caller.</param>
/// <param name="StudyJson">The study document (JSON), byte for byte as given.</param>
/// <param name="ChargeStatesCsv">The per-charge-state table (CSV), byte for byte as given.</param>
/// <param name="ContentSha256">SHA-256 of the two texts (<see cref="DefectStudyFingerprint"/>).</param>
public sealed record DefectStudyRecord(
    string StudyName,
    long Version,
    DateTimeOffset CommittedAtUtc,
    string SourceLabel,
    string Note,
    string StudyJson,
    string ChargeStatesCsv,
    string ContentSha256);
