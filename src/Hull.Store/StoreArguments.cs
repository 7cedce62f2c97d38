namespace Hull.Store;

/// <summary>
/// The checks every backend makes before it touches its database, and the tokens it stores for enumerations, so
/// that a refusal reads the same whichever backend gives it.
/// </summary>
internal static class StoreArguments
{
    public static void CheckPolicy(DuplicatePolicy policy)
    {
        if (policy is not (DuplicatePolicy.Reject or DuplicatePolicy.Replace))
        {
            throw new ArgumentOutOfRangeException(nameof(policy), policy, "not a defined duplicate policy");
        }
    }

    public static void CheckExpiry(TimeSpan idleExpiry)
    {
        if (idleExpiry <= TimeSpan.Zero) throw new ArgumentOutOfRangeException(nameof(idleExpiry), idleExpiry, "must be positive");
    }

    public static void CheckPageLimit(int limit)
    {
        if (limit < 1 || limit > IDatasetStore.MaxPageSize)
        {
            throw new ArgumentOutOfRangeException(nameof(limit), limit, $"a page holds 1 to {IDatasetStore.MaxPageSize} entries");
        }
    }

    public static void CheckStudyName(string studyName)
    {
        if (string.IsNullOrWhiteSpace(studyName)) throw new InvalidBatchException("a defect study needs a name", field: "study_name");
        if (studyName.Length > IDatasetStore.MaxStudyNameLength) throw new InvalidBatchException($"a study name has at most {IDatasetStore.MaxStudyNameLength} characters", field: "study_name");
        if (studyName.Any(char.IsControl)) throw new InvalidBatchException("a study name may not hold control characters", field: "study_name");
    }

    public static void CheckCorrectionSetName(string setName, long setVersion)
    {
        if (string.IsNullOrWhiteSpace(setName)) throw new InvalidBatchException("a correction set needs a name", field: "name");
        if (setName.Length > IDatasetStore.MaxCorrectionSetNameLength)
        {
            throw new InvalidBatchException($"a correction set name has at most {IDatasetStore.MaxCorrectionSetNameLength} characters", field: "name");
        }
        if (setName.Any(char.IsControl)) throw new InvalidBatchException("a correction set name may not hold control characters", field: "name");
        if (setVersion < 1) throw new InvalidBatchException($"correction set '{setName}': versions count from 1, got {setVersion}", field: "version");
    }

    public static void CheckCorrectionSetBody(string setJson)
    {
        if (string.IsNullOrEmpty(setJson)) throw new InvalidBatchException("the correction set's body is empty", field: "set_json");
        CheckStoredText(setJson, "set_json");
    }

    public static void CheckStudyTexts(string studyJson, string chargeStatesCsv)
    {
        if (string.IsNullOrEmpty(studyJson)) throw new InvalidBatchException("the study document is empty", field: "study_json");
        if (chargeStatesCsv is null) throw new InvalidBatchException("the charge-state table is missing", field: "charge_states_csv");
        CheckStoredText(studyJson, "study_json");
        CheckStoredText(chargeStatesCsv, "charge_states_csv");
    }

    /// <summary>
    /// Refuses U+0000 in a text the store keeps: PostgreSQL text cannot hold it, and a store must keep the same
    /// texts whichever backend holds them. No field of ours has a use for it.
    /// </summary>
    public static void CheckStoredText(string? text, string field)
    {
        int at = text?.IndexOf('\0') ?? -1;
        if (at >= 0) throw new InvalidBatchException($"{field} holds the character U+0000 at character {at + 1}; it cannot be stored", field: field);
    }

    public static void CheckProvenance(BatchProvenance provenance)
    {
        ArgumentNullException.ThrowIfNull(provenance);
        CheckStoredText(provenance.SourceLabel, "source_label");
        CheckStoredText(provenance.Note, "note");
    }

    public static string PolicyToken(DuplicatePolicy policy) => policy == DuplicatePolicy.Replace ? "replace" : "reject";

    public static DuplicatePolicy ParsePolicy(string token) => token == "replace" ? DuplicatePolicy.Replace : DuplicatePolicy.Reject;

    /// <summary>Why a version asked for cannot be read: none yet, all deleted, out of range, or deleted.</summary>
    public static VersionNotFoundException NoLiveVersion(string dataset, long lastVersionIssued) =>
        new(dataset, null, lastVersionIssued == 0
            ? $"dataset '{dataset}' has no version yet; import a batch first"
            : $"dataset '{dataset}' has no live version: all of its {lastVersionIssued} versions were deleted");

    public static VersionNotFoundException NoSuchVersion(string dataset, long version, long lastVersionIssued)
    {
        string range = lastVersionIssued == 0 ? "it has no version yet" : $"its versions run from 1 to {lastVersionIssued}";
        return new VersionNotFoundException(dataset, version, $"dataset '{dataset}' has no version {version}; {range}");
    }

    public static VersionNotFoundException DeletedVersion(string dataset, long version, string deletedAtUtc) =>
        new(dataset, version, $"version {version} of dataset '{dataset}' was deleted at {deletedAtUtc}");

    /// <summary>Refuses a write whose caller checked it against another latest version than the one it would build on.</summary>
    public static void CheckBase(string dataset, long? basedOn, long? latest)
    {
        long actual = latest ?? IDatasetStore.NoVersion;
        if (basedOn is long expected && expected != actual) throw new BaseVersionChangedException(dataset, expected, actual);
    }

    /// <summary>An id of a batch (or session) that the latest version already holds, under Reject.</summary>
    public static DuplicateEntryException AlreadyStored(int rowIndex, string id, string dataset, long? latestVersion, bool rowPrefix) =>
        new((rowPrefix ? $"row {rowIndex}: " : string.Empty) + $"id '{id}' is already in dataset '{dataset}' version {latestVersion}",
            rowIndex, id, firstRowIndex: null, existingVersion: latestVersion);

    /// <summary>An id staged twice in one session.</summary>
    public static DuplicateEntryException RepeatedInSession(int rowIndex, string id, int firstRowIndex) =>
        new($"id '{id}' repeats entry {firstRowIndex + 1} of this import; ids must be unique within an import",
            rowIndex, id, firstRowIndex, existingVersion: null);
}
