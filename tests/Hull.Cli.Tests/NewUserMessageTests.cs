using Hull.Cli.Commands;

namespace Hull.Cli.Tests;

/// <summary>
/// What a first-time user reads: decompositions that name polymorphs by id, the origin column, JSON as typed, a plain
/// server reached over https, a missing dataset, a duplicate id, and deletions that ask first on a terminal.
/// </summary>
public sealed class NewUserMessageTests : ServerBackedTests
{
    // Two MgO polymorphs; no O entry at all, so O is a corner set to 0 by definition (invented numbers, as in the demo).
    private const string Polymorphs = """
        id,formula,energy_ev,basis
        Mg,Mg,0,formation_per_atom
        mgo-rocksalt,MgO,-3.0,formation_per_atom
        mgo-wurtzite,MgO,-2.9,formation_per_atom
        """;

    private async Task ImportPolymorphsAsync(string dataset) =>
        Assert.Equal(0, (await CliRun.RunAsync("import", dataset, File("polymorphs.csv", Polymorphs), "--create", "--server", Server)).ExitCode);

    private static int Count(string text, string part)
    {
        int count = 0;
        for (int at = text.IndexOf(part, StringComparison.Ordinal); at >= 0; at = text.IndexOf(part, at + part.Length, StringComparison.Ordinal)) count++;
        return count;
    }

    [Fact]
    public async Task A_polymorph_decomposes_into_its_sibling_named_by_id_and_json_keeps_the_arrow()
    {
        await ImportPolymorphsAsync("poly");

        var table = await CliRun.RunAsync("stability", "poly", "mgo-wurtzite", "--server", Server);
        Assert.Equal(0, table.ExitCode);
        Assert.Contains("MgO -> MgO [mgo-rocksalt]", table.Out);

        // A decomposition whose products have distinct formulas other than the reactant's stays as the server wrote it.
        var mixed = await CliRun.RunAsync("hull-energy", "poly", "Mg2O", "--server", Server);
        Assert.Equal(0, mixed.ExitCode);
        Assert.Contains("Mg2O -> Mg + MgO", mixed.Out);
        Assert.DoesNotContain("[", mixed.Out);

        var json = await CliRun.RunAsync("stability", "poly", "mgo-wurtzite", "--json", "--server", Server);
        Assert.Equal(0, json.ExitCode);
        Assert.Contains("MgO -> MgO", json.Out);
        Assert.DoesNotContain("\\u003e", json.Out);
        Assert.DoesNotContain("\\u003E", json.Out);
    }

    [Fact]
    public async Task The_origin_column_tells_a_stored_entry_from_an_element_set_to_zero()
    {
        await ImportPolymorphsAsync("origin");

        var run = await CliRun.RunAsync("stable", "origin", "--system", "Mg-O", "--server", Server);

        Assert.Equal(0, run.ExitCode);
        string[] lines = run.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Contains("origin", lines.First(l => l.StartsWith("phase", StringComparison.Ordinal)));
        Assert.EndsWith("entry", lines.Single(l => l.StartsWith("mgo-rocksalt ", StringComparison.Ordinal)).TrimEnd());
        Assert.EndsWith("entry", lines.Single(l => l.StartsWith("Mg ", StringComparison.Ordinal)).TrimEnd());
        Assert.EndsWith(CommandTree.ElementWithoutEntry, lines.Single(l => l.StartsWith("O ", StringComparison.Ordinal)).TrimEnd());
    }

    [Fact]
    public async Task Https_against_a_plain_server_says_to_use_http_not_that_a_certificate_is_untrusted()
    {
        var run = await CliRun.RunAsync("datasets", "list", "--server", $"https://127.0.0.1:{HullServer.Port}");

        Assert.NotEqual(0, run.ExitCode);
        Assert.Contains($"A server started without --tls-cert serves plain text: use http://127.0.0.1:{HullServer.Port}", run.Err);
        Assert.DoesNotContain("does not trust", run.Err);
    }

    [Fact]
    public async Task A_missing_dataset_suggests_create_and_a_stored_duplicate_names_its_line_and_the_replace_option_once()
    {
        string file = File("polymorphs.csv", Polymorphs);
        var missing = await CliRun.RunAsync("import", "fresh", file, "--server", Server);
        Assert.Equal(ExitCodes.NotFound, missing.ExitCode);
        Assert.Contains("dataset 'fresh' does not exist; nothing was written. Add --create to create it first.", missing.Err);

        Assert.Equal(0, (await CliRun.RunAsync("import", "fresh", file, "--create", "--server", Server)).ExitCode);
        var again = await CliRun.RunAsync("import", "fresh", File("again.csv", "id,formula,energy_ev,basis\nnew,Mg2O,-1,formation_per_atom\nmgo-rocksalt,MgO,-3.1,formation_per_atom\n"), "--server", Server);

        Assert.Equal(ExitCodes.Rejected, again.ExitCode);
        Assert.Contains("again.csv line 3 (id 'mgo-rocksalt')", again.Err);
        Assert.Equal(1, Count(again.Err, "--on-duplicate replace"));
        Assert.Equal(1, Count(again.Err, "supersede"));
        Assert.Equal(1, Count(again.Err, "is already in dataset 'fresh'"));
    }

    [Fact]
    public async Task Deleting_asks_on_a_terminal_and_only_there_and_yes_skips_the_question()
    {
        static TerminalInfo Answering(string answer) => new(ErrorIsTerminal: true, InputIsTerminal: true, new StringReader(answer + "\n"));
        async Task<CliRun.Result> RunAsync(TerminalInfo terminal, params string[] args)
        {
            var stdout = new StringWriter();
            var stderr = new StringWriter();
            int code = await CliApp.RunAsync([.. args, "--server", Server], stdout, stderr, CancellationToken.None, terminal);
            return new CliRun.Result(code, stdout.ToString(), stderr.ToString());
        }

        async Task<bool> ExistsAsync(string name) => (await CliRun.RunAsync("datasets", "show", name, "--server", Server)).ExitCode == 0;

        foreach (string name in new[] { "a", "b", "c", "d" }) await ImportPolymorphsAsync(name);

        var declined = await RunAsync(Answering("n"), "datasets", "delete", "a");
        Assert.Equal(ExitCodes.NotConfirmed, declined.ExitCode);
        Assert.Contains("Delete dataset 'a' with all its versions? [y/N]", declined.Err);
        Assert.Contains("not confirmed; nothing was deleted", declined.Err);
        Assert.True(await ExistsAsync("a"));

        // Anything but y/yes is a no, an empty answer included.
        Assert.Equal(ExitCodes.NotConfirmed, (await RunAsync(Answering(""), "datasets", "delete", "a")).ExitCode);
        Assert.True(await ExistsAsync("a"));

        var confirmed = await RunAsync(Answering("yes"), "datasets", "delete", "a");
        Assert.Equal(0, confirmed.ExitCode);
        Assert.False(await ExistsAsync("a"));

        var skipped = await RunAsync(Answering("n"), "datasets", "delete", "b", "--yes");
        Assert.Equal(0, skipped.ExitCode);
        Assert.DoesNotContain("[y/N]", skipped.Err);
        Assert.False(await ExistsAsync("b"));

        // A script (stderr or stdin not a terminal) is not asked.
        var scripted = await RunAsync(new TerminalInfo(ErrorIsTerminal: false, InputIsTerminal: true, new StringReader("n\n")), "datasets", "delete", "c");
        Assert.Equal(0, scripted.ExitCode);
        Assert.DoesNotContain("[y/N]", scripted.Err);
        Assert.False(await ExistsAsync("c"));

        var version = await RunAsync(Answering("no"), "versions", "delete", "d", "1");
        Assert.Equal(ExitCodes.NotConfirmed, version.ExitCode);
        Assert.Contains("Delete version 1 of dataset 'd'? [y/N]", version.Err);
        Assert.Contains("\"version\"", (await CliRun.RunAsync("versions", "list", "d", "--json", "--server", Server)).Out);
        Assert.Equal(0, (await RunAsync(Answering("y"), "versions", "delete", "d", "1")).ExitCode);
        Assert.DoesNotContain("\"version\"", (await CliRun.RunAsync("versions", "list", "d", "--json", "--server", Server)).Out);
    }
}
