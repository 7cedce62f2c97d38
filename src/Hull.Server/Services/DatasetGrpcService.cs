using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Server.Mapping;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Services;

/// <summary>The dataset service: checks each request, then delegates to the store.</summary>
public sealed class DatasetGrpcService(
    IDatasetStore store, VersionResolver versions, ServiceLimits limits, HullCache cache, ImportGate imports, ImportSessionSettings sessions)
    : DatasetService.DatasetServiceBase
{
    private const string DatasetsList = "datasets";
    private const string VersionsList = "versions/";

    private static readonly string[] TotalEnergyTokens = [Core.Thermo.EnergyBasisTokens.TotalPerFormulaUnit, Core.Thermo.EnergyBasisTokens.TotalPerAtom];

    /// <summary>Entries per streamed export message when the caller does not say.</summary>
    public const int DefaultPageSize = 1000;

    public override Task<Protos.V1.DatasetSummary> CreateDataset(CreateDatasetRequest request, ServerCallContext context)
    {
        RequireName(request.Name, "name");
        if (EntryRules.CheckText(request.Description, "description", allowLineBreaks: true) is { } problem)
        {
            throw RpcErrors.InvalidArgument("description", problem);
        }

        return Task.FromResult(WireMapping.ToWire(store.CreateDataset(request.Name, request.Description)));
    }

    public override Task<ListDatasetsResponse> ListDatasets(ListDatasetsRequest request, ServerCallContext context)
    {
        int pageSize = PageToken.PageSize(request.PageSize);
        string? after = PageToken.Decode(request.PageToken, DatasetsList);
        // Few datasets, so the page is cut from the ordered list; the key (the name) keeps pages stable under change.
        var rest = store.ListDatasets().Where(d => after is null || string.CompareOrdinal(d.Name, after) > 0).ToList();
        var response = new ListDatasetsResponse();
        response.Datasets.AddRange(rest.Take(pageSize).Select(WireMapping.ToWire));
        if (rest.Count > pageSize) response.NextPageToken = PageToken.Encode(DatasetsList, rest[pageSize - 1].Name);
        return Task.FromResult(response);
    }

    public override Task<DescribeDatasetResponse> DescribeDataset(DescribeDatasetRequest request, ServerCallContext context)
    {
        RequireName(request.Name, "name");
        DatasetDescription description = store.DescribeDataset(request.Name);
        var response = new DescribeDatasetResponse { Dataset = WireMapping.ToWire(description.Summary) };
        response.Versions.AddRange(WithCuration(request.Name, description.Versions));
        return Task.FromResult(response);
    }

    public override Task<DeleteDatasetResponse> DeleteDataset(DeleteDatasetRequest request, ServerCallContext context)
    {
        RequireName(request.Name, "name");
        try
        {
            store.DeleteDataset(request.Name);
        }
        finally
        {
            versions.Forget(request.Name);
            imports.Forget(request.Name);
        }

        return Task.FromResult(new DeleteDatasetResponse());
    }

    /// <summary>How often an import is checked again when other servers keep moving its dataset on before it is written.</summary>
    private const int MaxCheckAttempts = 20;

    /// <summary>
    /// The longest pause before the n-th check, n times this: a random pause lets servers importing into one dataset
    /// at once take turns instead of each refusing the other in lockstep.
    /// </summary>
    private static readonly TimeSpan RecheckPauseStep = TimeSpan.FromMilliseconds(5);

    public override async Task<ImportEntriesResponse> ImportEntries(ImportEntriesRequest request, ServerCallContext context)
    {
        (IReadOnlyList<EntryRow> rows, Store.DuplicatePolicy policy) = BatchValidation.Validate(request, limits);
        context.CancellationToken.ThrowIfCancellationRequested();
        ImportResult result;
        var provenance = new BatchProvenance(request.SourceLabel, request.Note);
        using (await imports.EnterAsync(request.Dataset, context.CancellationToken))
        {
            result = await WriteOnCheckedBaseAsync(request.Dataset, rows, policy, "entries", "the batch was refused; nothing was written",
                rowIndexes: null, basedOn => store.ImportBatch(request.Dataset, rows, policy, provenance, basedOn), context.CancellationToken);
        }

        return new ImportEntriesResponse
        {
            DatasetVersion = result.NewVersion,
            InsertedCount = result.Inserted,
            ReplacedCount = result.Replaced,
        };
    }

    /// <summary>
    /// Checks <paramref name="rows"/> against the dataset's latest version (call it under the dataset's import lock) and
    /// writes them on exactly that version. Another server on the same store may commit or delete a version between
    /// the check and the write: the store then refuses (nothing written) and the check runs again on the new latest
    /// version, up to <see cref="MaxCheckAttempts"/> times. Remembers the ledger of the version written.
    /// </summary>
    private async Task<ImportResult> WriteOnCheckedBaseAsync(string dataset, IReadOnlyList<EntryRow> rows, Store.DuplicatePolicy policy,
        string rowsField, string refusal, IReadOnlyList<int>? rowIndexes, Func<long, ImportResult> write, CancellationToken cancellation)
    {
        for (int attempt = 1; ; attempt++)
        {
            DatasetLatest latest = store.GetLatest(dataset);
            ReferenceLedger next = await CheckReferencesAsync(dataset, latest, rows, policy, rowsField, refusal, cancellation, rowIndexes);
            try
            {
                // The write runs off the request thread; once begun it commits or rolls back whole, whatever the caller does.
                ImportResult result = await Task.Run(() => write(latest.Version));
                imports.Remember(dataset, latest with { Version = result.NewVersion }, next);
                return result;
            }
            catch (BaseVersionChangedException) when (attempt < MaxCheckAttempts)
            {
                // Another server moved the dataset on; check again, after a random pause.
                await Task.Delay(RecheckPauseStep * (Random.Shared.NextDouble() * attempt), cancellation);
            }
        }
    }

    /// <summary>
    /// Runs <see cref="ImportReferenceCheck"/> on <paramref name="rows"/> over <paramref name="latest"/> and returns the
    /// ledger of the version they would make; refuses with every violation.
    /// </summary>
    private async Task<ReferenceLedger> CheckReferencesAsync(string dataset, DatasetLatest latest, IReadOnlyList<EntryRow> rows,
        Store.DuplicatePolicy policy, string rowsField, string refusal, CancellationToken cancellation, IReadOnlyList<int>? rowIndexes)
    {
        ReferenceLedger ledger = await LedgerAsync(dataset, latest, cancellation);
        (IReadOnlyList<FieldViolation> violations, ReferenceLedger next) = await ImportReferenceCheck.CheckAsync(
            rows, policy, ledger,
            async () => latest.Version == IDatasetStore.NoVersion ? [] : (await SnapshotAsync(dataset, latest.Version, cancellation)).Entries,
            rowsField, rowIndexes);
        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize(refusal, violations), violations, ErrorReasons.InvalidEntry);
        }

        return next;
    }

    /// <summary>The reference ledger of <paramref name="version"/> (empty for none), remembered or read once.</summary>
    private async Task<ReferenceLedger> LedgerAsync(string dataset, DatasetLatest version, CancellationToken cancellation)
    {
        if (version.Version == IDatasetStore.NoVersion) return ReferenceLedger.Empty;
        if (imports.TryGetLedger(dataset, version, out ReferenceLedger known)) return known;
        ReferenceLedger ledger = ReferenceLedger.Of((await SnapshotAsync(dataset, version.Version, cancellation)).Entries);
        imports.Remember(dataset, version, ledger);
        return ledger;
    }

    private Task<VersionSnapshot> SnapshotAsync(string dataset, long version, CancellationToken cancellation) =>
        cache.GetSnapshotAsync(versions.Resolve(dataset, version), cancellation);

    public override async Task<ImportSession> BeginImport(BeginImportRequest request, ServerCallContext context)
    {
        Store.DuplicatePolicy policy = BatchValidation.Validate(request);
        ImportSessionInfo session = await Task.Run(() => store.BeginImport(
            request.Dataset, policy, new BatchProvenance(request.SourceLabel, request.Note), sessions.IdleExpiry));
        return ToWire(session);
    }

    public override async Task<ImportSession> StageEntries(StageEntriesRequest request, ServerCallContext context)
    {
        IReadOnlyList<EntryRow> rows = BatchValidation.Validate(request, limits);
        context.CancellationToken.ThrowIfCancellationRequested();
        // As for ImportEntries: once begun, the batch is staged whole or not at all.
        ImportSessionInfo session = await Task.Run(() => store.StageBatch(request.SessionId, rows, sessions.IdleExpiry));
        return ToWire(session);
    }

    public override async Task<ImportEntriesResponse> CommitImport(CommitImportRequest request, ServerCallContext context)
    {
        RequireSessionId(request.SessionId);
        // Under reject only the total-energy rows take part in the reference check, so only they are read; under
        // replace any row may supersede a stored reference entry.
        StagedImport staged = await Task.Run(() => store.ReadStagedImport(request.SessionId, TotalEnergyTokens));
        if (staged.Session.Policy == Store.DuplicatePolicy.Replace) staged = await Task.Run(() => store.ReadStagedImport(request.SessionId));
        string dataset = staged.Session.DatasetName;
        ImportResult result;
        // The same reference check as ImportEntries, under the same lock, over the whole session as one batch.
        using (await imports.EnterAsync(dataset, context.CancellationToken))
        {
            try
            {
                result = await WriteOnCheckedBaseAsync(dataset, staged.Rows.Select(r => r.Row).ToArray(), staged.Session.Policy,
                    "staged", "the commit was refused; nothing was written and the session is still open", staged.Rows.Select(r => r.Index).ToArray(),
                    basedOn => store.CommitImport(request.SessionId, staged.Session.StagedCount, basedOn), context.CancellationToken);
            }
            catch (DuplicateEntryException e)
            {
                // At commit the row is named by its place in the whole session, not in a request's entries.
                string field = $"staged[{e.RowIndex}].id";
                throw e.ExistingVersion is null
                    ? RpcErrors.InvalidArgument(e.Message, [new FieldViolation(field, e.Message)], ErrorReasons.InvalidEntry)
                    : RpcErrors.EntryIdExists(e.EntryId ?? string.Empty, e.Message + "; choose the replace duplicate policy to supersede it", field, e.Message);
            }
        }

        return new ImportEntriesResponse
        {
            DatasetVersion = result.NewVersion,
            InsertedCount = result.Inserted,
            ReplacedCount = result.Replaced,
        };
    }

    public override async Task<CancelImportResponse> CancelImport(CancelImportRequest request, ServerCallContext context)
    {
        RequireSessionId(request.SessionId);
        await Task.Run(() => store.CancelImport(request.SessionId));
        return new CancelImportResponse();
    }

    private ImportSession ToWire(ImportSessionInfo session) => new()
    {
        SessionId = session.SessionId,
        Dataset = session.DatasetName,
        StagedCount = session.StagedCount,
        ExpiresAt = Google.Protobuf.WellKnownTypes.Timestamp.FromDateTimeOffset(session.ExpiresAtUtc),
        IdleExpirySeconds = (int)Math.Min(int.MaxValue, sessions.IdleExpiry.TotalSeconds),
    };

    private static void RequireSessionId(string sessionId)
    {
        if (sessionId.Length == 0) throw RpcErrors.InvalidArgument("session_id", "no session id; BeginImport gives one");
    }

    public override async Task ExportEntries(ExportEntriesRequest request, IServerStreamWriter<ExportEntriesResponse> responseStream, ServerCallContext context)
    {
        RequireName(request.Dataset, "dataset");
        int pageSize = PageSize(request.PageSize, "page_size");
        if (request.Version < 0) throw RpcErrors.InvalidArgument("version", $"version {request.Version} is negative; 0 means the latest");

        long? version = request.Version == 0 ? null : request.Version;
        string? after = null;
        do
        {
            context.CancellationToken.ThrowIfCancellationRequested();
            EntryPage page = store.GetEntries(request.Dataset, version, after, pageSize);
            version = page.Version;
            var message = new ExportEntriesResponse { DatasetVersion = page.Version };
            message.Entries.AddRange(page.Entries.Select(WireMapping.ToWire));
            await responseStream.WriteAsync(message, context.CancellationToken);
            after = page.NextAfterId;
        }
        while (after is not null);
    }

    public override Task<ListVersionsResponse> ListVersions(ListVersionsRequest request, ServerCallContext context)
    {
        RequireName(request.Dataset, "dataset");
        int pageSize = PageToken.PageSize(request.PageSize);
        string list = VersionsList + request.Dataset;
        string? token = PageToken.Decode(request.PageToken, list);
        long after = 0;
        if (token is not null && !long.TryParse(token, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out after))
        {
            throw RpcErrors.InvalidArgument("page_token", "the page token is not one this server handed out; send next_page_token unchanged",
                ErrorReasons.InvalidPageToken);
        }

        var rest = store.ListVersions(request.Dataset).Where(v => v.Version > after).ToList();
        var response = new ListVersionsResponse();
        response.Versions.AddRange(WithCuration(request.Dataset, rest.Take(pageSize).ToList()));
        if (rest.Count > pageSize)
        {
            response.NextPageToken = PageToken.Encode(list, rest[pageSize - 1].Version.ToString(System.Globalization.CultureInfo.InvariantCulture));
        }

        return Task.FromResult(response);
    }

    public override Task<DeleteVersionResponse> DeleteVersion(DeleteVersionRequest request, ServerCallContext context)
    {
        RequireName(request.Dataset, "dataset");
        if (request.Version <= 0) throw RpcErrors.InvalidArgument("version", $"version {request.Version} is not a version number; versions count from 1");
        try
        {
            store.DeleteVersion(request.Dataset, request.Version);
        }
        finally
        {
            versions.Forget(request.Dataset);
            imports.Forget(request.Dataset);
        }

        return Task.FromResult(new DeleteVersionResponse());
    }

    /// <summary>The versions for the wire, each derived one with its curation record and the correction set it carries.</summary>
    private IEnumerable<DatasetVersion> WithCuration(string dataset, IReadOnlyList<DatasetVersionInfo> listed)
    {
        IReadOnlyDictionary<long, Store.CurationRecord> records = listed.Count == 0 ? new Dictionary<long, Store.CurationRecord>() : store.ListCurationRecords(dataset);
        IReadOnlyDictionary<long, VersionCorrections> corrections = listed.Count == 0 ? new Dictionary<long, VersionCorrections>() : store.ListVersionCorrections(dataset);
        foreach (DatasetVersionInfo version in listed)
        {
            DatasetVersion wire = WireMapping.ToWire(version);
            if (records.TryGetValue(version.Version, out Store.CurationRecord? record)) wire.Curation = CurationWireMapping.ToWire(dataset, version.Version, record);
            if (corrections.TryGetValue(version.Version, out VersionCorrections? used)) wire.Corrections = WireMapping.ToWire(used);
            yield return wire;
        }
    }

    /// <summary>A page size of 1 to the store's maximum; 0 means the default.</summary>
    internal static int PageSize(int requested, string field)
    {
        if (requested == 0) return DefaultPageSize;
        if (requested < 0 || requested > IDatasetStore.MaxPageSize)
        {
            throw RpcErrors.InvalidArgument(field, $"page size {requested} is outside 1..{IDatasetStore.MaxPageSize} (0 = {DefaultPageSize})");
        }

        return requested;
    }

    private static void RequireName(string name, string field)
    {
        if (DatasetName.Check(name) is { } problem) throw RpcErrors.InvalidArgument(field, problem, ErrorReasons.InvalidDatasetName);
    }
}
