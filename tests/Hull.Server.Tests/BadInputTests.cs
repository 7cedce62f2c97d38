using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Every documented bad input gets its documented status and a message that says what and where; a refused batch
/// writes nothing.
/// </summary>
public sealed class BadInputTests : IAsyncLifetime
{
    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        await Data.CreateWithAsync(C, "d", Data.LiCoO());
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private async Task<RpcException> RefusedImport(params Entry[] entries) =>
        await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, entries), C.Call()));

    private async Task AssertNothingWritten() =>
        Assert.Equal(1, (await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "d" }, C.Call())).Dataset.LatestVersion);

    [Fact]
    public async Task Malformed_formula_names_row_field_and_character()
    {
        var e = await RefusedImport(Data.Formation("ok", "Li2O2", -1.6), Data.Formation("bad", "LiXx2", -1));
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        var v = Assert.Single(Data.Violations(e));
        Assert.Equal("entries[1].formula", v.Field);
        // FormulaParseException counts characters from 1 for people: 'X' is the 3rd character of "LiXx2".
        Assert.Contains("at character 3", v.Description);
        Assert.Contains("entries[1].formula", e.Status.Detail);
        await AssertNothingWritten();
    }

    [Theory]
    [InlineData(double.NaN, "NaN")]
    [InlineData(double.PositiveInfinity, "+Infinity")]
    [InlineData(double.NegativeInfinity, "-Infinity")]
    public async Task Non_finite_energy_is_refused(double energy, string shown)
    {
        var e = await RefusedImport(Data.Formation("x", "Li2O2", energy));
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        var v = Assert.Single(Data.Violations(e));
        Assert.Equal("entries[0].energy_ev", v.Field);
        Assert.Contains(shown, v.Description);
        await AssertNothingWritten();
    }

    [Fact]
    public async Task Several_bad_rows_are_all_listed()
    {
        var e = await RefusedImport(
            Data.Formation("a", "Li2O2", -1), Data.Formation("", "LiO2", -1), new Entry { Id = "c", Formula = "Li((O", EnergyEv = 1 },
            Data.Formation("a", "LiO2", -1));
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        string[] fields = Data.Violations(e).Select(v => v.Field).ToArray();
        Assert.Equal(["entries[1].id", "entries[2].formula", "entries[2].basis", "entries[3].id"], fields);
        Assert.Contains("(and 3 more problems)", e.Status.Detail);
    }

    [Fact]
    public async Task Empty_batch_and_missing_policy_are_refused()
    {
        var empty = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject), C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, empty.StatusCode);
        Assert.Equal("entries", Assert.Single(Data.Violations(empty)).Field);
        Assert.Contains("the batch is empty", empty.Status.Detail);

        var noPolicy = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Unspecified, Data.Formation("x", "Li2O2", -1)), C.Call()));
        Assert.Equal("duplicate_policy", Assert.Single(Data.Violations(noPolicy)).Field);
        await AssertNothingWritten();
    }

    [Fact]
    public async Task Unknown_dataset_and_unknown_version_are_not_found()
    {
        var dataset = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "nope", Formulas = { "LiCoO2" } }, C.Call()));
        Assert.Equal(StatusCode.NotFound, dataset.StatusCode);
        Assert.Contains("'nope'", dataset.Status.Detail);

        var import = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Datasets.ImportEntriesAsync(Data.Batch("nope", DuplicatePolicy.Reject, Data.Formation("x", "Li", 0)), C.Call()));
        Assert.Equal(StatusCode.NotFound, import.StatusCode);

        var version = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Version = 7, Formulas = { "LiCoO2" } }, C.Call()));
        Assert.Equal(StatusCode.NotFound, version.StatusCode);
        Assert.Equal("version", Assert.Single(Data.Violations(version)).Field);

        var entry = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "CoO", "ghost" } }, C.Call()));
        Assert.Equal(StatusCode.NotFound, entry.StatusCode);
        Assert.Equal("entry_ids[1]", Assert.Single(Data.Violations(entry)).Field);
    }

    [Fact]
    public async Task Missing_elemental_reference_is_a_failed_precondition_naming_the_element()
    {
        // Total energies need each element's reference: the lowest pure-element total energy. Co has none here.
        await Data.CreateWithAsync(C, "totals",
            Data.Total("Li", "Li", -1.9), Data.Total("O2", "O2", -9.9), Data.Total("LiCoO2", "LiCoO2", -22.0));
        var e = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "totals", EntryIds = { "LiCoO2" } }, C.Call()));
        Assert.Equal(StatusCode.FailedPrecondition, e.StatusCode);
        Assert.Contains("Co", e.Status.Detail);

        // A candidate given as a total energy against a dataset of formation energies has no reference at all.
        var candidate = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.AssessCandidatesAsync(new AssessCandidatesRequest
            {
                Dataset = "d",
                Candidates = { new Candidate { Formula = "Li2O2", EnergyEv = -20, Basis = EnergyBasis.TotalPerFormulaUnit } },
            }, C.Call()));
        Assert.Equal(StatusCode.FailedPrecondition, candidate.StatusCode);
        Assert.Contains("missing elemental reference", candidate.Status.Detail);
        Assert.Equal("candidates[0].basis", Assert.Single(Data.Violations(candidate)).Field);
    }

    [Theory]
    [InlineData("Li-Co-Xq", "'Xq' at character 7")]
    [InlineData("Li--O", "an empty part at character 4")]
    [InlineData("Li-O-Li", "element Li appears twice")]
    [InlineData("", "the chemical system is empty")]
    public async Task Bad_chemical_system_text_is_refused(string system, string expected)
    {
        var e = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = "d", ChemicalSystem = system }, C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        Assert.Equal("chemical_system", Assert.Single(Data.Violations(e)).Field);
        Assert.Contains(expected, e.Status.Detail);
    }

    [Fact]
    public async Task Bad_names_versions_and_candidates_are_invalid_arguments()
    {
        var name = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "Bad Name" }, C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, name.StatusCode);
        Assert.Equal("name", Assert.Single(Data.Violations(name)).Field);

        var version = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "d", Version = -2 }, C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, version.StatusCode);

        var candidate = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.AssessCandidatesAsync(new AssessCandidatesRequest
            {
                Dataset = "d",
                Candidates = { new Candidate { Formula = "Li2)O", EnergyEv = double.NaN, Basis = EnergyBasis.FormationPerAtom } },
            }, C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, candidate.StatusCode);
        Assert.Equal(["candidates[0].formula", "candidates[0].energy_ev"], Data.Violations(candidate).Select(v => v.Field));
    }

    [Fact]
    public async Task A_dataset_without_versions_answers_not_found()
    {
        await C.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "empty" }, C.Call());
        var e = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "empty" }, C.Call()));
        Assert.Equal(StatusCode.NotFound, e.StatusCode);
        Assert.Contains("no version yet", e.Status.Detail);
    }
}
