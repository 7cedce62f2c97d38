using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using WireBasis = Hull.Protos.V1.EnergyBasis;

namespace Hull.Server.Tests;

/// <summary>
/// The apply_correction_set curation step over gRPC: a stored set applied inside a recipe, later steps seeing the
/// corrected energies, the derived version recording the set so that every answer on it names it, the same content
/// as DeriveCorrectedVersion on the same source, and faulty uses refused naming step and field with nothing stored.
/// </summary>
public sealed class CurationCorrectionStepTests
{
    // 1 eV per particle = 96.4853 kJ/mol (CODATA 2018 e N_A / 1000).
    private const double KilojoulesPerMolPerEv = 96.4853;
    private const double FittedCu = -4.0, FittedO = -4.9;

    // NBS Tables of Chemical Thermodynamic Properties (1982), ΔfH°(298.15 K): Cu2O(s) −168.6 kJ/mol, CuO(s) −157.3 kJ/mol
    // (from memory). Total energies on the fitted scale, the computed elements missing it by −0.2 eV/atom (Cu) and
    // −0.3 eV/atom (O2). Worked by hand: raw, Cu2O's formation energy is (ΔH + 0.7 eV)/3 = −0.3491 eV/atom and CuO's
    // (ΔH + 0.5 eV)/2 = −0.5652 eV/atom, so Cu2O sits 0.0277 eV/atom above the Cu–CuO tie-line (−0.3768 at x_O = 1/3);
    // with the fitted references they are the handbook's ΔH/3 = −0.5825 and ΔH/2 = −0.8151 eV/atom, and Cu2O lies
    // 0.039 eV/atom below that tie-line: stable. A flagged duplicate of CuO is there for drop_flagged.
    private static Entry[] CopperOxides() =>
    [
        Total("Cu", "Cu", FittedCu - 0.2, WireBasis.TotalPerAtom),
        Total("O2", "O2", 2 * (FittedO - 0.3)),
        Total("Cu2O", "Cu2O", -168.6 / KilojoulesPerMolPerEv + 2 * FittedCu + FittedO),
        Total("CuO", "CuO", -157.3 / KilojoulesPerMolPerEv + FittedCu + FittedO),
        Flagged(Total("CuO-old", "CuO", -157.3 / KilojoulesPerMolPerEv + FittedCu + FittedO + 0.3)),
    ];

    private const string CopperFit = """
        {"set_schema": 1, "name": "nbs-copper", "version": 1, "base_method": "gga",
         "fitted_references": [{"element": "Cu", "energy_ev_per_atom": -4.0}, {"element": "O", "energy_ev_per_atom": -4.9}]}
        """;

    private const string CorrectThenDrop = """
        {"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1},
          {"kind": "drop_above_hull", "max_ev_per_atom": 0.01}]}
        """;

    private static Entry Total(string id, string formula, double ev, WireBasis basis = WireBasis.TotalPerFormulaUnit) =>
        new() { Id = id, Formula = formula, EnergyEv = ev, Basis = basis };

    private static Entry Flagged(Entry entry)
    {
        entry.Note = "flagged";
        return entry;
    }

    private static async Task<Clients> StartAsync(RunningServer running)
    {
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "cu", CopperOxides());
        await c.Corrections.PutCorrectionSetAsync(new PutCorrectionSetRequest { SetJson = CopperFit }, c.Call());
        return c;
    }

    private static async Task<GetStablePhasesResponse> StableAsync(Clients c, long version) =>
        await c.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "cu", Version = version, ChemicalSystem = "Cu-O" }, c.Call());

    [Fact]
    public async Task Later_steps_see_the_corrected_energies_and_the_version_names_its_set()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = await StartAsync(running);

        CurateVersionResponse curated = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "cu", SourceVersion = 1, RecipeJson = CorrectThenDrop }, c.Call());

        // Corrected first, Cu2O is on the hull and drop_above_hull keeps it; only the flagged duplicate went.
        Assert.Equal((2L, 4L), (curated.DatasetVersion, curated.EntryCount));
        Assert.Equal(["drop_flagged", "apply_correction_set", "drop_above_hull"], curated.Record.Steps.Select(s => s.Kind));
        Assert.Equal([1, 0, 0], curated.Record.Steps.Select(s => s.RemovedCount));
        Assert.Equal([0, 2, 0], curated.Record.Steps.Select(s => s.ChangedCount));
        Assert.Equal("""{"set_name":"nbs-copper","set_version":1}""", curated.Record.Steps[1].ParametersJson);

        // Every answer on the derived version names the set; the source still answers raw.
        GetStablePhasesResponse before = await StableAsync(c, 1), after = await StableAsync(c, 2);
        Assert.Null(before.Used.Corrections);
        Assert.Equal(["Cu", "CuO", "O2"], before.Phases.Select(p => p.PhaseId));
        Assert.Equal(("nbs-copper", 1L, 1L), (after.Used.Corrections.SetName, after.Used.Corrections.SetVersion, after.Used.Corrections.SourceVersion));
        Assert.Equal(["Cu", "Cu2O", "CuO", "O2"], after.Phases.Select(p => p.PhaseId));
        Assert.Equal(-168.6 / KilojoulesPerMolPerEv / 3, after.Phases.Single(p => p.PhaseId == "Cu2O").FormationEnergyEvPerAtom, 12);
        Assert.Equal(-157.3 / KilojoulesPerMolPerEv / 2, after.Phases.Single(p => p.PhaseId == "CuO").FormationEnergyEvPerAtom, 12);
        Assert.Equal(new Store.VersionCorrections("nbs-copper", 1, 1), running.Server.Store.GetVersionCorrections("cu", 2));
        var named = new CorrectionsUsed { SetName = "nbs-copper", SetVersion = 1, SourceVersion = 1 };
        Assert.Equal(named, curated.Corrections);

        // The other order: drop_above_hull on the raw energies takes Cu2O (0.0277 eV/atom above) before the correction.
        string dropThenCorrect = """
            {"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "drop_above_hull", "max_ev_per_atom": 0.01},
              {"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1}]}
            """;
        CurateVersionResponse other = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "cu", SourceVersion = 1, RecipeJson = dropThenCorrect }, c.Call());
        Assert.Equal([1, 1, 0], other.Record.Steps.Select(s => s.RemovedCount));
        Assert.Equal(["Cu", "CuO", "O2"], (await StableAsync(c, 3)).Phases.Select(p => p.PhaseId));

        // The recorded recipe runs again to the same content.
        CurateVersionResponse again = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "cu", SourceVersion = 1, RecipeJson = curated.Record.RecipeJson }, c.Call());
        Assert.Equal(curated.ContentSha256, again.ContentSha256);

        // The version lists say which versions hold corrected energies; a recipe without the step carries none.
        CurateVersionResponse plain = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "cu", SourceVersion = 1, RecipeJson = """{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}]}""" }, c.Call());
        Assert.Null(plain.Corrections);
        var described = await c.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "cu" }, c.Call());
        Assert.Equal([null, named, named, named, null], described.Versions.Select(v => v.Corrections));
        var listed = await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "cu", PageSize = 2 }, c.Call());
        Assert.Equal([null, named], listed.Versions.Select(v => v.Corrections));
    }

    [Fact]
    public async Task A_recipe_of_the_set_alone_gives_the_content_of_a_derived_corrected_version()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = await StartAsync(running);
        string only = """{"recipe_schema": 1, "steps": [{"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1}]}""";

        DeriveCorrectedVersionResponse derived = await c.Corrections.DeriveCorrectedVersionAsync(new DeriveCorrectedVersionRequest
        {
            Dataset = "cu", Stored = new CorrectionSetName { Name = "nbs-copper", Version = 1 },
        }, c.Call());
        CurateVersionResponse curated = await c.Curation.CurateVersionAsync(new CurateVersionRequest { Dataset = "cu", SourceVersion = 1, RecipeJson = only }, c.Call());

        // Both are the set applied to version 1's entries: one content, one record of the set.
        Assert.Equal((2L, 3L), (derived.Derived.Version, curated.DatasetVersion));
        Assert.Equal(derived.ChangedCount, curated.Record.Steps.Single().ChangedCount);
        Assert.Equal(derived.Derived.ContentSha256, curated.ContentSha256);
        Assert.Equal(running.Server.Store.GetVersionCorrections("cu", 2), running.Server.Store.GetVersionCorrections("cu", 3));
    }

    [Theory]
    [InlineData("""{"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1}, {"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1}""",
        "recipe_json.steps[1].kind", "at most one correction set")]
    [InlineData("""{"kind": "apply_correction_set", "set_name": "absent", "set_version": 1}""", "recipe_json.steps[0].set_name", "no correction set 'absent v1' is stored")]
    [InlineData("""{"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1.5}""", "recipe_json.steps[0].set_version", "whole number")]
    [InlineData("""{"kind": "apply_correction_set", "set_name": "nbs-copper"}""", "recipe_json.steps[0].set_version", "is required")]
    [InlineData("""{"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1, "version": 1}""", "recipe_json.steps[0].version", "is not a parameter")]
    [InlineData("""{"kind": "keep_elements", "elements": ["O"]}, {"kind": "apply_correction_set", "set_name": "nbs-copper", "set_version": 1}""",
        "recipe_json.steps[1].set_name", "element Cu")]
    public async Task Faulty_uses_are_refused_naming_step_and_field_and_store_nothing(string steps, string field, string said)
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = await StartAsync(running);

        var refused = await Assert.ThrowsAsync<RpcException>(async () => await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "cu", RecipeJson = $$"""{"recipe_schema": 1, "steps": [{{steps}}]}""" }, c.Call()));

        Assert.Equal(StatusCode.InvalidArgument, refused.StatusCode);
        Assert.Contains(said, refused.Status.Detail);
        Assert.Equal(field, Data.Violations(refused).Single().Field);
        var versions = (await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "cu" }, c.Call())).Versions;
        Assert.Equal([1L], versions.Select(v => v.Version));
        Assert.Equal(0, running.Server.Store.CountStagedRows());
    }
}
