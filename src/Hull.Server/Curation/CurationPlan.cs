using Hull.Core.Thermo.Corrections;
using Hull.Server.Corrections;
using Hull.Store;

namespace Hull.Server.Curation;

/// <summary>
/// A recipe run on one stored version, not yet written: the rows the derived version will hold and the record that
/// goes with it. Reading and running change nothing, so a faulty recipe or a failing step stores nothing.
/// </summary>
/// <param name="Rows">The rows left by the last step, as stored in the source version.</param>
/// <param name="Record">The record to write beside the derived version.</param>
/// <param name="Steps">What each step did (the same counts as the record's steps text).</param>
/// <param name="Corrections">The correction set the recipe applied, recorded with the version; null for none.</param>
public sealed record CurationPlan(IReadOnlyList<EntryRow> Rows, CurationRecord Record, IReadOnlyList<CurationStepRecord> Steps,
    VersionCorrections? Corrections = null)
{
    /// <summary>Reads the source version and runs the recipe on it.</summary>
    /// <param name="store">The store.</param>
    /// <param name="dataset">The dataset of the source version.</param>
    /// <param name="sourceVersion">The version to run on; null for the latest.</param>
    /// <param name="recipe">The recipe, already read.</param>
    /// <exception cref="DatasetNotFoundException">No such dataset.</exception>
    /// <exception cref="VersionNotFoundException">No such version, a deleted one, or (null) none at all.</exception>
    /// <exception cref="CurationRecipeException">A step that cannot run on these rows, or a correction set not stored.</exception>
    public static CurationPlan Make(IDatasetStore store, string dataset, long? sourceVersion, CurationRecipe recipe)
    {
        long version = sourceVersion ?? store.GetLatestVersion(dataset);
        // A version is never changed once written, so its rows and its fingerprint read apart still belong together.
        IReadOnlyList<EntryRow> rows = store.GetEntries(dataset, version == IDatasetStore.NoVersion ? null : version);
        string fingerprint = store.GetFingerprint(dataset, version);
        CorrectionSet? set = recipe.Corrections is { } step ? LoadSet(store, step) : null;
        CurationRun run = CurationRun.Apply(recipe, rows, set);
        var record = new CurationRecord(dataset, version, fingerprint, recipe.ToJson(), CurationStepsJson.Write(run.Records));
        VersionCorrections? corrections = set is null ? null : new VersionCorrections(set.Name, set.Version, version);
        return new CurationPlan(run.Rows, record, run.Records, corrections);
    }

    // The set as stored: a recipe names it, so that the recipe re-runs to the same content.
    private static CorrectionSet LoadSet(IDatasetStore store, ApplyCorrectionSetStep step)
    {
        try
        {
            return CorrectionSetDocument.Parse(store.GetCorrectionSet(step.SetName, step.SetVersion).SetJson);
        }
        catch (CorrectionSetNotFoundException)
        {
            throw new CurationRecipeException(step.StepNumber, "set_name",
                $"no correction set '{step.Label}' is stored; store it first (PutCorrectionSet, hull corrections put)");
        }
    }

    /// <summary>
    /// Writes the rows as the dataset's next version with the record, through one curated import session, in
    /// batches of at most <paramref name="batchSize"/> (<see cref="SessionVersionWrite"/>: a failure cancels the session,
    /// a server that dies on the way leaves a session that lapses, never a version).
    /// </summary>
    public ImportResult Write(IDatasetStore store, BatchProvenance provenance, TimeSpan idleExpiry, int batchSize)
    {
        ImportSessionInfo session = store.BeginCuratedImport(Record.SourceDataset, Record, provenance, idleExpiry);
        return SessionVersionWrite.Run(store, session, Rows, idleExpiry, Corrections, batchRows: batchSize);
    }
}
