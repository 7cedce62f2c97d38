using Grpc.Core;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Curation;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Server.Mapping;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Services;

/// <summary>
/// Curated versions: reads the recipe, runs it on the stored source version (nothing written yet), checks the rows
/// left as a new version's rows, then writes them with their record through one curated import session.
/// </summary>
public sealed class CurationGrpcService(IDatasetStore store, ImportGate imports, ImportSessionSettings sessions) : CurationService.CurationServiceBase
{
    public override async Task<CurateVersionResponse> CurateVersion(CurateVersionRequest request, ServerCallContext context)
    {
        RequireName(request.Dataset);
        if (request.SourceVersion < 0) throw RpcErrors.InvalidArgument("source_version", $"version {request.SourceVersion} is negative; 0 means the latest");
        if (EntryRules.CheckText(request.Note, "note", allowLineBreaks: true) is { } noteProblem) throw RpcErrors.InvalidArgument("note", noteProblem);
        CurationRecipe recipe = ReadRecipe(request.RecipeJson);

        CurationPlan plan = await Task.Run(() => MakePlan(request.Dataset, request.SourceVersion == 0 ? null : request.SourceVersion, recipe));
        long source = plan.Record.SourceVersion;
        if (plan.Rows.Count == 0)
        {
            throw RpcErrors.FailedPrecondition($"the recipe leaves no entries of '{request.Dataset}' version {source}; nothing was written",
                subject: $"dataset:{request.Dataset}");
        }

        // The rows become a whole version of their own, so they are checked as a first import: no stored version under them.
        (IReadOnlyList<FieldViolation> violations, _) = await ImportReferenceCheck.CheckAsync(
            plan.Rows, Store.DuplicatePolicy.Reject, ReferenceLedger.Empty, () => Task.FromResult<IReadOnlyList<PhaseEntry>>([]), "curated");
        if (violations.Count > 0)
        {
            throw RpcErrors.FailedPrecondition(BatchValidation.Summarize("the curated entries cannot form a version; nothing was written", violations),
                ErrorReasons.PreconditionFailed, $"dataset:{request.Dataset}", violations);
        }

        var provenance = new BatchProvenance($"curated from {request.Dataset}@{source}", request.Note);
        ImportResult result;
        using (await imports.EnterAsync(request.Dataset, context.CancellationToken))
        {
            // Once begun, the write commits or cancels whole off the request thread, whatever the caller does.
            result = await Task.Run(() => plan.Write(store, provenance, sessions.IdleExpiry, SessionVersionWrite.DefaultBatchRows));
            imports.Forget(request.Dataset);
        }

        var response = new CurateVersionResponse
        {
            DatasetVersion = result.NewVersion,
            EntryCount = plan.Rows.Count,
            ContentSha256 = store.GetFingerprint(request.Dataset, result.NewVersion),
            Record = CurationWireMapping.ToWire(request.Dataset, result.NewVersion, plan.Record),
        };
        if (plan.Corrections is { } corrections) response.Corrections = WireMapping.ToWire(corrections);
        return response;
    }

    public override async Task<Protos.V1.CurationRecord> GetCurationRecord(GetCurationRecordRequest request, ServerCallContext context)
    {
        RequireName(request.Dataset);
        if (request.Version <= 0) throw RpcErrors.InvalidArgument("version", $"version {request.Version} is not a version number; versions count from 1");
        Store.CurationRecord record = await Task.Run(() => store.GetCurationRecord(request.Dataset, request.Version))
            ?? throw RpcErrors.NotFound($"version {request.Version} of '{request.Dataset}' was not made by a recipe; it has no curation record",
                "version", ErrorReasons.ResourceNotFound);
        return CurationWireMapping.ToWire(request.Dataset, request.Version, record);
    }

    /// <summary>The recipe, or INVALID_ARGUMENT naming the step (from 0, as in the file) and the field.</summary>
    private static CurationRecipe ReadRecipe(string text)
    {
        try
        {
            return CurationRecipe.Parse(text);
        }
        catch (CurationRecipeException e)
        {
            throw RecipeError(e);
        }
    }

    private CurationPlan MakePlan(string dataset, long? sourceVersion, CurationRecipe recipe)
    {
        try
        {
            return CurationPlan.Make(store, dataset, sourceVersion, recipe);
        }
        catch (CurationRecipeException e)
        {
            throw RecipeError(e);
        }
        catch (VersionNotFoundException e)
        {
            throw RpcErrors.VersionNotFound(e.DatasetName, e.Version, e.Message, "source_version");
        }
    }

    private static RpcException RecipeError(CurationRecipeException e)
    {
        string field = e.StepNumber == 0 ? $"recipe_json.{e.Field}" : $"recipe_json.steps[{e.StepNumber - 1}].{e.Field}";
        return RpcErrors.InvalidArgument(e.Message + "; nothing was written", [new FieldViolation(field, e.Message)], ErrorReasons.InvalidField);
    }

    private static void RequireName(string name)
    {
        if (DatasetName.Check(name) is { } problem) throw RpcErrors.InvalidArgument("dataset", problem, ErrorReasons.InvalidDatasetName);
    }
}
