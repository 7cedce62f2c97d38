using System.Diagnostics;
using System.Text.Json;

namespace Hull.Cli.Tests;

/// <summary>`hull` against a real server on a loopback port: commands, output formats and exit codes.</summary>
public sealed class CliAgainstServerTests : ServerBackedTests
{
    private const string LiCoO = """
        id,formula,energy_ev,basis,note
        Li,Li,0,formation_per_atom,
        Co,Co,0,formation_per_atom,
        O,O,0,formation_per_atom,
        Li2O,Li2O,-2.0,formation_per_atom,
        CoO,CoO,-1.2,formation_per_atom,
        LiCoO2,LiCoO2,-1.8,formation_per_atom,"layered, R-3m"
        LiCoO2-b,LiCoO2,-1.75,formation_per_atom,polymorph
        """;

    [Fact]
    public async Task Import_then_query_in_every_output_format()
    {
        string file = File("licoo.csv", LiCoO);
        var import = await CliRun.RunAsync("import", "demo", file, "--create", "--batch-size", "3", "--server", Server);
        Assert.Equal(0, import.ExitCode);
        Assert.Contains("licoo.csv", import.Out);
        Assert.Contains("[##############################] 7/7 entries (100%)", import.Err);
        // Three batches, one version: the import is all of the file or none of it.

        var list = await CliRun.RunAsync("datasets", "list", "--server", Server, "--json");
        Assert.Equal(0, list.ExitCode);
        using (JsonDocument json = JsonDocument.Parse(list.Out))
        {
            JsonElement d = json.RootElement.GetProperty("datasets")[0];
            Assert.Equal("demo", d.GetProperty("name").GetString());
            Assert.Equal("1", d.GetProperty("latest_version").GetString());
            Assert.Equal("7", d.GetProperty("entry_count").GetString());
        }

        var table = await CliRun.RunAsync("stability", "demo", "LiCoO2-b", "LiCoO2", "--server", Server);
        Assert.Equal(0, table.ExitCode);
        string[] lines = table.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("dataset demo, version 1", lines[0]);
        Assert.StartsWith("id ", lines[1]);
        Assert.Contains("0.0500", lines[3]);

        var csv = await CliRun.RunAsync("stability", "demo", "LiCoO2-b", "--server", Server, "--csv", "--version", "1");
        Assert.Equal(0, csv.ExitCode);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("id,formula,system,formation_ev_per_atom,above_hull_ev_per_atom,stable,decomposition_ev_per_atom,decomposition,dataset_version", rows[0]);
        string[] cells = rows[1].Split(',');
        Assert.Equal(0.05, double.Parse(cells[4], System.Globalization.CultureInfo.InvariantCulture), 12);
        Assert.Equal("1", cells[^1]);

        var assess = await CliRun.RunAsync("assess", "demo", "Li2CoO3", "-1.9", "--server", Server, "--json");
        Assert.Equal(0, assess.ExitCode);
        using (JsonDocument json = JsonDocument.Parse(assess.Out))
        {
            Assert.True(json.RootElement.GetProperty("results")[0].GetProperty("is_on_or_below_hull").GetBoolean());
            Assert.Equal("1", json.RootElement.GetProperty("used").GetProperty("version").GetString());
        }

        foreach (string[] args in new[]
                 {
                     new[] { "hull-energy", "demo", "Li3CoO4", "LiCo2O3" },
                     new[] { "stable", "demo" },
                     new[] { "stable", "demo", "--system", "Li-O" },
                     new[] { "facets", "demo", "Li-Co-O" },
                     new[] { "facets", "demo", "Co-Li-O", "--tie-lines" },
                     new[] { "analyze", "demo", "--max-above-hull", "0.01" },
                     new[] { "versions", "list", "demo" },
                     new[] { "datasets", "show", "demo" },
                     new[] { "health" },
                     new[] { "server-info" },
                     new[] { "health", "--report" },
                 })
        {
            var run = await CliRun.RunAsync([.. args, "--server", Server]);
            Assert.True(run.ExitCode == 0, $"{string.Join(' ', args)}: {run.Err}");
            Assert.NotEmpty(run.Out);
        }
    }

    [Fact]
    public async Task A_session_import_refused_at_its_commit_names_the_file_line_and_makes_no_version()
    {
        // One row per batch, so the import is a session and the range rule for the total energy is met at the commit:
        // -2e4 eV per formula unit of MgO against these references implies about -1e4 eV/atom of formation energy.
        string file = File("totals.csv", """
            id,formula,energy_ev,basis
            O2,O2,-4.93,total_per_atom
            Mg,Mg,-1.54,total_per_atom
            bad,MgO,-20000,total_per_formula_unit
            """);
        var run = await CliRun.RunAsync("import", "totals", file, "--create", "--batch-size", "1", "--server", Server);

        Assert.Equal(ExitCodes.Rejected, run.ExitCode);
        Assert.Contains("totals.csv line 4 (id 'bad'), energy_ev: id 'bad' (MgO): formation energy", run.Err);
        var show = await CliRun.RunAsync("versions", "list", "totals", "--json", "--server", Server);
        Assert.Equal(0, show.ExitCode);
        Assert.DoesNotContain("\"version\"", show.Out);
    }

    [Fact]
    public async Task Export_round_trips_through_import_to_the_same_content()
    {
        string file = File("licoo.csv", LiCoO);
        Assert.Equal(0, (await CliRun.RunAsync("import", "one", file, "--create", "--server", Server)).ExitCode);
        string exported = Path.Combine(Folder, "exported.csv");
        Assert.Equal(0, (await CliRun.RunAsync("export", "one", "--csv", "-o", exported, "--server", Server)).ExitCode);
        string exportedJson = Path.Combine(Folder, "exported.json");
        Assert.Equal(0, (await CliRun.RunAsync("export", "one", "--json", "-o", exportedJson, "--server", Server)).ExitCode);
        Assert.Equal(0, (await CliRun.RunAsync("import", "two", exported, "--create", "--server", Server)).ExitCode);
        Assert.Equal(0, (await CliRun.RunAsync("import", "three", exportedJson, "--create", "--server", Server)).ExitCode);

        string Fingerprint(string dataset)
        {
            var run = CliRun.RunAsync("stable", dataset, "--json", "--server", Server).GetAwaiter().GetResult();
            using JsonDocument json = JsonDocument.Parse(run.Out);
            return json.RootElement.GetProperty("used").GetProperty("content_sha256").GetString()!;
        }

        Assert.Equal(Fingerprint("one"), Fingerprint("two"));
        Assert.Equal(Fingerprint("one"), Fingerprint("three"));
    }

    [Fact]
    public async Task Exit_codes_say_what_went_wrong()
    {
        // 2: usage.
        var usage = await CliRun.RunAsync("stability", "--server", Server);
        Assert.Equal(ExitCodes.Usage, usage.ExitCode);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("frobnicate")).ExitCode);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("import", "d", "x.csv", "--on-duplicate", "maybe", "--server", Server)).ExitCode);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("datasets", "list", "--json", "--csv", "--server", Server)).ExitCode);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("datasets", "list", "--server", "ftp://x")).ExitCode);

        // 3: input file.
        var missing = await CliRun.RunAsync("import", "d", Path.Combine(Folder, "none.csv"), "--server", Server);
        Assert.Equal(ExitCodes.InputFile, missing.ExitCode);
        Assert.Contains("no such file", missing.Err);
        var badNumber = await CliRun.RunAsync("import", "d", File("bad.csv", "id,formula,energy_ev,basis\nx,Li,1.2.3,total_per_atom\n"), "--server", Server);
        Assert.Equal(ExitCodes.InputFile, badNumber.ExitCode);
        Assert.Contains("bad.csv line 2: column 'energy_ev'", badNumber.Err);

        // 4: unreachable.
        var unreachable = await CliRun.RunAsync("datasets", "list", "--server", $"http://127.0.0.1:{CliRun.ClosedPort()}");
        Assert.Equal(ExitCodes.ServerUnreachable, unreachable.ExitCode);
        Assert.Contains("cannot reach the hull server", unreachable.Err);

        // 5: the server refuses a row, and the message points at the file's line.
        var badFormula = await CliRun.RunAsync("import", "d", File("typo.csv", "id,formula,energy_ev,basis\nok,Li2O,-2,formation_per_atom\nbad,LiCoQ2,-1,formation_per_atom\n"), "--create", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, badFormula.ExitCode);
        Assert.Contains("typo.csv line 3 (id 'bad'), formula: unknown element 'Q' at character 5 in 'LiCoQ2'", badFormula.Err);

        // 6: not found.
        var notFound = await CliRun.RunAsync("stable", "nope", "--server", Server);
        Assert.Equal(ExitCodes.NotFound, notFound.ExitCode);
        Assert.Contains("'nope'", notFound.Err);
        Assert.Contains("(NotFound, DATASET_NOT_FOUND)", notFound.Err);

        // 7: with --json the refusal is one JSON object on stderr that scripts can branch on; stdout stays empty.
        var notFoundJson = await CliRun.RunAsync("stable", "nope", "--json", "--server", Server);
        Assert.Equal(ExitCodes.NotFound, notFoundJson.ExitCode);
        Assert.Equal(string.Empty, notFoundJson.Out.Trim());
        using (var error = System.Text.Json.JsonDocument.Parse(notFoundJson.Err))
        {
            var body = error.RootElement.GetProperty("error");
            Assert.Equal("NOT_FOUND", body.GetProperty("status").GetString());
            Assert.Equal("DATASET_NOT_FOUND", body.GetProperty("reason").GetString());
            Assert.Equal("hull.v1", body.GetProperty("domain").GetString());
            Assert.Equal("nope", body.GetProperty("metadata").GetProperty("dataset").GetString());
            Assert.Equal(ExitCodes.NotFound, body.GetProperty("exit_code").GetInt32());
        }

        var badJson = await CliRun.RunAsync("import", "d", File("typo2.csv", "id,formula,energy_ev,basis\nbad,LiCoQ2,-1,formation_per_atom\n"), "--create", "--json", "--server", Server);
        using (var error = System.Text.Json.JsonDocument.Parse(badJson.Err))
        {
            var body = error.RootElement.GetProperty("error");
            Assert.Equal("INVALID_ENTRY", body.GetProperty("reason").GetString());
            Assert.Contains("typo2.csv line 2", body.GetProperty("message").GetString());
            Assert.Equal("entries[0].formula", body.GetProperty("field_violations")[0].GetProperty("field").GetString());
        }
    }

    [Fact]
    public async Task List_commands_follow_every_page()
    {
        var (server, folder) = await CliRun.StartServerAsync();
        try
        {
            string address = server.Address.ToString();
            foreach (string name in new[] { "p-c", "p-a", "p-b" })
            {
                Assert.Equal(ExitCodes.Ok, (await CliRun.RunAsync("datasets", "create", name, "--server", address)).ExitCode);
            }

            var listed = await CliRun.RunAsync("datasets", "list", "--page-size", "1", "--json", "--server", address);
            Assert.Equal(ExitCodes.Ok, listed.ExitCode);
            using var json = System.Text.Json.JsonDocument.Parse(listed.Out);
            Assert.Equal(["p-a", "p-b", "p-c"], json.RootElement.GetProperty("datasets").EnumerateArray().Select(d => d.GetProperty("name").GetString()));
        }
        finally
        {
            await server.StopAsync();
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public async Task Write_commands_without_the_token_exit_with_not_authorized()
    {
        var (server, folder) = await CliRun.StartServerAsync(token: "t0ken");
        try
        {
            string address = server.Address.ToString();
            var refused = await CliRun.RunAsync("datasets", "create", "x", "--server", address);
            Assert.Equal(ExitCodes.NotAuthorized, refused.ExitCode);
            Assert.Contains("Unauthenticated", refused.Err);
            Assert.Equal(ExitCodes.NotAuthorized, (await CliRun.RunAsync("datasets", "create", "x", "--server", address, "--token", "wrong")).ExitCode);
            Assert.Equal(ExitCodes.Ok, (await CliRun.RunAsync("datasets", "create", "x", "--server", address, "--token", "t0ken")).ExitCode);
            Assert.Equal(ExitCodes.Ok, (await CliRun.RunAsync("datasets", "list", "--server", address)).ExitCode);
        }
        finally
        {
            await server.StopAsync();
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public async Task The_hull_executable_reports_an_unreachable_server_with_exit_code_4()
    {
        string hull = Path.Combine(AppContext.BaseDirectory, "hull.dll");
        var start = new ProcessStartInfo("dotnet") { RedirectStandardError = true, RedirectStandardOutput = true };
        foreach (string arg in new[] { hull, "health", "--server", $"http://127.0.0.1:{CliRun.ClosedPort()}" }) start.ArgumentList.Add(arg);
        using var process = Process.Start(start)!;
        string error = await process.StandardError.ReadToEndAsync();
        await process.WaitForExitAsync();
        Assert.Equal(ExitCodes.ServerUnreachable, process.ExitCode);
        Assert.Contains("cannot reach the hull server", error);
    }
}
