using Google.Rpc;
using Grpc.Core;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Errors;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Every error carries a google.rpc.ErrorInfo (reason code of ours, domain) and the detail that fits its status,
/// checked over real gRPC for each reason a caller can provoke; the README's table lists exactly the reasons.
/// </summary>
public sealed class ErrorReasonTests : IAsyncLifetime
{
    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync(o => o with { Limits = o.Limits with { MaxCompositionsPerRequest = 3 } });
        await Data.CreateWithAsync(C, "d", Data.LiCoO());
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private static ErrorInfo InfoOf(RpcException e, StatusCode status, ErrorReason reason)
    {
        Assert.Equal(status, e.StatusCode);
        Google.Rpc.Status rpc = e.GetRpcStatus() ?? throw new Xunit.Sdk.XunitException($"no status details on {e.Status}");
        // ErrorInfo comes first, so a client that reads only one detail reads the reason.
        Assert.True(rpc.Details[0].TryUnpack(out ErrorInfo info), $"first detail is {rpc.Details[0].TypeUrl}");
        Assert.Equal(reason.Code, info.Reason);
        Assert.Equal(ErrorReasons.Domain, info.Domain);
        Assert.Equal(reason.Status, status);
        return info;
    }

    private static T DetailOf<T>(RpcException e) where T : class, Google.Protobuf.IMessage<T>, new() =>
        e.GetRpcStatus()!.GetDetail<T>() ?? throw new Xunit.Sdk.XunitException($"no {typeof(T).Name} on {e.Status}");

    private static async Task<RpcException> Refused(Func<Task> call) => await Assert.ThrowsAsync<RpcException>(call);

    [Fact]
    public async Task Invalid_field()
    {
        var e = await Refused(async () => await C.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d" }, C.Call()));
        InfoOf(e, StatusCode.InvalidArgument, ErrorReasons.InvalidField);
        Assert.Equal("formulas", Assert.Single(DetailOf<BadRequest>(e).FieldViolations).Field);
    }

    [Fact]
    public async Task Invalid_entry()
    {
        var e = await Refused(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("d", Hull.Protos.V1.DuplicatePolicy.Reject, Data.Formation("x", "LiQq", -1)), C.Call()));
        InfoOf(e, StatusCode.InvalidArgument, ErrorReasons.InvalidEntry);
        Assert.Equal("entries[0].formula", Assert.Single(DetailOf<BadRequest>(e).FieldViolations).Field);
    }

    [Fact]
    public async Task Invalid_dataset_name()
    {
        var e = await Refused(async () => await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "no spaces" }, C.Call()));
        InfoOf(e, StatusCode.InvalidArgument, ErrorReasons.InvalidDatasetName);
        Assert.Equal("name", Assert.Single(DetailOf<BadRequest>(e).FieldViolations).Field);
    }

    [Fact]
    public async Task Invalid_page_token()
    {
        var e = await Refused(async () => await C.Datasets.ListDatasetsAsync(new ListDatasetsRequest { PageToken = "not-a-token" }, C.Call()));
        InfoOf(e, StatusCode.InvalidArgument, ErrorReasons.InvalidPageToken);
        Assert.Equal("page_token", Assert.Single(DetailOf<BadRequest>(e).FieldViolations).Field);
    }

    [Fact]
    public async Task Dataset_not_found()
    {
        var e = await Refused(async () => await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "nope" }, C.Call()));
        ErrorInfo info = InfoOf(e, StatusCode.NotFound, ErrorReasons.DatasetNotFound);
        Assert.Equal("nope", info.Metadata["dataset"]);
        ResourceInfo resource = DetailOf<ResourceInfo>(e);
        Assert.Equal(("hull.v1.Dataset", "nope"), (resource.ResourceType, resource.ResourceName));
    }

    [Fact]
    public async Task Version_not_found()
    {
        var e = await Refused(async () => await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "d", Version = 9 }, C.Call()));
        ErrorInfo info = InfoOf(e, StatusCode.NotFound, ErrorReasons.VersionNotFound);
        Assert.Equal("9", info.Metadata["version"]);
        Assert.Equal("d@9", DetailOf<ResourceInfo>(e).ResourceName);

        await C.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "empty" }, C.Call());
        var none = await Refused(async () => await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "empty" }, C.Call()));
        Assert.Equal("latest", InfoOf(none, StatusCode.NotFound, ErrorReasons.VersionNotFound).Metadata["version"]);
    }

    [Fact]
    public async Task Entry_not_found()
    {
        var request = new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "Li2O", "zz" } };
        var e = await Refused(async () => await C.Stability.GetEntryStabilityAsync(request, C.Call()));
        Assert.Equal("zz", InfoOf(e, StatusCode.NotFound, ErrorReasons.EntryNotFound).Metadata["entry_id"]);
        Assert.Equal(("hull.v1.Entry", "zz"), (DetailOf<ResourceInfo>(e).ResourceType, DetailOf<ResourceInfo>(e).ResourceName));
        Assert.Equal("entry_ids[1]", Assert.Single(DetailOf<BadRequest>(e).FieldViolations).Field);
    }

    [Fact]
    public async Task Dataset_exists()
    {
        var e = await Refused(async () => await C.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, C.Call()));
        InfoOf(e, StatusCode.AlreadyExists, ErrorReasons.DatasetExists);
        Assert.Equal("d", DetailOf<ResourceInfo>(e).ResourceName);
    }

    [Fact]
    public async Task Entry_id_exists()
    {
        var e = await Refused(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("d", Hull.Protos.V1.DuplicatePolicy.Reject, Data.Formation("Li2O", "Li2O", -2.1)), C.Call()));
        InfoOf(e, StatusCode.AlreadyExists, ErrorReasons.EntryIdExists);
        Assert.Equal(("hull.v1.Entry", "Li2O"), (DetailOf<ResourceInfo>(e).ResourceType, DetailOf<ResourceInfo>(e).ResourceName));
    }

    [Fact]
    public async Task Missing_elemental_reference_for_a_candidate_and_for_the_analysis()
    {
        // The dataset holds formation energies only, so a total-energy candidate has no reference for its elements.
        var assess = new AssessCandidatesRequest { Dataset = "d", Candidates = { new Candidate { Formula = "Li2O2", EnergyEv = -20, Basis = Hull.Protos.V1.EnergyBasis.TotalPerFormulaUnit } } };
        var e = await Refused(async () => await C.Stability.AssessCandidatesAsync(assess, C.Call()));
        ErrorInfo info = InfoOf(e, StatusCode.FailedPrecondition, ErrorReasons.MissingElementalReference);
        PreconditionFailure.Types.Violation violation = Assert.Single(DetailOf<PreconditionFailure>(e).Violations);
        Assert.Equal(ErrorReasons.MissingElementalReference.Code, violation.Type);
        Assert.Equal($"element:{info.Metadata["element"]}", violation.Subject);

        // A stored total energy of Fe without any pure-Fe total energy: the whole-dataset analysis cannot start.
        await Data.CreateWithAsync(C, "t", Data.Total("FeO", "FeO", -12), Data.Total("O2", "O2", -9.8));
        var analysis = await Refused(async () =>
        {
            using var call = C.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = "t" }, C.Call());
            while (await call.ResponseStream.MoveNext(CancellationToken.None)) { }
        });
        Assert.Equal("Fe", InfoOf(analysis, StatusCode.FailedPrecondition, ErrorReasons.MissingElementalReference).Metadata["element"]);
        Assert.Equal("element:Fe", Assert.Single(DetailOf<PreconditionFailure>(analysis).Violations).Subject);
    }

    [Fact]
    public async Task Limit_exceeded()
    {
        var request = new GetHullEnergiesRequest { Dataset = "d", Formulas = { "Li2O", "CoO", "LiCoO2", "Co3O4" } };
        var e = await Refused(async () => await C.Stability.GetHullEnergiesAsync(request, C.Call()));
        ErrorInfo info = InfoOf(e, StatusCode.ResourceExhausted, ErrorReasons.LimitExceeded);
        Assert.Equal(("max_compositions_per_request", "3"), (info.Metadata["limit"], info.Metadata["limit_value"]));
        Assert.Equal("max_compositions_per_request", Assert.Single(DetailOf<QuotaFailure>(e).Violations).Subject);
    }

    [Fact]
    public async Task Write_token_required_and_rejected()
    {
        await using var guarded = await RunningServer.StartAsync(o => o with { WriteToken = "right-token" }, clientToken: "wrong-token");
        using var anonymous = new Clients(guarded.Server.Address);
        var missing = await Refused(async () => await anonymous.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "x" }, anonymous.Call()));
        InfoOf(missing, StatusCode.Unauthenticated, ErrorReasons.WriteTokenRequired);
        var wrong = await Refused(async () => await guarded.Clients.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "x" }, guarded.Clients.Call()));
        InfoOf(wrong, StatusCode.PermissionDenied, ErrorReasons.WriteTokenRejected);
    }

    [Fact]
    public void Errors_that_callers_cannot_provoke_carry_their_reasons_too()
    {
        // A stored row the service cannot read cannot be made through the API; its translation is checked directly.
        var unreadable = StoreErrorTranslation.Translate(new ThermoInputException("entry 'e' cannot be read", entryId: "e"))!;
        InfoOf(unreadable, StatusCode.FailedPrecondition, ErrorReasons.DatasetNotAnalysable);
        Assert.Equal("entry:e", Assert.Single(DetailOf<PreconditionFailure>(unreadable).Violations).Subject);

        // An error raised without these factories gets its status's general reason, its details kept.
        var bare = new Google.Rpc.Status { Code = (int)StatusCode.NotFound, Message = "gone" };
        bare.Details.Add(Google.Protobuf.WellKnownTypes.Any.Pack(new ResourceInfo { ResourceName = "r" }));
        var mended = RpcErrors.WithErrorInfo(bare.ToRpcException());
        InfoOf(mended, StatusCode.NotFound, ErrorReasons.ResourceNotFound);
        Assert.Equal("r", DetailOf<ResourceInfo>(mended).ResourceName);
        InfoOf(RpcErrors.WithErrorInfo(new RpcException(new Grpc.Core.Status(StatusCode.Internal, "x"))), StatusCode.Internal, ErrorReasons.InternalError);
        Assert.Throws<ArgumentException>(() => RpcErrors.Plain(StatusCode.NotFound, "x", ErrorReasons.LimitExceeded));

        // The general factories still add the detail that fits the status.
        var general = RpcErrors.WithViolations(StatusCode.FailedPrecondition, "stale", [new FieldViolation("f", "stale")]);
        Assert.Equal(ErrorReasons.PreconditionFailed.Code, Assert.Single(DetailOf<PreconditionFailure>(general).Violations).Type);
        Assert.Equal("f", Assert.Single(DetailOf<BadRequest>(general).FieldViolations).Field);
        Assert.Equal("request", Assert.Single(DetailOf<QuotaFailure>(RpcErrors.Plain(StatusCode.ResourceExhausted, "busy")).Violations).Subject);
    }

    [Fact]
    public void The_server_readme_lists_exactly_the_reasons()
    {
        string readme = File.ReadAllText(Path.Combine(RepositoryRoot(), "src", "Hull.Server", "README.md"));
        var listed = readme.Split('\n').Where(l => l.StartsWith("| `", StringComparison.Ordinal))
            .Select(l => l.Split('`')[1]).Where(c => c.All(ch => ch is (>= 'A' and <= 'Z') or '_')).ToList();
        Assert.Equal(ErrorReasons.All.Select(r => r.Code), listed);
        foreach (ErrorReason reason in ErrorReasons.All)
        {
            Assert.Contains($"| `{reason.Code}` | {StatusName(reason.Status)} |", readme);
        }
    }

    private static string StatusName(StatusCode code) =>
        string.Concat(code.ToString().Select((c, i) => i > 0 && char.IsUpper(c) ? "_" + c : c.ToString())).ToUpperInvariant();

    private static string RepositoryRoot()
    {
        for (var dir = new DirectoryInfo(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            if (File.Exists(Path.Combine(dir.FullName, "Hull.sln"))) return dir.FullName;
        }

        throw new InvalidOperationException("Hull.sln not found above the test folder");
    }
}
