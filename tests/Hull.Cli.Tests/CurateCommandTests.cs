using System.Text.Json;

namespace Hull.Cli.Tests;

/// <summary>`hull curate` against a real server: run a recipe file, show the record, save and re-run the recipe.</summary>
public sealed class CurateCommandTests : ServerBackedTests
{
    public override async Task InitializeAsync()
    {
        await base.InitializeAsync();
        // Invented formation energies per atom with tags in the note.
        string raw = File("raw.csv", """
            id,formula,energy_ev,basis,note
            Li,Li,0,formation_per_atom,
            O,O,0,formation_per_atom,
            Li2O,Li2O,-2.0,formation_per_atom,source=a
            Li2O-b,Li2O,-1.9,formation_per_atom,source=b
            LiO,LiO,-0.1,formation_per_atom,flagged
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "raw", raw, "--create", "--server", Server)).ExitCode);
    }

    [Fact]
    public async Task A_recipe_file_makes_a_version_whose_saved_recipe_runs_again_to_the_same_content()
    {
        string recipe = File("clean.json", """{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}, {"kind": "keep_lowest_duplicate"}]}""");
        string saved = Path.Combine(Folder, "saved.json");
        var run = await CliRun.RunAsync("curate", "raw", recipe, "--version", "1", "--save-recipe", saved, "--server", Server);
        Assert.True(run.ExitCode == 0, run.Err);
        Assert.Contains("dataset raw: version 2 holds 3 entries", run.Out);
        Assert.Contains("version 2: curated from raw@1", run.Out);
        Assert.Contains("drop_flagged", run.Out);

        var again = await CliRun.RunAsync("curate", "raw", saved, "--version", "1", "--json", "--server", Server);
        Assert.True(again.ExitCode == 0, again.Err);
        using var first = JsonDocument.Parse((await CliRun.RunAsync("curate", "raw", saved, "--version", "1", "--json", "--server", Server)).Out);
        using var second = JsonDocument.Parse(again.Out);
        Assert.Equal(first.RootElement.GetProperty("content_sha256").GetString(), second.RootElement.GetProperty("content_sha256").GetString());
        Assert.Equal([1, 1], second.RootElement.GetProperty("record").GetProperty("steps").EnumerateArray().Select(s => s.GetProperty("removed_count").GetInt32()));

        // Export writes the same recipe beside the entries; a show lists each step.
        string exported = Path.Combine(Folder, "exported.json");
        Assert.Equal(0, (await CliRun.RunAsync("export", "raw", "--version", "2", "--csv", "--recipe", exported, "--server", Server)).ExitCode);
        Assert.Equal(System.IO.File.ReadAllText(saved), System.IO.File.ReadAllText(exported));
        var show = await CliRun.RunAsync("datasets", "show", "raw", "--server", Server);
        Assert.Contains("  2. keep_lowest_duplicate {}: 4 entries, 1 removed, 0 changed", show.Out);
        Assert.Equal(0, (await CliRun.RunAsync("curate", "raw", "--version", "2", "--save-recipe", Path.Combine(Folder, "v2.json"), "--server", Server)).ExitCode);
    }

    [Fact]
    public async Task A_misspelt_field_is_refused_naming_step_and_field()
    {
        string recipe = File("typo.json", """{"recipe_schema": 1, "steps": [{"kind": "drop_flagged", "flg": "x"}]}""");
        var run = await CliRun.RunAsync("curate", "raw", recipe, "--server", Server);
        Assert.NotEqual(0, run.ExitCode);
        Assert.Contains("recipe step 1, field 'flg'", run.Err);
        var versions = await CliRun.RunAsync("versions", "list", "raw", "--csv", "--server", Server);
        Assert.Equal(2, versions.Out.Split('\n', StringSplitOptions.RemoveEmptyEntries).Length);
    }
}
