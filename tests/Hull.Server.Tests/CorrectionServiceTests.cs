using Grpc.Core;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using Hull.Protos.V1;
using Hull.Server.Corrections;
using Hull.Server.Tests.Support;
using CoreBasis = Hull.Core.Thermo.EnergyBasis;
using CoreComposition = Hull.Core.Chemistry.Composition;
using WireBasis = Hull.Protos.V1.EnergyBasis;

namespace Hull.Server.Tests;

/// <summary>
/// Energy corrections over gRPC: sets kept by name and version, a corrected version derived through one import session
/// and answered like Core's corrections and hull in-process, every answer naming its set, raw answers unchanged, and
/// bad sets refused with nothing written.
/// </summary>
public sealed class CorrectionServiceTests : IAsyncLifetime
{
    // 1 eV per particle = 96.4853 kJ/mol (CODATA 2018 e N_A / 1000).
    private const double KilojoulesPerMolPerEv = 96.4853;
    private const double FittedCu = -4.0, FittedO = -4.9;

    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync() => _server = await RunningServer.StartAsync();

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private static Entry Total(string id, string formula, double ev, WireBasis basis = WireBasis.TotalPerFormulaUnit, string method = "") =>
        new() { Id = id, Formula = formula, EnergyEv = ev, Basis = basis, Method = method };

    // NBS Tables of Chemical Thermodynamic Properties (1982), ΔfH°(298.15 K): Cu2O(s) −168.6 kJ/mol, CuO(s) −157.3 kJ/mol
    // (from memory; the Core check's values). Total energies on a fitted scale that the computed elements miss (Cu by
    // −0.2 eV/atom, O2 by −0.3 eV/atom): raw, Cu2O lies above Cu–CuO; the fitted references restore the handbook's
    // formation energies, where Cu2O is stable.
    private static Entry[] CopperOxides() =>
    [
        Total("Cu", "Cu", FittedCu - 0.2, WireBasis.TotalPerAtom),
        Total("O2", "O2", 2 * (FittedO - 0.3)),
        Total("Cu2O", "Cu2O", -168.6 / KilojoulesPerMolPerEv + 2 * FittedCu + FittedO),
        Total("CuO", "CuO", -157.3 / KilojoulesPerMolPerEv + FittedCu + FittedO),
    ];

    private const string CopperFit = """
        {"set_schema": 1, "name": "nbs-copper", "version": 1, "base_method": "gga",
         "fitted_references": [{"element": "Cu", "energy_ev_per_atom": -4.0}, {"element": "O", "energy_ev_per_atom": -4.9}]}
        """;

    private async Task<GetStablePhasesResponse> StableAsync(string dataset, long version, string system) =>
        await C.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = dataset, Version = version, ChemicalSystem = system }, C.Call());

    private async Task<GetEntryStabilityResponse> EntriesAsync(string dataset, long version, params string[] ids) =>
        await C.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = dataset, Version = version, EntryIds = { ids } }, C.Call());

    private static PhaseEntry ToCore(Entry e) => new(e.Id, CoreComposition.Parse(e.Formula), e.EnergyEv,
        e.Basis == WireBasis.TotalPerAtom ? CoreBasis.TotalPerAtom : e.Basis == WireBasis.TotalPerFormulaUnit ? CoreBasis.TotalPerFormulaUnit : CoreBasis.FormationPerAtom);

    [Fact]
    public async Task A_derived_version_names_its_set_and_answers_as_the_corrections_and_hull_in_process()
    {
        Entry[] raw = CopperOxides();
        await Data.CreateWithAsync(C, "cu", raw);
        CorrectionSetInfo put = await C.Corrections.PutCorrectionSetAsync(new PutCorrectionSetRequest { SetJson = CopperFit }, C.Call());
        Assert.Equal(("nbs-copper", 1L, 2), (put.Name, put.Version, put.FittedReferenceCount));

        DeriveCorrectedVersionResponse derived = await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "cu", Stored = new CorrectionSetName { Name = "nbs-copper", Version = 1 },
        }, C.Call());
        Assert.Equal(2, derived.Derived.Version);
        Assert.Equal(("nbs-copper", 1L, 1L), (derived.Derived.Corrections.SetName, derived.Derived.Corrections.SetVersion, derived.Derived.Corrections.SourceVersion));
        Assert.Equal(2, derived.ChangedCount);
        Assert.Equal(["Cu", "O2"], derived.Shifts.Select(s => s.EntryId));
        Assert.Equal(0.2, derived.Shifts[0].ReferenceShiftEvPerAtom, 12);

        // The raw version still answers raw and names no set; the derived one regains Cu2O.
        GetStablePhasesResponse before = await StableAsync("cu", 1, "Cu-O"), after = await StableAsync("cu", 2, "Cu-O");
        Assert.Null(before.Used.Corrections);
        Assert.Equal(["Cu", "CuO", "O2"], before.Phases.Select(p => p.PhaseId));
        Assert.Equal("nbs-copper", after.Used.Corrections.SetName);
        Assert.Equal(["Cu", "Cu2O", "CuO", "O2"], after.Phases.Select(p => p.PhaseId));
        Assert.Equal(-168.6 / KilojoulesPerMolPerEv / 3, after.Phases.Single(p => p.PhaseId == "Cu2O").FormationEnergyEvPerAtom, 12);

        // In process: Core's corrections on the raw entries, hulled on the corrected axis.
        PhaseEntry[] entries = raw.Select(ToCore).ToArray();
        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, new string?[entries.Length], CorrectionSetDocument.Parse(CopperFit));
        SystemHull expected = SystemHull.OnAxis(outcome.Axis, outcome.OnAxis());
        GetEntryStabilityResponse served = await EntriesAsync("cu", 2, "Cu", "O2", "Cu2O", "CuO");
        Assert.Equal(2, served.Used.Version);
        Assert.Equal("nbs-copper", served.Used.Corrections.SetName);
        foreach (Protos.V1.EntryStability s in served.Results)
        {
            Core.Thermo.EntryStability e = expected.GetEntry(s.EntryId);
            Assert.Equal(e.AxisEnergyEvPerAtom, s.FormationEnergyEvPerAtom, 12);
            Assert.Equal(e.EnergyAboveHullEvPerAtom, s.EnergyAboveHullEvPerAtom, 12);
            Assert.Equal(e.IsHullVertex, s.IsHullVertex);
        }

        // The new version holds the corrected energies, and the record survives a fresh server's first question.
        Entry[] exported = await ExportAsync("cu", 2);
        Assert.Equal(FittedCu, exported.Single(e => e.Id == "Cu").EnergyEv, 12);
        Assert.Equal(raw.Single(e => e.Id == "CuO").EnergyEv, exported.Single(e => e.Id == "CuO").EnergyEv);
    }

    [Fact]
    public async Task A_version_derived_from_an_older_version_holds_the_set_applied_to_that_version_not_to_the_latest()
    {
        Entry[] raw = CopperOxides();
        await Data.CreateWithAsync(C, "older", raw);
        // Version 2 moves CuO and adds an entry: neither may reach a version derived from version 1.
        Entry movedCuO = Total("CuO", "CuO", raw[3].EnergyEv - 0.4), added = Total("Cu4O3", "Cu4O3", 4 * FittedCu + 3 * FittedO - 5.0);
        await C.Datasets.ImportEntriesAsync(Data.Batch("older", DuplicatePolicy.Replace, movedCuO, added), C.Call());

        DeriveCorrectedVersionResponse derived = await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "older", SourceVersion = 1, InlineSetJson = CopperFit, Note = "from the first import",
        }, C.Call());

        Assert.Equal((3L, 1L), (derived.Derived.Version, derived.Derived.Corrections.SourceVersion));
        Assert.Equal(4, derived.EntryCount);
        // Core's corrections of version 1's entries, in process, are exactly what version 3 holds.
        PhaseEntry[] entries = raw.Select(ToCore).ToArray();
        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, new string?[entries.Length], CorrectionSetDocument.Parse(CopperFit));
        Entry[] exported = await ExportAsync("older", 3);
        Assert.Equal(raw.Select(e => e.Id).Order(StringComparer.Ordinal), exported.Select(e => e.Id).Order(StringComparer.Ordinal));
        foreach (Entry e in exported)
        {
            Assert.Equal(outcome.CorrectedEntries.Single(c => c.Id == e.Id).EnergyEv, e.EnergyEv);
        }

        // The same as deriving from a dataset holding version 1's entries alone; not what correcting the latest gives.
        await Data.CreateWithAsync(C, "first-only", raw);
        DeriveCorrectedVersionResponse alone = await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "first-only", Stored = new CorrectionSetName { Name = "nbs-copper", Version = 1 },
        }, C.Call());
        Assert.Equal(alone.Derived.ContentSha256, derived.Derived.ContentSha256);
        DeriveCorrectedVersionResponse latest = await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "older", SourceVersion = 2, Stored = new CorrectionSetName { Name = "nbs-copper", Version = 1 },
        }, C.Call());
        Assert.NotEqual(latest.Derived.ContentSha256, derived.Derived.ContentSha256);
        Assert.Equal(5, latest.EntryCount);

        // Its record is the one-step recipe that makes it: run again on version 1, the same content.
        CurationRecord record = await C.Curation.GetCurationRecordAsync(new GetCurationRecordRequest { Dataset = "older", Version = 3 }, C.Call());
        Assert.Equal((1L, "apply_correction_set", 2), (record.SourceVersion, record.Steps.Single().Kind, record.Steps.Single().ChangedCount));
        CurateVersionResponse again = await C.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "older", SourceVersion = 1, RecipeJson = record.RecipeJson }, C.Call());
        Assert.Equal(derived.Derived.ContentSha256, again.ContentSha256);
        var described = await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "older" }, C.Call());
        Assert.Equal("older@1 corrected with nbs-copper v1", described.Versions[2].SourceLabel);
        Assert.Equal("from the first import", described.Versions[2].Note);
        Assert.Equal(derived.Derived.Corrections, described.Versions[2].Corrections);
    }

    [Fact]
    public async Task Every_answer_on_a_corrected_version_names_its_set_and_none_on_the_raw_one()
    {
        await Data.CreateWithAsync(C, "named", CopperOxides());
        await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest { Dataset = "named", InlineSetJson = CopperFit }, C.Call());

        async Task<VersionUsed[]> AnswersAsync(long version)
        {
            var analyzed = C.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = "named", Version = version }, C.Call());
            var streamed = new List<VersionUsed>();
            await foreach (AnalyzeDatasetResponse page in analyzed.ResponseStream.ReadAllAsync()) streamed.Add(page.Used);
            return
            [
                (await EntriesAsync("named", version, "Cu2O")).Used,
                (await StableAsync("named", version, "Cu-O")).Used,
                (await C.Stability.AssessCandidatesAsync(new AssessCandidatesRequest
                {
                    Dataset = "named", Version = version,
                    Candidates = { new Candidate { Label = "c", Formula = "Cu3O2", EnergyEv = -0.5, Basis = WireBasis.FormationPerAtom } },
                }, C.Call())).Used,
                (await C.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "named", Version = version, Formulas = { "Cu3O2" } }, C.Call())).Used,
                (await C.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = "named", Version = version, ChemicalSystem = "Cu-O" }, C.Call())).Used,
                (await C.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "named", Version = version, ChemicalSystem = "Cu-O" }, C.Call())).Used,
                (await C.Uncertainty.SampleStabilityAsync(new SampleStabilityRequest
                {
                    Dataset = "named", Version = version, ChemicalSystem = "Cu-O", Samples = 20, Seed = 7,
                }, C.Call())).Used,
                .. streamed,
            ];
        }

        VersionUsed[] corrected = await AnswersAsync(2), raw = await AnswersAsync(1);
        Assert.All(corrected, u => Assert.Equal(("nbs-copper", 1L, 1L, 2L), (u.Corrections?.SetName, u.Corrections?.SetVersion, u.Corrections?.SourceVersion, u.Version)));
        Assert.All(raw, u => Assert.Null(u.Corrections));

        // A figure travels without its answer: its footer and metadata name the set themselves.
        string Figure(long version) => C.Figures.DrawPhaseDiagram(new DrawPhaseDiagramRequest { Dataset = "named", Version = version, ChemicalSystem = "Cu-O" }, C.Call()).Svg;
        Assert.Contains("version 2, content sha256 ", Figure(2));
        Assert.Contains(", corrected with nbs-copper v1 from version 1", Figure(2));
        Assert.Contains("corrections=\"nbs-copper v1 from version 1\"", Figure(2));
        Assert.DoesNotContain("corrected with", Figure(1));
        // Every figure kind writes its source through the same metadata attributes: a window figure, as one of them.
        string Window(long version) => C.Windows.DrawWindowFigure(new DrawWindowFigureRequest
        {
            Dataset = "named", Version = version, Compound = new CompoundRef { EntryId = "Cu2O" },
        }, C.Call()).Svg;
        Assert.Contains("corrections=\"nbs-copper v1 from version 1\"", Window(2));
        Assert.DoesNotContain("corrections=", Window(1));
    }

    // Two methods in Li–Co, worked by hand in the Core check (eV): aligning "hybrid" on LiCo shifts it by
    // −4.80 − (−5.50) = +0.70 eV/atom, so LiCo3-hybrid's formation energy becomes −0.10 eV/atom, 0.05 eV/atom above the
    // LiCo–Co tie-line at −0.15; raw, it would be the binary's lowest point at −0.80.
    [Fact]
    public async Task Two_methods_aligned_on_a_reference_compound_as_worked_by_hand()
    {
        await Data.CreateWithAsync(C, "lico",
            Total("Li", "Li", -1.90, WireBasis.TotalPerAtom, "gga"), Total("Co", "Co", -7.10, WireBasis.TotalPerAtom, "gga"),
            Total("LiCo-gga", "LiCo", -4.80, WireBasis.TotalPerAtom, "gga"), Total("LiCo-hybrid", "LiCo", -5.50, WireBasis.TotalPerAtom, "hybrid"),
            Total("LiCo3-hybrid", "LiCo3", -26.40, WireBasis.TotalPerFormulaUnit, "hybrid"));
        Assert.Equal(-0.80, (await EntriesAsync("lico", 1, "LiCo3-hybrid")).Results[0].FormationEnergyEvPerAtom, 12);

        DeriveCorrectedVersionResponse derived = await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "lico",
            InlineSetJson = """{"set_schema": 1, "name": "mix", "version": 3, "base_method": "gga", "method_rules": [{"method": "hybrid", "align_on": "LiCo"}]}""",
        }, C.Call());
        Assert.Equal("hybrid", derived.Shifts.Single(s => s.EntryId == "LiCo3-hybrid").Method);
        Assert.Equal(0.70, derived.Shifts.Single(s => s.EntryId == "LiCo3-hybrid").MethodShiftEvPerAtom, 12);
        Protos.V1.EntryStability licO3 = (await EntriesAsync("lico", 0, "LiCo3-hybrid")).Results[0];
        Assert.Equal(-0.10, licO3.FormationEnergyEvPerAtom, 12);
        Assert.Equal(0.05, licO3.EnergyAboveHullEvPerAtom, 12);
        // The inline set was stored with the version's record.
        Assert.Contains(("mix", 3L), (await C.Corrections.ListCorrectionSetsAsync(new ListCorrectionSetsRequest(), C.Call())).Sets.Select(s => (s.Name, s.Version)));
        // Tags travel with the entries into the new version.
        Assert.Equal("hybrid", (await ExportAsync("lico", 2)).Single(e => e.Id == "LiCo3-hybrid").Method);
    }

    [Fact]
    public async Task Corrections_off_reproduce_the_raw_answers_exactly()
    {
        await Data.CreateWithAsync(C, "off", CopperOxides());
        GetEntryStabilityResponse raw = await EntriesAsync("off", 1, "Cu", "O2", "Cu2O", "CuO");
        await C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "off", InlineSetJson = """{"set_schema": 1, "name": "nothing", "version": 1, "base_method": "gga"}""",
        }, C.Call());
        GetEntryStabilityResponse again = await EntriesAsync("off", 1, "Cu", "O2", "Cu2O", "CuO");
        GetEntryStabilityResponse empty = await EntriesAsync("off", 2, "Cu", "O2", "Cu2O", "CuO");
        Assert.Equal(raw, again);
        Assert.Equal(raw.Results, empty.Results);
        Assert.Equal(raw.Used.ContentSha256, empty.Used.ContentSha256);
        // Equal content, yet the answer names its own version and set.
        Assert.Equal((2L, "nothing"), (empty.Used.Version, empty.Used.Corrections.SetName));
    }

    [Fact]
    public async Task Bad_sets_are_refused_naming_what_and_where_and_nothing_is_stored()
    {
        await Data.CreateWithAsync(C, "bad", [.. CopperOxides(), Total("Cu4O3", "Cu4O3", -20.0, method: "hybrid")]);

        async Task<RpcException> Refused(string json, string dataset = "bad") => await Assert.ThrowsAsync<RpcException>(() =>
            C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest { Dataset = dataset, InlineSetJson = json }, C.Call()).ResponseAsync);

        RpcException absent = await Refused("""{"set_schema": 1, "name": "f", "version": 1, "base_method": "gga", "method_rules": [{"method": "hybrid", "shift_ev_per_atom": 0.1}], "species_shifts": [{"element": "F", "applies_to": "with_metal", "shift_ev_per_atom": -0.4}]}""");
        Assert.Equal(StatusCode.InvalidArgument, absent.StatusCode);
        Assert.Equal("inline_set_json", Data.Violations(absent).Single().Field);
        Assert.Contains("element F", absent.Status.Detail);

        RpcException noRule = await Refused("""{"set_schema": 1, "name": "g", "version": 1, "base_method": "gga"}""");
        Assert.Contains("Entry 'Cu4O3'", noRule.Status.Detail);
        Assert.Contains("'hybrid'", noRule.Status.Detail);

        RpcException infinite = await Refused("""{"set_schema": 1, "name": "h", "version": 1, "base_method": "gga", "method_rules": [{"method": "hybrid", "shift_ev_per_atom": 1e400}]}""");
        Assert.Contains("method_rules[0].shift_ev_per_atom", infinite.Status.Detail);
        Assert.Contains("finite", infinite.Status.Detail);

        RpcException unknown = await Refused("""{"set_schema": 1, "name": "i", "version": 1, "base_method": "gga", "method_rule": []}""");
        Assert.Contains("'method_rule'", unknown.Status.Detail);

        // Nothing stored: no version, no set.
        Assert.Single((await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "bad" }, C.Call())).Versions);
        Assert.Empty((await C.Corrections.ListCorrectionSetsAsync(new ListCorrectionSetsRequest(), C.Call())).Sets);

        // A stored set's name and version never take another document; a source version that does not exist is not found.
        await C.Corrections.PutCorrectionSetAsync(new PutCorrectionSetRequest { SetJson = CopperFit }, C.Call());
        var conflict = await Assert.ThrowsAsync<RpcException>(() => C.Corrections.PutCorrectionSetAsync(
            new PutCorrectionSetRequest { SetJson = CopperFit.Replace("-4.9", "-5.0", StringComparison.Ordinal) }, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.AlreadyExists, conflict.StatusCode);
        await C.Datasets.ImportEntriesAsync(Data.Batch("bad", DuplicatePolicy.Replace, Total("Cu4O3", "Cu4O3", -20.5)), C.Call());
        var absentSource = await Assert.ThrowsAsync<RpcException>(() => C.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "bad", SourceVersion = 9, Stored = new CorrectionSetName { Name = "nbs-copper", Version = 1 },
        }, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.NotFound, absentSource.StatusCode);
        var missing = await Assert.ThrowsAsync<RpcException>(() => C.Corrections.GetCorrectionSetAsync(
            new GetCorrectionSetRequest { Name = "nbs-copper", Version = 9 }, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.NotFound, missing.StatusCode);
        Assert.Equal(2, (await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "bad" }, C.Call())).Versions.Count);
    }

    [Fact]
    public async Task A_method_tag_with_surrounding_spaces_is_refused_naming_the_row()
    {
        await Data.CreateWithAsync(C, "tags");
        var e = await Assert.ThrowsAsync<RpcException>(() => C.Datasets.ImportEntriesAsync(
            Data.Batch("tags", DuplicatePolicy.Reject, Total("Cu", "Cu", -4.0, WireBasis.TotalPerAtom, "gga "), Total("O2", "O2", -9.8)), C.Call()).ResponseAsync);
        Assert.Equal("entries[0].method", Data.Violations(e).Single().Field);
    }

    private async Task<Entry[]> ExportAsync(string dataset, long version)
    {
        var all = new List<Entry>();
        using var call = C.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = dataset, Version = version }, C.Call());
        await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync()) all.AddRange(page.Entries);
        return [.. all];
    }
}
