using Hull.Store.Sqlite;
using Microsoft.Data.Sqlite;

namespace Hull.Store;

// Defect studies: immutable versions of a study file, kept as given beside a dataset.
public sealed partial class DatasetStore
{
    /// <summary>As <see cref="IDatasetStore.MaxStudyNameLength"/>.</summary>
    public const int MaxStudyNameLength = IDatasetStore.MaxStudyNameLength;

    /// <summary>
    /// Writes the study file's texts as a new version of <paramref name="studyName"/> in the dataset (1 for a new
    /// name), all or nothing. The Store keeps the texts as given; the caller has checked their content.
    /// </summary>
    /// <exception cref="InvalidBatchException">An empty or over-long name, or an empty text; nothing written.</exception>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    public DefectStudyRecord SaveDefectStudy(string datasetName, string studyName, string studyJson, string chargeStatesCsv, BatchProvenance provenance)
    {
        DatasetName.Validate(datasetName);
        StoreArguments.CheckProvenance(provenance);
        StoreArguments.CheckStudyName(studyName);
        StoreArguments.CheckStudyTexts(studyJson, chargeStatesCsv);
        string fingerprint = DefectStudyFingerprint.Compute(studyJson, chargeStatesCsv);
        DateTimeOffset now = _clock.GetUtcNow();

        return Write((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using SqliteCommand latest = connection.Command(transaction,
                "SELECT coalesce(max(study_version), 0) FROM defect_studies WHERE dataset_id = $d AND study_name = $n")
                .With("$d", dataset.DatasetId).With("$n", studyName);
            long version = (long)latest.ExecuteScalar()! + 1;
            using SqliteCommand insert = connection.Command(transaction, """
                INSERT INTO defect_studies (dataset_id, study_name, study_version, committed_at_utc, source_label, note,
                                            study_json, charge_states_csv, content_sha256)
                VALUES ($d, $n, $v, $t, $source, $note, $json, $csv, $sha)
                """)
                .With("$d", dataset.DatasetId).With("$n", studyName).With("$v", version).With("$t", UtcText.Write(now))
                .With("$source", provenance.SourceLabel ?? string.Empty).With("$note", provenance.Note ?? string.Empty)
                .With("$json", studyJson).With("$csv", chargeStatesCsv).With("$sha", fingerprint);
            insert.ExecuteNonQuery();
            return new DefectStudyRecord(studyName, version, UtcText.Read(UtcText.Write(now)), provenance.SourceLabel ?? string.Empty,
                provenance.Note ?? string.Empty, studyJson, chargeStatesCsv, fingerprint);
        });
    }

    /// <summary>One version of a study (the latest when <paramref name="version"/> is null).</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="DefectStudyNotFoundException">No such study or version.</exception>
    public DefectStudyRecord GetDefectStudy(string datasetName, string studyName, long? version = null)
    {
        DatasetName.Validate(datasetName);
        StoreArguments.CheckStudyName(studyName);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using SqliteCommand command = connection.Command(transaction, """
                SELECT study_version, committed_at_utc, source_label, note, study_json, charge_states_csv, content_sha256
                FROM defect_studies
                WHERE dataset_id = $d AND study_name = $n AND ($v IS NULL OR study_version = $v)
                ORDER BY study_version DESC LIMIT 1
                """).With("$d", dataset.DatasetId).With("$n", studyName).With("$v", version);
            using SqliteDataReader reader = command.ExecuteReader();
            if (!reader.Read()) throw new DefectStudyNotFoundException(datasetName, studyName, version);
            return new DefectStudyRecord(studyName, reader.GetInt64(0), UtcText.Read(reader.GetString(1)), reader.GetString(2),
                reader.GetString(3), reader.GetString(4), reader.GetString(5), reader.GetString(6));
        });
    }

    /// <summary>Every study name of the dataset with its latest version number, by name.</summary>
    public IReadOnlyList<(string StudyName, long LatestVersion)> ListDefectStudies(string datasetName)
    {
        DatasetName.Validate(datasetName);
        return Read((connection, transaction) =>
        {
            DatasetRecord dataset = FindDataset(connection, transaction, datasetName);
            using SqliteCommand command = connection.Command(transaction, """
                SELECT study_name, max(study_version) FROM defect_studies WHERE dataset_id = $d
                GROUP BY study_name ORDER BY study_name
                """).With("$d", dataset.DatasetId);
            using SqliteDataReader reader = command.ExecuteReader();
            var result = new List<(string, long)>();
            while (reader.Read()) result.Add((reader.GetString(0), reader.GetInt64(1)));
            return (IReadOnlyList<(string, long)>)result.AsReadOnly();
        });
    }
}
