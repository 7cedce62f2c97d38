using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Curated versions over gRPC: a recipe run on a stored version writes the next version with its record, shown in
/// describe; the recorded recipe runs again to the same content fingerprint and runs on another dataset; total
/// energies above the hull are measured from the source version's references; bad recipes and missing versions are
/// refused naming step and field, with the version list unchanged.
/// </summary>
public sealed class CurationServiceTests
{
    // A Li-O binary in total energies per formula unit. Hand-worked (common practice: formation energy per atom
    // E/atom - sum x_el mu_el, the lowest pure-element total per atom as mu_el, and the lower hull over x = O fraction):
    // mu_Li = -1.9 (li-a), mu_O = -4.9 (o2); Li2O at -5.0 eV/atom lies at -5.0 + (2/3)1.9 + (1/3)4.9 = -2.1;
    // Li2O2 at -4.675 eV/atom lies at -4.675 + 0.95 + 2.45 = -1.275, against the Li2O-O tie-line's
    // -2.1 * (1/2) / (2/3) = -1.575 at x = 1/2: 0.3 eV/atom above the hull.
    private static Entry[] Raw() =>
    [
        Flag(Data.Total("li-a", "Li", -1.9), "flagged"),
        Data.Total("o2", "O2", -9.8),
        Data.Total("li2o", "Li2O", -15.0),
        Data.Total("li2o2", "Li2O2", -18.7),
        Flag(Data.Total("li2o-x", "Li2O", -14.0), "source=lab-x"),
    ];

    private const string Recipe = """
        {"recipe_schema": 1, "steps": [
          {"kind": "drop_flagged"}, {"kind": "drop_source", "source": "lab-x"}, {"kind": "drop_above_hull", "max_ev_per_atom": 0.1}]}
        """;

    private static Entry Flag(Entry entry, string metadata)
    {
        entry.Note = metadata;
        return entry;
    }

    [Fact]
    public async Task A_recipe_writes_the_next_version_with_its_record_and_its_recipe_reproduces_it()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "raw", Raw());
        // The source version's own hull puts Li2O2 0.3 eV/atom above (the hand-worked value above).
        var stability = await c.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "raw", EntryIds = { "li2o2" } }, c.Call());
        Assert.Equal(0.3, stability.Results.Single().EnergyAboveHullEvPerAtom, 12);

        CurateVersionResponse curated = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "raw", SourceVersion = 1, RecipeJson = Recipe, Note = "clean" }, c.Call());

        // drop_flagged takes li-a, the only pure-Li entry; drop_above_hull still measures from the source's mu_Li, so
        // Li2O2 (0.3 above) goes and Li2O (on the hull) stays. Measured from what was left, Li would have no reference
        // and nothing of Li could be placed or dropped.
        Assert.Equal((2L, 2L), (curated.DatasetVersion, curated.EntryCount));
        var export = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = "raw", Version = 2 }, c.Call());
        var ids = new List<string>();
        await foreach (ExportEntriesResponse page in export.ResponseStream.ReadAllAsync()) ids.AddRange(page.Entries.Select(e => e.Id));
        Assert.Equal(["li2o", "o2"], ids);
        CurationRecord record = curated.Record;
        Assert.Equal(("raw", 1L), (record.SourceDataset, record.SourceVersion));
        Assert.Equal(running.Server.Store.GetFingerprint("raw", 1), record.SourceSha256);
        Assert.Equal(["drop_flagged", "drop_source", "drop_above_hull"], record.Steps.Select(s => s.Kind));
        Assert.Equal([5, 4, 3], record.Steps.Select(s => s.EntriesBefore));
        Assert.Equal([1, 1, 1], record.Steps.Select(s => s.RemovedCount));
        Assert.Equal("""{"flag":"flagged"}""", record.Steps[0].ParametersJson);
        Assert.Equal("""{"max_ev_per_atom":0.1}""", record.Steps[2].ParametersJson);

        // Describe shows it beside the version; the plain import has none.
        var described = await c.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "raw" }, c.Call());
        Assert.Null(described.Versions[0].Curation);
        Assert.Equal(record, described.Versions[1].Curation);
        Assert.Equal("curated from raw@1", described.Versions[1].SourceLabel);
        Assert.Equal("clean", described.Versions[1].Note);

        // The recipe read back from the record runs again on version 1 to the same content.
        CurationRecord stored = await c.Curation.GetCurationRecordAsync(new GetCurationRecordRequest { Dataset = "raw", Version = 2 }, c.Call());
        Assert.Equal(record, stored);
        CurateVersionResponse again = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "raw", SourceVersion = 1, RecipeJson = stored.RecipeJson }, c.Call());
        Assert.Equal(3, again.DatasetVersion);
        Assert.Equal(curated.ContentSha256, again.ContentSha256);
        Assert.Equal(running.Server.Store.GetFingerprint("raw", 2), again.ContentSha256);
        Assert.NotEqual(record.SourceSha256, again.ContentSha256);

        // And on another dataset: the same steps, counted on its own rows.
        await Data.CreateWithAsync(c, "other", Data.Formation("li", "Li", 0), Data.Formation("o", "O", 0),
            Data.Formation("li2o", "Li2O", -2.0), Flag(Data.Formation("lio", "LiO", -1.0), "flagged"));
        CurateVersionResponse elsewhere = await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "other", RecipeJson = stored.RecipeJson }, c.Call());
        Assert.Equal((2L, 3L), (elsewhere.DatasetVersion, elsewhere.EntryCount));
        Assert.Equal(("other", 1L), (elsewhere.Record.SourceDataset, elsewhere.Record.SourceVersion));
        Assert.Equal([1, 0, 0], elsewhere.Record.Steps.Select(s => s.RemovedCount));
    }

    [Theory]
    [InlineData("""{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "drop_above_hull", "max_ev_per_atm": 0.1}]}""",
        "recipe_json.steps[1].max_ev_per_atm", "recipe step 2, field 'max_ev_per_atm'")]
    [InlineData("""{"recipe_schema": 1, "steps": [{"kind": "drop_sauce", "source": "a"}]}""", "recipe_json.steps[0].kind", "recipe step 1, field 'kind'")]
    [InlineData("""{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "keep_elements", "elements": ["Li", "Xx"]}]}""",
        "recipe_json.steps[1].elements[1]", "'Xx' is not an element symbol")]
    [InlineData("""{"recipe_schema": 2, "steps": [{"kind": "drop_flagged"}]}""", "recipe_json.recipe_schema", "recipe field 'recipe_schema'")]
    [InlineData("""{"recipe_schema": 1, "steps": [{"kind": "keep_elements", "elements": ["Fe"]}]}""", null, "leaves no entries")]
    public async Task A_faulty_recipe_is_refused_naming_step_and_field_and_stores_nothing(string recipe, string? field, string said)
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "raw", Raw());

        var refused = await Assert.ThrowsAsync<RpcException>(async () => await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "raw", SourceVersion = 1, RecipeJson = recipe }, c.Call()));

        Assert.Equal(field is null ? StatusCode.FailedPrecondition : StatusCode.InvalidArgument, refused.StatusCode);
        Assert.Contains(said, refused.Status.Detail);
        if (field is not null) Assert.Equal(field, Data.Violations(refused).Single().Field);
        await AssertUnchangedAsync(c, running);
    }

    [Fact]
    public async Task A_missing_source_version_or_dataset_is_not_found_and_stores_nothing()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "raw", Raw());

        var noVersion = await Assert.ThrowsAsync<RpcException>(async () => await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "raw", SourceVersion = 9, RecipeJson = Recipe }, c.Call()));
        Assert.Equal(StatusCode.NotFound, noVersion.StatusCode);
        Assert.Equal("source_version", Data.Violations(noVersion).Single().Field);
        Assert.Contains("version 9", noVersion.Status.Detail);
        await AssertUnchangedAsync(c, running);

        var noDataset = await Assert.ThrowsAsync<RpcException>(async () => await c.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = "nope", RecipeJson = Recipe }, c.Call()));
        Assert.Equal(StatusCode.NotFound, noDataset.StatusCode);

        var noRecord = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Curation.GetCurationRecordAsync(new GetCurationRecordRequest { Dataset = "raw", Version = 1 }, c.Call()));
        Assert.Equal(StatusCode.NotFound, noRecord.StatusCode);
        Assert.Contains("not made by a recipe", noRecord.Status.Detail);
        await AssertUnchangedAsync(c, running);
    }

    /// <summary>Still the one imported version, no record, and nothing left staged.</summary>
    private static async Task AssertUnchangedAsync(Clients c, RunningServer running)
    {
        var versions = (await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "raw" }, c.Call())).Versions;
        Assert.Equal([1L], versions.Select(v => v.Version));
        Assert.Empty(running.Server.Store.ListCurationRecords("raw"));
        Assert.Equal(0, running.Server.Store.CountStagedRows());
    }
}
