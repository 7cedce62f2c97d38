using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using Hull.Server.Caching;
using Hull.Server.Curation;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Corrections;

/// <summary>
/// Writes a corrected version: a set applied to one version's entries (any live version, the latest by default),
/// written as the next version of the same dataset holding exactly those entries corrected. It goes through one
/// curated import session whose record is the one-step recipe that makes it (apply_correction_set with the set), and
/// whose commit also records the set, so the store holds the whole version with both records or nothing, and the
/// recipe run again on the same source gives the same content. Every check runs before anything is written, the set
/// included; the import lock is the one every import of this server goes through.
/// </summary>
public sealed class CorrectedVersionWriter(IDatasetStore store, VersionResolver versions, ImportGate imports, ImportSessionSettings sessions)
{
    /// <param name="dataset">The dataset.</param>
    /// <param name="sourceVersion">The version to correct; 0 for the latest.</param>
    /// <param name="set">The set, parsed.</param>
    /// <param name="setJson">Its document, stored with it (the same document again is no change).</param>
    /// <param name="setField">The request field that gave the set, named in refusals.</param>
    /// <param name="note">Kept with the new version.</param>
    /// <param name="cancellation">Stops waiting for the import lock and the reads; once the session commits, it commits whole.</param>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT for a set that does not fit the entries or a corrected
    /// energy out of range; store faults translated.</exception>
    public async Task<DerivedVersion> WriteAsync(string dataset, long sourceVersion, CorrectionSet set, string setJson, string setField,
        string note, CancellationToken cancellation)
    {
        using (await imports.EnterAsync(dataset, cancellation))
        {
            VersionRef source = versions.Resolve(dataset, sourceVersion);
            IReadOnlyList<EntryRow> rows = await Task.Run(() => store.GetEntries(dataset, source.Version), cancellation);
            CorrectedRows corrected;
            try
            {
                corrected = CorrectedRows.Apply(rows, set);
            }
            catch (ThermoInputException e)
            {
                throw RpcErrors.InvalidArgument(setField, $"correction set '{set.Label}' cannot be applied to {dataset}@{source.Version}: {e.Message}",
                    ErrorReasons.InvalidField);
            }

            CheckRange(corrected, setField, set, dataset, source.Version);
            await CheckReferencesAsync(corrected.Rows);

            // Nothing is written before this point. The set goes first: the version's record names it.
            await Task.Run(() => store.PutCorrectionSet(set.Name, set.Version, setJson), cancellation);
            try
            {
                ImportResult result = await Task.Run(() => Commit(dataset, source, set, note, corrected));
                return new DerivedVersion(versions.Resolve(dataset, result.NewVersion), corrected);
            }
            finally
            {
                // The version holds the corrected rows only: what was remembered of the latest no longer describes it.
                imports.Forget(dataset);
            }
        }
    }

    // One curated session: every row staged, the set marked, one commit; cancelled on any refusal.
    private ImportResult Commit(string dataset, VersionRef source, CorrectionSet set, string note, CorrectedRows corrected)
    {
        var step = new ApplyCorrectionSetStep(1, set.Name, set.Version);
        var steps = new[] { new CurationStepRecord(1, step.Kind, step.Parameters(), corrected.Rows.Count, 0, corrected.Outcome.ChangedCount) };
        var record = new CurationRecord(dataset, source.Version, source.Fingerprint, new CurationRecipe([step]).ToJson(), CurationStepsJson.Write(steps));
        var provenance = new BatchProvenance($"{dataset}@{source.Version} corrected with {set.Label}", note);
        ImportSessionInfo session = store.BeginCuratedImport(dataset, record, provenance, sessions.IdleExpiry);
        return SessionVersionWrite.Run(store, session, corrected.Rows, sessions.IdleExpiry, new VersionCorrections(set.Name, set.Version, source.Version));
    }

    private static void CheckRange(CorrectedRows corrected, string setField, CorrectionSet set, string dataset, long source)
    {
        var violations = corrected.RangeProblems().Take(RpcErrors.MaxViolationsReported)
            .Select(p => new FieldViolation(setField, $"entry '{p.EntryId}' of {dataset}@{source} after correction: {p.Problem}")).ToList();
        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize($"correction set '{set.Label}' was refused; nothing was written", violations),
                violations, ErrorReasons.InvalidField);
        }
    }

    // The import rule for total energies over the corrected rows, checked as a whole version of their own.
    private static async Task CheckReferencesAsync(IReadOnlyList<EntryRow> rows)
    {
        (IReadOnlyList<FieldViolation> violations, _) = await ImportReferenceCheck.CheckAsync(
            rows, DuplicatePolicy.Reject, ReferenceLedger.Empty, () => Task.FromResult<IReadOnlyList<PhaseEntry>>([]), "corrected");
        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize("the corrected entries were refused; nothing was written", violations),
                violations, ErrorReasons.InvalidEntry);
        }
    }
}
