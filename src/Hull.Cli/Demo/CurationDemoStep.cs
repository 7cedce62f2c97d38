using Grpc.Core;
using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's curation step: a raw Li-Co-O collection (data-demo/curation) cleaned by a recipe file into a new
/// version with its record; the recorded recipe saved, run again to the same content fingerprint; a recipe that
/// applies the stored correction set of step 7i before dropping what lies above the corrected hull; a misspelt recipe
/// field refused with nothing written.
/// </summary>
internal static class CurationDemoStep
{
    public const string Dataset = "li-co-o-raw";

    private const string Title = "13. Curated versions: a raw Li-Co-O collection cleaned by a recipe of named steps (data-demo/curation)";

    // A recipe may apply a correction set: later steps see the corrected energies, and the version names the set.
    private static async Task CorrectThenCleanAsync(HullConnection hull, TextWriter output, string recipeFile, CancellationToken t)
    {
        string dataset = CorrectionDemoStep.Dataset;
        CurateVersionResponse curated = await hull.Curation.CurateVersionAsync(new CurateVersionRequest
        {
            Dataset = dataset, SourceVersion = 1, RecipeJson = await File.ReadAllTextAsync(recipeFile, t), Note = Path.GetFileName(recipeFile),
        }, hull.Call(t));
        output.WriteLine($"  {Path.GetFileName(recipeFile)} on {dataset}@1 (step 7i's mixture): version {curated.DatasetVersion} holds "
                         + $"{curated.EntryCount} entries, corrected with {VersionText.CorrectedWith(curated.Corrections)}.");
        foreach (string line in CurationText.Lines(curated.Record)) output.WriteLine("  " + line);

        // The steps the other way round: drop_above_hull judges the raw mixture, where the gga+u entries sit on another
        // scale, and takes away the entry the set aligns them on; the recipe is refused and nothing is written.
        const string reversed = """
            {"recipe_schema": 1, "steps": [{"kind": "drop_above_hull", "max_ev_per_atom": 0.05},
              {"kind": "apply_correction_set", "set_name": "demo-mix", "set_version": 1}]}
            """;
        try
        {
            await hull.Curation.CurateVersionAsync(new CurateVersionRequest { Dataset = dataset, SourceVersion = 1, RecipeJson = reversed }, hull.Call(t));
            output.WriteLine("  The same steps reversed were NOT refused");
        }
        catch (RpcException e)
        {
            output.WriteLine($"  The same steps reversed are refused: {e.StatusCode}, {e.Status.Detail}");
        }

        var described = await hull.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = dataset }, hull.Call(t));
        TableRenderer.WriteAligned(output, CommandTree.VersionsTable(described.Versions), "  ");
        var stable = await hull.Stability.GetStablePhasesAsync(
            new GetStablePhasesRequest { Dataset = dataset, Version = curated.DatasetVersion, ChemicalSystem = "Li-Co-O" }, hull.Call(t));
        output.WriteLine($"  Stable phases of version {stable.Used.Version} (correction set {stable.Used.Corrections.SetName} v{stable.Used.Corrections.SetVersion}): "
                         + string.Join(", ", stable.Phases.Select(p => p.PhaseId)));
    }

    public static async Task RunAsync(HullConnection hull, TextWriter output, TextWriter error, string data, string figuresFolder, CancellationToken t)
    {
        string folder = Path.Combine(data, "curation");
        output.WriteLine($"\n{Title}\n{new string('=', Title.Length)}");
        string raw = Path.Combine(folder, "raw-li-co-o.csv");
        string recipe = await File.ReadAllTextAsync(Path.Combine(folder, "clean.recipe.json"), t);
        await hull.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = Dataset, Description = "Li-Co-O from two groups and a legacy set (invented)" }, hull.Call(t));
        await new ImportRunner(hull, error, showProgress: false).ImportAsync(Dataset, raw, EntryFileReader.Read(raw), DuplicatePolicy.Reject, ImportRunner.DefaultBatchSize, "raw", t);

        CurateVersionResponse curated = await hull.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = Dataset, SourceVersion = 1, RecipeJson = recipe, Note = "clean.recipe.json" }, hull.Call(t));
        output.WriteLine($"  Version {curated.DatasetVersion} holds {curated.EntryCount} entries (content sha256 {curated.ContentSha256[..16]}...).");
        foreach (string line in CurationText.Lines(curated.Record)) output.WriteLine("  " + line);

        // The record's recipe, saved as a file and run again on the same source, makes the same content.
        CurationRecord record = await hull.Curation.GetCurationRecordAsync(new GetCurationRecordRequest { Dataset = Dataset, Version = curated.DatasetVersion }, hull.Call(t));
        Directory.CreateDirectory(figuresFolder);
        string saved = Path.Combine(figuresFolder, "curation-recipe.json");
        await File.WriteAllTextAsync(saved, record.RecipeJson + "\n", t);
        CurateVersionResponse again = await hull.Curation.CurateVersionAsync(
            new CurateVersionRequest { Dataset = Dataset, SourceVersion = 1, RecipeJson = await File.ReadAllTextAsync(saved, t) }, hull.Call(t));
        output.WriteLine($"  Recipe saved to {Path.GetFullPath(saved)}; run again on version 1 it makes version {again.DatasetVersion} "
                         + $"with the same content fingerprint: {(again.ContentSha256 == curated.ContentSha256 ? "yes" : "NO")}");

        await CorrectThenCleanAsync(hull, output, Path.Combine(folder, "correct-then-clean.recipe.json"), t);

        const string misspelt = """{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "drop_above_hull", "max_ev_per_atm": 0.1}]}""";
        try
        {
            await hull.Curation.CurateVersionAsync(new CurateVersionRequest { Dataset = Dataset, SourceVersion = 1, RecipeJson = misspelt }, hull.Call(t));
            output.WriteLine("  A misspelt recipe field was NOT refused");
        }
        catch (RpcException e)
        {
            int versions = (await hull.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = Dataset }, hull.Call(t))).Versions.Count;
            output.WriteLine($"  A misspelt field is refused: {e.StatusCode}, {e.Status.Detail} ({versions} versions, as before)");
        }
    }
}
