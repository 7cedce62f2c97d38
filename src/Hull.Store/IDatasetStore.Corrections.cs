namespace Hull.Store;

// Energy corrections (schema step 7): correction sets kept by (name, version) as the JSON body they were given, and
// per dataset version the set it was derived with. The Store reads neither the body nor the entries' method tags:
// the server parses and applies the set. A version's record is written by the commit that issues the version (an
// import session marked with MarkImportCorrected), so a version has it from the start or never.
public partial interface IDatasetStore
{
    /// <summary>Longest correction-set name the store accepts, in UTF-16 code units.</summary>
    public const int MaxCorrectionSetNameLength = 200;

    /// <summary>
    /// Keeps a correction set under (name, version). Putting the same body again under the same name and version
    /// changes nothing and returns the stored record; another body is refused, since answers name the set by them.
    /// </summary>
    /// <exception cref="InvalidBatchException">A blank, over-long or control-character name, a version below 1, an empty
    /// body, or U+0000 in a text; nothing written.</exception>
    /// <exception cref="CorrectionSetConflictException">Another body is stored under the name and version.</exception>
    CorrectionSetRecord PutCorrectionSet(string setName, long setVersion, string setJson);

    /// <summary>The set stored under (name, version).</summary>
    /// <exception cref="CorrectionSetNotFoundException">None is.</exception>
    CorrectionSetRecord GetCorrectionSet(string setName, long setVersion);

    /// <summary>Every stored set, by name (ordinal) and version.</summary>
    IReadOnlyList<CorrectionSetRecord> ListCorrectionSets();

    /// <summary>
    /// Marks an open import session as deriving a corrected version: its commit writes <paramref name="record"/> for
    /// the version it issues, in the same transaction.
    /// </summary>
    /// <exception cref="ImportSessionNotFoundException">No such open session, or it lapsed.</exception>
    /// <exception cref="CorrectionSetNotFoundException">The record names a set that is not stored.</exception>
    void MarkImportCorrected(string sessionId, VersionCorrections record);

    /// <summary>The set a version was derived with, or null when it was imported as given.</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="VersionNotFoundException">No such version, or a deleted one.</exception>
    VersionCorrections? GetVersionCorrections(string datasetName, long version);

    /// <summary>The sets every live version of a dataset was derived with, by version (versions imported as given absent).</summary>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    IReadOnlyDictionary<long, VersionCorrections> ListVersionCorrections(string datasetName);
}
