using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Corrections;

/// <summary>
/// Writes a corrected version: a set applied to the latest version's entries, written as the next version of the same
/// dataset through one import session (replace policy, every entry staged) whose commit also records the set, so the
/// store holds the whole version with its record or nothing. Every check runs before anything is written, the set
/// included; the import lock and the reference rule are the ones every import of this server goes through.
/// </summary>
public sealed class CorrectedVersionWriter(
    IDatasetStore store, VersionResolver versions, HullCache cache, ImportGate imports, ImportSessionSettings sessions)
{
    /// <param name="dataset">The dataset.</param>
    /// <param name="sourceVersion">The version to correct; 0 for the latest. It must be the latest, so the new version
    /// holds exactly its entries.</param>
    /// <param name="set">The set, parsed.</param>
    /// <param name="setJson">Its document, stored with it (the same document again is no change).</param>
    /// <param name="setField">The request field that gave the set, named in refusals.</param>
    /// <param name="note">Kept with the new version.</param>
    /// <param name="cancellation">Stops waiting for the import lock and the reads; once the session commits, it commits whole.</param>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT for a set that does not fit the entries or a corrected
    /// energy out of range; FAILED_PRECONDITION when the source is not the latest version; store faults translated.</exception>
    public async Task<DerivedVersion> WriteAsync(string dataset, long sourceVersion, CorrectionSet set, string setJson, string setField,
        string note, CancellationToken cancellation)
    {
        using (await imports.EnterAsync(dataset, cancellation))
        {
            VersionRef source = versions.Resolve(dataset, sourceVersion);
            DatasetLatest latest = store.GetLatest(dataset);
            if (source.Version != latest.Version)
            {
                throw RpcErrors.FailedPrecondition(
                    $"dataset '{dataset}' is at version {latest.Version}; a corrected version is derived from the latest version, so that it holds "
                    + $"exactly that version's entries (asked for {source.Version})", subject: $"version:{dataset}@{source.Version}");
            }

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
            ReferenceLedger next = await CheckReferencesAsync(dataset, source, latest, corrected.Rows, cancellation);

            // Nothing is written before this point. The set goes first: the version's record names it.
            await Task.Run(() => store.PutCorrectionSet(set.Name, set.Version, setJson), cancellation);
            ImportResult result = await Task.Run(() => Commit(dataset, source.Version, set, note, corrected.Rows));
            imports.Remember(dataset, latest with { Version = result.NewVersion }, next);
            return new DerivedVersion(versions.Resolve(dataset, result.NewVersion), corrected);
        }
    }

    // One session: all rows staged, the record marked, one commit on the source version; cancelled on any refusal.
    private ImportResult Commit(string dataset, long source, CorrectionSet set, string note, IReadOnlyList<EntryRow> rows)
    {
        var provenance = new BatchProvenance($"{dataset}@{source} corrected with {set.Label}", note);
        ImportSessionInfo session = store.BeginImport(dataset, DuplicatePolicy.Replace, provenance, sessions.IdleExpiry);
        return SessionVersionWrite.Run(store, session, rows, sessions.IdleExpiry, new VersionCorrections(set.Name, set.Version, source), basedOn: source);
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

    // The import rule for total energies over the corrected rows, as every replace import on the source is checked.
    private async Task<ReferenceLedger> CheckReferencesAsync(string dataset, VersionRef source, DatasetLatest latest, IReadOnlyList<EntryRow> rows,
        CancellationToken cancellation)
    {
        VersionSnapshot snapshot = await cache.GetSnapshotAsync(source, cancellation);
        ReferenceLedger ledger = imports.TryGetLedger(dataset, latest, out ReferenceLedger known) ? known : ReferenceLedger.Of(snapshot.Entries);
        (IReadOnlyList<FieldViolation> violations, ReferenceLedger next) = await ImportReferenceCheck.CheckAsync(
            rows, DuplicatePolicy.Replace, ledger, () => Task.FromResult(snapshot.Entries), "corrected");
        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize("the corrected entries were refused; nothing was written", violations),
                violations, ErrorReasons.InvalidEntry);
        }

        return next;
    }
}
