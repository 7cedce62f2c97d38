using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using BatchProvenance = Hull.Store.BatchProvenance;
using EntryRow = Hull.Store.EntryRow;
using EnergyBasis = Hull.Protos.V1.EnergyBasis;
using DuplicatePolicy = Hull.Protos.V1.DuplicatePolicy;

namespace Hull.Server.Tests;

/// <summary>
/// Answers that could mislead and data that could poison a dataset: coverage of each answer's chemical system,
/// explicit elemental references, total energies without a reference, the formation-energy range at import, for
/// candidates and for a later import that changes a reference, and stored rows that an older server let in.
/// </summary>
public sealed class PoisonedDataTests : IAsyncLifetime
{
    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync() => _server = await RunningServer.StartAsync();

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private static Entry PerAtom(string id, string formula, double evPerAtom) =>
        new() { Id = id, Formula = formula, EnergyEv = evPerAtom, Basis = EnergyBasis.TotalPerAtom };

    private static GetEntryStabilityRequest Stability(string dataset, params string[] ids)
    {
        var request = new GetEntryStabilityRequest { Dataset = dataset };
        request.EntryIds.AddRange(ids);
        return request;
    }

    private static AssessCandidatesRequest Assess(string dataset, string formula, double energy, EnergyBasis basis)
    {
        var request = new AssessCandidatesRequest { Dataset = dataset };
        request.Candidates.Add(new Candidate { Formula = formula, EnergyEv = energy, Basis = basis });
        return request;
    }

    private async Task<List<AnalyzeDatasetResponse>> AnalyzeAsync(AnalyzeDatasetRequest request)
    {
        using var call = C.Stability.AnalyzeDataset(request, C.Call());
        var pages = new List<AnalyzeDatasetResponse>();
        await foreach (AnalyzeDatasetResponse page in call.ResponseStream.ReadAllAsync()) pages.Add(page);
        return pages;
    }

    private async Task<long> LatestAsync(string dataset) =>
        (await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = dataset }, C.Call())).Dataset.LatestVersion;

    [Fact]
    public async Task A_candidate_in_a_system_without_entries_of_one_element_says_so()
    {
        // The reported case: ZrO2 at -3.0 eV/atom against a dataset with no Zr phase at all.
        await Data.CreateWithAsync(C, "mgo", Data.Formation("O2", "O2", 0), Data.Formation("MgO", "MgO", -3.1));
        AssessCandidatesResponse response = await C.Stability.AssessCandidatesAsync(Assess("mgo", "ZrO2", -3.0, EnergyBasis.FormationPerAtom), C.Call());
        Assert.True(response.Results.Single().IsOnOrBelowHull);
        SystemCoverage coverage = Assert.Single(response.Coverage);
        Assert.Equal("O-Zr", coverage.ChemicalSystem);
        Assert.Equal(0, coverage.CompetingPhaseCount);
        Assert.Equal(1, coverage.EntryCount);
        ElementCoverage zr = coverage.Elements.Single(e => e.Symbol == "Zr");
        Assert.True(zr.ZeroByDefinition);
        Assert.Equal(0, zr.PureEntryCount);
        Assert.False(coverage.Elements.Single(e => e.Symbol == "O").ZeroByDefinition);

        GetEntryStabilityResponse stored = await C.Stability.GetEntryStabilityAsync(Stability("mgo", "MgO"), C.Call());
        SystemCoverage mgO = Assert.Single(stored.Coverage);
        Assert.Equal("Mg-O", mgO.ChemicalSystem);
        Assert.Equal(1, mgO.CompetingPhaseCount);
        Assert.Equal(["Mg"], mgO.Elements.Where(e => e.ZeroByDefinition).Select(e => e.Symbol));
    }

    [Fact]
    public async Task A_total_energy_without_reference_is_accepted_and_its_system_reported_while_the_rest_is_answered()
    {
        await Data.CreateWithAsync(C, "zr",
            PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54), Data.Total("MgO", "MgO", -12.0),
            Data.Total("ZrO2", "ZrO2", -28.5), Data.Total("MgZrO3", "MgZrO3", -40.0));

        // The streamed analysis succeeds: the O-Zr problem in the first message, every other entry answered.
        List<AnalyzeDatasetResponse> pages = await AnalyzeAsync(new AnalyzeDatasetRequest { Dataset = "zr", PageSize = 1 });
        SystemProblem problem = Assert.Single(pages[0].SystemProblems);
        Assert.Equal("O-Zr", problem.ChemicalSystem);
        Assert.Equal(["Zr"], problem.ElementsWithoutReference);
        Assert.Equal(["MgZrO3", "ZrO2"], problem.UnansweredEntryIds);
        Assert.Equal(2, problem.UnansweredEntryCount);
        Assert.Contains("no elemental reference for Zr", problem.Message);
        Assert.Equal(["Mg", "MgO", "O2"], pages.SelectMany(p => p.Results).Select(r => r.EntryId));
        Assert.All(pages, p => Assert.Equal(3, p.EntryCount));
        Assert.All(pages, p => Assert.Equal(2, p.UnansweredEntryCount));
        Assert.All(pages.Skip(1), p => Assert.Empty(p.SystemProblems));

        // The whole-dataset stable phases answer too, with the same report.
        GetStablePhasesResponse stable = await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "zr" }, C.Call());
        Assert.Equal(["Mg", "MgO", "O2"], stable.Phases.Select(p => p.PhaseId));
        Assert.Equal("O-Zr", Assert.Single(stable.SystemProblems).ChemicalSystem);

        // Asking for that system alone names the element and the entry.
        var refused = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetEntryStabilityAsync(Stability("zr", "ZrO2"), C.Call()));
        Assert.Equal(StatusCode.FailedPrecondition, refused.StatusCode);
        Assert.Contains("element Zr", refused.Status.Detail);
        Assert.Contains("'ZrO2'", refused.Status.Detail);

        // An explicit reference makes it real, and the answer records it as the caller's.
        var request = Stability("zr", "ZrO2");
        request.ElementalReferences.Add(new ElementReferenceEnergy { Symbol = "Zr", EnergyEvPerAtom = -8.5 });
        GetEntryStabilityResponse answered = await C.Stability.GetEntryStabilityAsync(request, C.Call());
        // (-28.5 - (-8.5) - 2 (-4.93)) / 3 = -3.38 eV/atom
        Assert.Equal(-3.38, answered.Results.Single().FormationEnergyEvPerAtom, 1e-9);
        ElementReference zr = answered.References.Single(r => r.Symbol == "Zr");
        Assert.True(zr.GivenByCaller);
        Assert.Equal(string.Empty, zr.SourceEntryId);
        Assert.Equal("O2", answered.References.Single(r => r.Symbol == "O").SourceEntryId);
        Assert.True(answered.Coverage.Single().Elements.Single(e => e.Symbol == "Zr").Reference.GivenByCaller);

        var analyzeWith = new AnalyzeDatasetRequest { Dataset = "zr" };
        analyzeWith.ElementalReferences.Add(new ElementReferenceEnergy { Symbol = "Zr", EnergyEvPerAtom = -8.5 });
        List<AnalyzeDatasetResponse> whole = await AnalyzeAsync(analyzeWith);
        Assert.Empty(whole[0].SystemProblems);
        Assert.Equal(5, whole.Sum(p => p.Results.Count));
    }

    [Fact]
    public async Task A_total_energy_candidate_needs_a_reference_and_an_explicit_one_is_recorded()
    {
        await Data.CreateWithAsync(C, "o", PerAtom("O2", "O2", -4.93));
        var missing = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.AssessCandidatesAsync(Assess("o", "ZrO2", -28.5, EnergyBasis.TotalPerFormulaUnit), C.Call()));
        Assert.Equal(StatusCode.FailedPrecondition, missing.StatusCode);
        Assert.Contains("missing elemental reference", missing.Status.Detail);
        Assert.Contains("elemental_references", missing.Status.Detail);

        AssessCandidatesRequest request = Assess("o", "ZrO2", -28.5, EnergyBasis.TotalPerFormulaUnit);
        request.ElementalReferences.Add(new ElementReferenceEnergy { Symbol = "Zr", EnergyEvPerAtom = -8.5 });
        AssessCandidatesResponse response = await C.Stability.AssessCandidatesAsync(request, C.Call());
        Assert.Equal(-3.38, response.Results.Single().FormationEnergyEvPerAtom, 1e-9);
        Assert.True(response.References.Single(r => r.Symbol == "Zr").GivenByCaller);
        Assert.False(response.References.Single(r => r.Symbol == "O").GivenByCaller);

        var bad = Assess("o", "ZrO2", -28.5, EnergyBasis.TotalPerFormulaUnit);
        bad.ElementalReferences.Add(new ElementReferenceEnergy { Symbol = "zr", EnergyEvPerAtom = -8.5 });
        bad.ElementalReferences.Add(new ElementReferenceEnergy { Symbol = "O", EnergyEvPerAtom = double.NaN });
        var refused = await Assert.ThrowsAsync<RpcException>(async () => await C.Stability.AssessCandidatesAsync(bad, C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, refused.StatusCode);
        Assert.Equal(["elemental_references[0].symbol", "elemental_references[1].energy_ev_per_atom"], Data.Violations(refused).Select(v => v.Field));
    }

    [Fact]
    public async Task Out_of_range_energies_are_refused_at_import_naming_the_row()
    {
        await Data.CreateWithAsync(C, "r", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54));
        long before = await LatestAsync("r");

        var direct = await Assert.ThrowsAsync<RpcException>(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("r", DuplicatePolicy.Reject, Data.Formation("ok", "MgO2", -1.0), Data.Formation("huge", "MgO", -1e300)), C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, direct.StatusCode);
        var v = Assert.Single(Data.Violations(direct));
        Assert.Equal("entries[1].energy_ev", v.Field);
        Assert.Contains("-1E+300 eV/atom is outside the accepted ±100 eV/atom", v.Description);

        // -2e4 eV per formula unit is a plausible total-energy scale, but against these references it implies about
        // -1e4 eV/atom of formation energy.
        var implied = await Assert.ThrowsAsync<RpcException>(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("r", DuplicatePolicy.Reject, Data.Total("MgO", "MgO", -2e4)), C.Call()));
        var w = Assert.Single(Data.Violations(implied));
        Assert.Equal("entries[0].energy_ev", w.Field);
        Assert.Contains("id 'MgO'", w.Description);
        Assert.Contains("implied by its total energy", w.Description);
        Assert.Contains("'O2'", w.Description);
        Assert.Equal(before, await LatestAsync("r"));

        // Large total energies on the same scale as their references are fine: all-electron total energies of heavy
        // atoms reach 1e5 eV/atom and more (Pb about -5.9e5 eV/atom; from memory).
        await C.Datasets.ImportEntriesAsync(Data.Batch("r", DuplicatePolicy.Reject,
            PerAtom("Pb", "Pb", -5.9e5), new Entry { Id = "PbO", Formula = "PbO", EnergyEv = -5.9e5 / 2 - 4.93 / 2 - 1.1, Basis = EnergyBasis.TotalPerAtom }), C.Call());
    }

    [Fact]
    public async Task A_later_import_that_changes_a_reference_is_refused_when_it_would_push_stored_entries_out_of_range()
    {
        await Data.CreateWithAsync(C, "later", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54), Data.Total("MgO", "MgO", -12.0));
        long before = await LatestAsync("later");

        // A new lowest Mg entry at -1000 eV/atom would put MgO at about +496 eV/atom.
        var refused = await Assert.ThrowsAsync<RpcException>(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("later", DuplicatePolicy.Reject, Data.Formation("x", "MgO2", -1.0), PerAtom("Mg-new", "Mg", -1000)), C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, refused.StatusCode);
        var v = Assert.Single(Data.Violations(refused));
        Assert.Equal("entries[1].energy_ev", v.Field);
        Assert.Contains("id 'Mg-new' sets the Mg reference to -1000 eV/atom", v.Description);
        Assert.Contains("'MgO' (MgO)", v.Description);
        Assert.Equal(before, await LatestAsync("later"));

        // Replacing the reference entry itself is a reference change too.
        var replaced = await Assert.ThrowsAsync<RpcException>(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("later", DuplicatePolicy.Replace, PerAtom("Mg", "Mg", 500)), C.Call()));
        Assert.Contains("'MgO' (MgO)", Assert.Single(Data.Violations(replaced)).Description);

        // A change that keeps every entry in range is accepted and used from the new version on.
        await C.Datasets.ImportEntriesAsync(Data.Batch("later", DuplicatePolicy.Reject, PerAtom("Mg-hcp", "Mg", -1.6)), C.Call());
        GetEntryStabilityResponse after = await C.Stability.GetEntryStabilityAsync(Stability("later", "MgO"), C.Call());
        Assert.Equal("Mg-hcp", after.References.Single(r => r.Symbol == "Mg").SourceEntryId);
        // (-12.0 / 2) - 0.5 (-1.6) - 0.5 (-4.93) = -2.735 eV/atom
        Assert.Equal(-2.735, after.Results.Single().FormationEnergyEvPerAtom, 1e-9);

        // A reference arriving later for an element that had none is checked the same way.
        await C.Datasets.ImportEntriesAsync(Data.Batch("later", DuplicatePolicy.Reject, Data.Total("ZrO2", "ZrO2", -28.5)), C.Call());
        var zr = await Assert.ThrowsAsync<RpcException>(async () => await C.Datasets.ImportEntriesAsync(
            Data.Batch("later", DuplicatePolicy.Reject, PerAtom("Zr", "Zr", 1e4)), C.Call()));
        Assert.Contains("'ZrO2' (ZrO2)", Assert.Single(Data.Violations(zr)).Description);
    }

    [Fact]
    public async Task Huge_candidates_are_refused_instead_of_printed()
    {
        await Data.CreateWithAsync(C, "c", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54));
        var direct = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.AssessCandidatesAsync(Assess("c", "MgO", -1e300, EnergyBasis.FormationPerAtom), C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, direct.StatusCode);
        Assert.Equal("candidates[0].energy_ev", Assert.Single(Data.Violations(direct)).Field);

        var implied = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.AssessCandidatesAsync(Assess("c", "MgO", -1e300, EnergyBasis.TotalPerFormulaUnit), C.Call()));
        Assert.Equal(StatusCode.InvalidArgument, implied.StatusCode);
        var v = Assert.Single(Data.Violations(implied));
        Assert.Equal("candidates[0].energy_ev", v.Field);
        Assert.Contains("outside the accepted ±100 eV/atom", v.Description);
        Assert.True(v.Description.Length < 300, v.Description);
    }

    [Fact]
    public async Task A_poisoned_row_an_older_server_stored_is_answered_clearly_never_internal()
    {
        await Data.CreateWithAsync(C, "old", Data.Formation("O2", "O2", 0), Data.Formation("MgO", "MgO", -3.1), Data.Formation("TiO2", "TiO2", -3.4));
        // Written straight into the store, as a server without the range rule would have.
        _server.Server.Store.ImportBatch("old", [new EntryRow("MgO-bad", "MgO", -1e300, "formation_per_atom", "")],
            Hull.Store.DuplicatePolicy.Reject, new BatchProvenance("older server", ""));

        var hull = await Assert.ThrowsAsync<RpcException>(async () =>
            await C.Stability.GetEntryStabilityAsync(Stability("old", "MgO"), C.Call()));
        Assert.Equal(StatusCode.FailedPrecondition, hull.StatusCode);
        Assert.Contains("'MgO-bad'", hull.Status.Detail);
        Assert.Contains("outside the accepted ±100 eV/atom", hull.Status.Detail);

        List<AnalyzeDatasetResponse> pages = await AnalyzeAsync(new AnalyzeDatasetRequest { Dataset = "old" });
        Assert.Equal("Mg-O", Assert.Single(pages[0].SystemProblems).ChemicalSystem);
        Assert.Equal(["O2", "TiO2"], pages.SelectMany(p => p.Results).Select(r => r.EntryId));

        GetEntryStabilityResponse other = await C.Stability.GetEntryStabilityAsync(Stability("old", "TiO2"), C.Call());
        Assert.True(other.Results.Single().IsHullVertex);
    }

    [Fact]
    public async Task The_streamed_analysis_sends_each_system_coverage_once_with_its_first_result()
    {
        await Data.CreateWithAsync(C, "s",
            Data.Formation("a-O2", "O2", 0), Data.Formation("b-MgO", "MgO", -3.1), Data.Formation("c-TiO2", "TiO2", -3.4),
            Data.Formation("d-MgO2", "MgO2", -1.0), Data.Formation("e-Ti2O3", "Ti2O3", -3.2));
        List<AnalyzeDatasetResponse> pages = await AnalyzeAsync(new AnalyzeDatasetRequest { Dataset = "s", PageSize = 1 });
        Assert.Equal(5, pages.Count);
        // Results in id order: a-O2 (reported by Mg-O, the first hull containing it), b-MgO (Mg-O), c-TiO2 (O-Ti), ...
        var seen = new HashSet<string>();
        foreach (AnalyzeDatasetResponse page in pages)
        {
            string system = page.Results.Single().ChemicalSystem;
            if (seen.Add(system)) Assert.Equal([system], page.Coverage.Select(c => c.ChemicalSystem));
            else Assert.Empty(page.Coverage);
        }

        Assert.Equal(["Mg-O", "O-Ti"], seen.Order(StringComparer.Ordinal));
    }

    [Fact]
    public async Task Ties_of_the_vertex_read_zero_over_the_wire()
    {
        await Data.CreateWithAsync(C, "ag",
            Data.Formation("Ag", "Ag", 0), Data.Formation("O2", "O2", 0),
            Data.Formation("Ag2O-a", "Ag2O", -0.107), Data.Formation("Ag2O-b", "Ag2O", -0.107), Data.Formation("Ag4O2", "Ag4O2", -0.107));
        GetEntryStabilityResponse response = await C.Stability.GetEntryStabilityAsync(Stability("ag", "Ag2O-a", "Ag2O-b", "Ag4O2"), C.Call());
        Assert.Equal(-0.107, response.Results[0].DecompositionEnergyEvPerAtom, 1e-12);
        Assert.True(response.Results[0].IsHullVertex);
        Assert.All(response.Results.Skip(1), r =>
        {
            Assert.False(r.IsHullVertex);
            Assert.True(r.HasDecompositionEnergyEvPerAtom);
            Assert.Equal(0.0, r.DecompositionEnergyEvPerAtom);
        });
    }

    [Fact]
    public async Task Extreme_finite_energies_are_answered_or_refused_clearly_never_internal()
    {
        // Fuzz over the wire: imports, candidates and analyses with energies from 1e-300 to 1e300 of both signs and
        // every basis. Each call answers, or refuses with INVALID_ARGUMENT / FAILED_PRECONDITION and a short message.
        await Data.CreateWithAsync(C, "fuzz", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54), Data.Formation("TiO2", "TiO2", -3.4));
        var random = new Random(11);
        EnergyBasis[] bases = [EnergyBasis.TotalPerFormulaUnit, EnergyBasis.TotalPerAtom, EnergyBasis.FormationPerFormulaUnit, EnergyBasis.FormationPerAtom];
        string[] formulas = ["MgO", "Mg2TiO4", "TiO", "Mg", "O2", "Ti", "MgTi2O5"];
        double Extreme() => (random.Next(2) == 0 ? -1 : 1) * Math.Pow(10, -300 + random.NextDouble() * 600);
        StatusCode[] clear = [StatusCode.InvalidArgument, StatusCode.FailedPrecondition];
        for (int round = 0; round < 12; round++)
        {
            var batch = Enumerable.Range(0, 4).Select(k => new Entry
            {
                Id = $"r{round}-{k}", Formula = formulas[random.Next(formulas.Length)], EnergyEv = Extreme(), Basis = bases[random.Next(4)],
            }).ToArray();
            try
            {
                await C.Datasets.ImportEntriesAsync(Data.Batch("fuzz", DuplicatePolicy.Reject, batch), C.Call());
            }
            catch (RpcException e)
            {
                Assert.Contains(e.StatusCode, clear);
                Assert.True(e.Status.Detail.Length < 2000, e.Status.Detail);
            }

            var candidates = new AssessCandidatesRequest { Dataset = "fuzz" };
            candidates.Candidates.Add(new Candidate { Formula = formulas[random.Next(formulas.Length)], EnergyEv = Extreme(), Basis = bases[random.Next(4)] });
            try
            {
                AssessCandidatesResponse answer = await C.Stability.AssessCandidatesAsync(candidates, C.Call());
                Assert.True(Math.Abs(answer.Results.Single().FormationEnergyEvPerAtom) <= 100);
            }
            catch (RpcException e)
            {
                Assert.Contains(e.StatusCode, clear);
                Assert.True(e.Status.Detail.Length < 2000, e.Status.Detail);
            }

            List<AnalyzeDatasetResponse> pages = await AnalyzeAsync(new AnalyzeDatasetRequest { Dataset = "fuzz" });
            Assert.All(pages.SelectMany(p => p.Results), r => Assert.True(Math.Abs(r.FormationEnergyEvPerAtom) <= 100, r.EntryId));
        }
    }
}
