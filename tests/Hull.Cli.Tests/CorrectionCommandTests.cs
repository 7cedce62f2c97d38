using System.Text.Json;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>`hull corrections` against a real server, and the entry files' method column.</summary>
public sealed class CorrectionCommandTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;

    private string Server => _server.Address.ToString();

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        string mixture = CliRun.RepositoryFile(Path.Combine("data-demo", "corrections", "two-methods.csv"));
        Assert.Equal(0, (await CliRun.RunAsync("import", "mx", mixture, "--create", "--server", Server)).ExitCode);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    private static string SetFile => CliRun.RepositoryFile(Path.Combine("data-demo", "corrections", "demo-mix.json"));

    [Fact]
    public async Task Put_list_show_and_derive_and_the_answers_name_the_set()
    {
        var put = await CliRun.RunAsync("corrections", "put", SetFile, "--server", Server);
        Assert.True(put.ExitCode == 0, put.Err);
        Assert.Contains("demo-mix", put.Out);

        var list = await CliRun.RunAsync("corrections", "list", "--json", "--server", Server);
        using (JsonDocument doc = JsonDocument.Parse(list.Out))
        {
            JsonElement set = doc.RootElement.GetProperty("sets").EnumerateArray().Single();
            Assert.Equal(("demo-mix", "1", 1), (set.GetProperty("name").GetString(), set.GetProperty("version").GetString(), set.GetProperty("method_rule_count").GetInt32()));
        }

        string copy = Path.Combine(_folder, "copy.json");
        Assert.Equal(0, (await CliRun.RunAsync("corrections", "show", "demo-mix@1", "--out", copy, "--server", Server)).ExitCode);
        Assert.Equal(File.ReadAllText(SetFile), File.ReadAllText(copy));

        var derive = await CliRun.RunAsync("corrections", "derive", "mx", "--set", "demo-mix@1", "--csv", "--server", Server);
        Assert.True(derive.ExitCode == 0, derive.Err);
        Assert.StartsWith("entry_id,method,method_shift_ev_per_atom,", derive.Out);
        Assert.Contains("CoO-u,gga+u,", derive.Out);

        // Every later answer on version 2 names the set; version 1 names none.
        var stable = await CliRun.RunAsync("stable", "mx", "--system", "Li-Co-O", "--server", Server);
        Assert.Contains("version 2 (corrected with demo-mix v1 from version 1)", stable.Out);
        var raw = await CliRun.RunAsync("stable", "mx", "--system", "Li-Co-O", "--version", "1", "--json", "--server", Server);
        using (JsonDocument doc = JsonDocument.Parse(raw.Out))
        {
            Assert.False(doc.RootElement.GetProperty("used").TryGetProperty("corrections", out _));
        }

        // Headings of other answers name it too: a figure, and a curated version that applied the set.
        var figure = await CliRun.RunAsync("figure", "mx", "Li-Co-O", "--output", Path.Combine(_folder, "mx.svg"), "--server", Server);
        Assert.True(figure.ExitCode == 0, figure.Err);
        Assert.True(figure.Out.Contains("dataset mx, version 2 (corrected with demo-mix v1 from version 1), system Co-Li-O", StringComparison.Ordinal), figure.Out);
        Assert.Contains("corrected with demo-mix v1 from version 1", File.ReadAllText(Path.Combine(_folder, "mx.svg")));

        // The versions table says which version holds corrected energies, and from which.
        var shown = await CliRun.RunAsync("datasets", "show", "mx", "--csv", "--server", Server);
        string[] lines = shown.Out.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.EndsWith(",corrected_with", lines[0]);
        Assert.EndsWith(",", lines[1].TrimEnd('\r'));
        Assert.EndsWith(",demo-mix v1 from version 1", lines[2].TrimEnd('\r'));

        // The new version exports with its method tags and imports again unchanged.
        string exported = Path.Combine(_folder, "v2.csv");
        Assert.Equal(0, (await CliRun.RunAsync("export", "mx", "--csv", "--output", exported, "--server", Server)).ExitCode);
        Assert.EndsWith(",method", File.ReadLines(exported).First());
        IReadOnlyList<EntryRecord> again = EntryFileReader.Read(exported);
        Assert.Equal("gga+u", again.Single(r => r.Id == "CoO-u").Method);
        Assert.Equal(0, (await CliRun.RunAsync("import", "mx-copy", exported, "--create", "--server", Server)).ExitCode);
        var copyStable = await CliRun.RunAsync("stable", "mx-copy", "--system", "Li-Co-O", "--csv", "--server", Server);
        var derivedStable = await CliRun.RunAsync("stable", "mx", "--system", "Li-Co-O", "--csv", "--server", Server);
        Assert.Equal(derivedStable.Out, copyStable.Out);
    }

    [Fact]
    public async Task An_older_version_is_corrected_with_from_and_the_new_version_holds_its_entries_only()
    {
        string extra = Path.Combine(_folder, "extra.csv");
        File.WriteAllText(extra, "id,formula,energy_ev,basis,note,method\nLi2O2,Li2O2,-18.6,total_per_formula_unit,peroxide,gga\n");
        Assert.Equal(0, (await CliRun.RunAsync("import", "mx", extra, "--server", Server)).ExitCode);

        var derive = await CliRun.RunAsync("corrections", "derive", "mx", "--set-file", SetFile, "--from", "1", "--server", Server);
        Assert.True(derive.ExitCode == 0, derive.Err);
        Assert.Contains("version 3 derived from version 1", derive.Out);

        // Version 3 holds version 1's nine entries, not version 2's peroxide; its record is the recipe that makes it again.
        var exported = await CliRun.RunAsync("export", "mx", "--version", "3", "--csv", "--server", Server);
        Assert.DoesNotContain("Li2O2", exported.Out);
        var shown = await CliRun.RunAsync("datasets", "show", "mx", "--server", Server);
        Assert.Contains("demo-mix v1 from version 1", shown.Out);
        Assert.Contains("apply_correction_set", shown.Out);

        string recipe = Path.Combine(_folder, "apply.recipe.json");
        File.WriteAllText(recipe, """{"recipe_schema": 1, "steps": [{"kind": "apply_correction_set", "set_name": "demo-mix", "set_version": 1}]}""");
        var curated = await CliRun.RunAsync("curate", "mx", recipe, "--version", "1", "--server", Server);
        Assert.True(curated.ExitCode == 0, curated.Err);
        Assert.Contains("corrected with demo-mix v1 from version 1: every answer on it names the set", curated.Out);
    }

    [Fact]
    public async Task Bad_corrections_questions_exit_with_their_codes()
    {
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("corrections", "derive", "mx", "--server", Server)).ExitCode);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("corrections", "derive", "mx", "--set", "demo-mix", "--server", Server)).ExitCode);
        string bad = Path.Combine(_folder, "bad.json");
        File.WriteAllText(bad, """{"set_schema": 1, "name": "b", "version": 1, "base_method": "gga", "species_shifts": [{"element": "F", "applies_to": "with_metal", "shift_ev_per_atom": -0.4}]}""");
        var refused = await CliRun.RunAsync("corrections", "derive", "mx", "--set-file", bad, "--server", Server);
        Assert.Equal(ExitCodes.Rejected, refused.ExitCode);
        Assert.Contains("element F", refused.Err);
        Assert.Equal(ExitCodes.NotFound, (await CliRun.RunAsync("corrections", "show", "nothing@3", "--server", Server)).ExitCode);
    }

    [Fact]
    public void Entry_files_read_the_method_from_csv_and_json()
    {
        string json = Path.Combine(_folder, "m.json");
        File.WriteAllText(json, """{"entries": [{"id": "a", "formula": "Li", "energy_ev": 0, "basis": "total_per_atom", "method": "r2scan"}]}""");
        EntryRecord record = Assert.Single(EntryFileReader.Read(json));
        Assert.Equal("r2scan", record.ToWire().Method);
        var csv = EntryFileReader.Read(CliRun.RepositoryFile(Path.Combine("data-demo", "corrections", "two-methods.csv")));
        Assert.Equal(["gga", "gga+u"], csv.Select(r => r.Method).Distinct().Order(StringComparer.Ordinal));
        Assert.Equal(("demo-mix", 1L), CorrectionCommands.ParseSet("demo-mix@1"));
    }
}
