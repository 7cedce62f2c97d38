using Grpc.Core;
using Hull.Core.Thermo.Corrections;
using Hull.Protos.V1;
using Hull.Server.Corrections;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Store;

namespace Hull.Server.Services;

/// <summary>The correction service: reads set documents, keeps them in the store, and derives corrected versions.</summary>
public sealed class CorrectionGrpcService(IDatasetStore store, CorrectedVersionWriter writer) : CorrectionService.CorrectionServiceBase
{
    public override async Task<CorrectionSetInfo> PutCorrectionSet(PutCorrectionSetRequest request, ServerCallContext context)
    {
        CorrectionSet set = Parse(request.SetJson, "set_json");
        CorrectionSetRecord record = await Task.Run(() => store.PutCorrectionSet(set.Name, set.Version, request.SetJson));
        return ToWire(record, set);
    }

    public override Task<ListCorrectionSetsResponse> ListCorrectionSets(ListCorrectionSetsRequest request, ServerCallContext context)
    {
        var response = new ListCorrectionSetsResponse();
        response.Sets.AddRange(store.ListCorrectionSets().Select(r => ToWire(r, CorrectionSetDocument.Parse(r.SetJson))));
        return Task.FromResult(response);
    }

    public override Task<CorrectionSetInfo> GetCorrectionSet(GetCorrectionSetRequest request, ServerCallContext context)
    {
        CorrectionSetRecord record = Stored(request.Name, request.Version, "");
        return Task.FromResult(ToWire(record, CorrectionSetDocument.Parse(record.SetJson)));
    }

    public override async Task<DeriveCorrectedVersionResponse> DeriveCorrectedVersion(DeriveCorrectedVersionRequest request, ServerCallContext context)
    {
        if (request.SourceVersion < 0)
        {
            throw RpcErrors.InvalidArgument("source_version", $"version {request.SourceVersion} is negative; versions count from 1 and 0 means the latest");
        }

        (CorrectionSet set, string json, string field) = request.SetCase switch
        {
            DeriveCorrectedVersionRequest.SetOneofCase.Stored => FromStore(request.Stored),
            DeriveCorrectedVersionRequest.SetOneofCase.InlineSetJson => (Parse(request.InlineSetJson, "inline_set_json"), request.InlineSetJson, "inline_set_json"),
            _ => throw RpcErrors.InvalidArgument("set", "no correction set given; name a stored one (stored) or give its document (inline_set_json)"),
        };
        if (EntryRulesNote(request.Note) is { } problem) throw RpcErrors.InvalidArgument("note", problem);

        DerivedVersion derived = await writer.WriteAsync(request.Dataset, request.SourceVersion, set, json, field, request.Note, context.CancellationToken);
        var response = new DeriveCorrectedVersionResponse
        {
            Derived = WireMapping.ToWire(derived.Version),
            EntryCount = derived.Corrected.Rows.Count,
            ChangedCount = derived.Corrected.Outcome.ChangedCount,
        };
        response.Shifts.AddRange(derived.Corrected.Outcome.Entries.Where(e => e.IsChanged)
            .OrderBy(e => e.Raw.Id, EntryIdOrder.Comparer)
            .Select(e => new EntryShift
            {
                EntryId = e.Raw.Id,
                Method = e.Method ?? string.Empty,
                MethodShiftEvPerAtom = e.MethodShiftEvPerAtom,
                SpeciesShiftEvPerAtom = e.SpeciesShiftEvPerAtom,
                ReferenceShiftEvPerAtom = e.ReferenceShiftEvPerAtom,
                TotalShiftEvPerAtom = e.TotalShiftEvPerAtom,
            }));
        return response;
    }

    private static string? EntryRulesNote(string note) => Validation.EntryRules.CheckText(note, "note", allowLineBreaks: true);

    private (CorrectionSet, string, string) FromStore(CorrectionSetName name)
    {
        CorrectionSetRecord record = Stored(name.Name, name.Version, "stored.");
        return (CorrectionSetDocument.Parse(record.SetJson), record.SetJson, "stored");
    }

    private CorrectionSetRecord Stored(string name, long version, string prefix)
    {
        if (string.IsNullOrWhiteSpace(name)) throw RpcErrors.InvalidArgument(prefix + "name", "no correction set name given");
        if (version < 1) throw RpcErrors.InvalidArgument(prefix + "version", $"correction set versions count from 1, got {version}");
        try
        {
            return store.GetCorrectionSet(name, version);
        }
        catch (InvalidBatchException e)
        {
            throw RpcErrors.InvalidArgument(prefix + (e.Field ?? "name"), e.Message);
        }
    }

    private static CorrectionSet Parse(string json, string field)
    {
        try
        {
            return CorrectionSetDocument.Parse(json);
        }
        catch (CorrectionSetDocumentException e)
        {
            throw RpcErrors.InvalidArgument(field, e.Message, ErrorReasons.InvalidField);
        }
    }

    private static CorrectionSetInfo ToWire(CorrectionSetRecord record, CorrectionSet set) => new()
    {
        Name = record.SetName,
        Version = record.SetVersion,
        SetJson = record.SetJson,
        StoredAt = Google.Protobuf.WellKnownTypes.Timestamp.FromDateTimeOffset(record.StoredAtUtc),
        BaseMethod = set.BaseMethod,
        FittedReferenceCount = set.FittedReferences.Count,
        SpeciesShiftCount = set.SpeciesShifts.Count,
        MethodRuleCount = set.MethodRules.Count,
    };
}
