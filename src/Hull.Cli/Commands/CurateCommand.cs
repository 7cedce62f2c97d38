using System.CommandLine;
using System.Text;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull curate`: runs a recipe file on a version (CurateVersion) and prints the new version's per-step counts; with
/// `--save-recipe` writes the recipe of the version made (or, without a recipe file, of `--version`) to a file, the
/// same JSON the command reads (GetCurationRecord).
/// </summary>
public static class CurateCommand
{
    public static Command Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var recipe = new Argument<string?>("recipe")
        {
            Description = "recipe file (JSON: {\"recipe_schema\": 1, \"steps\": [{\"kind\": \"drop_flagged\"}, ...]}); omit to only save a version's recipe",
            Arity = ArgumentArity.ZeroOrOne,
        };
        var version = ValueOptions.WholeNumber("--version", "the version to run the recipe on, or whose recipe --save-recipe writes (default: the latest)",
            min: 0, max: long.MaxValue, fallback: 0, meaning: "a dataset version");
        var note = new Option<string>("--note") { Description = "note recorded with the new version" };
        var save = new Option<string?>("--save-recipe") { Description = "write the recipe of the version to this file (it runs again with `hull curate`)" };
        var command = new Command("curate", "derive a new dataset version by a recipe of named steps, recorded with the version; or save a version's recipe")
        {
            dataset, recipe, version, note, save,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            string name = c.Get(dataset)!;
            string? recipePath = c.Get(recipe);
            string? savePath = c.Get(save);
            if (recipePath is null)
            {
                if (savePath is null) throw new UsageException("give a recipe file to run, or --save-recipe FILE to save a version's recipe");
                CurationRecord stored = await RecordAsync(c, name, c.Get(version), t);
                await SaveAsync(c, savePath, stored, t);
                c.Emit(stored, () => CurationText.StepsTable(stored), string.Join('\n', CurationText.Lines(stored).Take(1)));
                return ExitCodes.Ok;
            }

            string text = await File.ReadAllTextAsync(recipePath, t);
            CurateVersionResponse response = await c.Server.Curation.CurateVersionAsync(new CurateVersionRequest
            {
                Dataset = name, SourceVersion = c.Get(version), RecipeJson = text, Note = c.Get(note) ?? string.Empty,
            }, c.Server.Call(t));
            if (savePath is not null) await SaveAsync(c, savePath, response.Record, t);
            string caption = $"dataset {name}: version {response.DatasetVersion} holds {response.EntryCount} entries (content sha256 {response.ContentSha256})\n"
                             + CurationText.Lines(response.Record).First()
                             + (response.Corrections is { } k ? $"\ncorrected with {VersionText.CorrectedWith(k)}: every answer on it names the set" : string.Empty);
            c.Emit(response, () => CurationText.StepsTable(response.Record), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    /// <summary>The record of a version; 0 asks for the latest, found by describing the dataset.</summary>
    internal static async Task<CurationRecord> RecordAsync(CliContext c, string dataset, long version, CancellationToken t)
    {
        if (version == 0)
        {
            version = (await c.Server.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = dataset }, c.Server.Call(t))).Dataset.LatestVersion;
        }
        return await c.Server.Curation.GetCurationRecordAsync(new GetCurationRecordRequest { Dataset = dataset, Version = version }, c.Server.Call(t));
    }

    internal static async Task SaveAsync(CliContext c, string path, CurationRecord record, CancellationToken t)
    {
        await File.WriteAllTextAsync(path, record.RecipeJson + "\n", new UTF8Encoding(false), t);
        c.Err.WriteLine($"wrote {path} (the recipe of {record.Dataset} version {record.Version})");
    }
}
