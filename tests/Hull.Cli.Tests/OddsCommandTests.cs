using System.Globalization;
using System.Text.Json;
using Hull.Cli.Input;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>`hull odds` against a real server, and the entry files' uncertainty columns.</summary>
public sealed class OddsCommandTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;

    private string Server => _server.Address.ToString();

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        // Invented formation energies per atom with error bars.
        File.WriteAllText(Path.Combine(_folder, "odds.csv"), """
            id,formula,energy_ev,basis,note,sigma_ev_per_atom,correlation_group
            Li,Li,0,formation_per_atom,,,
            Co,Co,0,formation_per_atom,,,
            O,O,0,formation_per_atom,,,
            Li2O,Li2O,-2.0,formation_per_atom,,0.01,
            CoO,CoO,-1.2,formation_per_atom,,0.01,
            LiCoO2,LiCoO2,-1.8,formation_per_atom,,0.03,ml
            LiCoO2-b,LiCoO2,-1.79,formation_per_atom,,0.03,ml
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "o", Path.Combine(_folder, "odds.csv"), "--create", "--server", Server)).ExitCode);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task Odds_rows_are_entries_with_their_probability_and_the_figure_is_written()
    {
        string figure = Path.Combine(_folder, "odds.svg");
        var csv = await CliRun.RunAsync("odds", "o", "Li-Co-O", "--samples", "2000", "--seed", "5", "--group-sigma", "ml=0.01", "--figure", figure, "--csv", "--server", Server);
        Assert.True(csv.ExitCode == 0, csv.Err);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("entry_id,formula,sigma_ev_per_atom,group,p_vertex,p_vertex_se,", rows[0]);
        Assert.Equal(8, rows.Length);
        // The two LiCoO2 polymorphs share one composition: exactly one of them is the vertex in each sample.
        double pa = P(rows, "LiCoO2"), pb = P(rows, "LiCoO2-b");
        Assert.Equal(1.0, pa + pb, 1e-9);
        Assert.True(pa > pb);
        Assert.True(File.Exists(figure));
        Assert.Contains("kind=\"stability-odds\"", File.ReadAllText(figure));

        var json = await CliRun.RunAsync("odds", "o", "Li-Co-O", "--samples", "2000", "--seed", "5", "--group-sigma", "ml=0.01", "--json", "--server", Server);
        using JsonDocument doc = JsonDocument.Parse(json.Out);
        Assert.Equal(2000, doc.RootElement.GetProperty("sample_count").GetInt32());
        double jsonP = doc.RootElement.GetProperty("entries").EnumerateArray().Single(e => e.GetProperty("entry_id").GetString() == "LiCoO2").GetProperty("vertex_probability").GetDouble();
        Assert.Equal(pa, jsonP, 1e-4);
    }

    [Fact]
    public async Task Bad_odds_questions_exit_with_their_codes()
    {
        var noGroup = await CliRun.RunAsync("odds", "o", "Li-Co-O", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, noGroup.ExitCode);
        Assert.Contains("Correlation group 'ml'", noGroup.Err);
        var tooMany = await CliRun.RunAsync("odds", "o", "Li-Co-O", "--samples", "1000000", "--group-sigma", "ml=0.01", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, tooMany.ExitCode);
        Assert.Contains("work limit", tooMany.Err);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("odds", "o", "Li-Co-O", "--group-sigma", "ml", "--server", Server)).ExitCode);
    }

    [Theory]
    [InlineData("id,formula,energy_ev,basis,sigma_ev_per_atom\nx,Li,0,total_per_atom,-0.1\n", "column 'sigma_ev_per_atom': '-0.1' is not an energy uncertainty")]
    [InlineData("id,formula,energy_ev,basis,sigma_ev_per_atom\nx,Li,0,total_per_atom,NaN\n", "'NaN' is not an energy uncertainty")]
    public void Entry_files_refuse_a_bad_sigma_naming_the_line(string text, string expected)
    {
        string path = Path.Combine(_folder, "bad-sigma.csv");
        File.WriteAllText(path, text);
        var e = Assert.Throws<InputFileException>(() => EntryFileReader.Read(path));
        Assert.Equal(2, e.Line);
        Assert.Contains(expected, e.Message);
    }

    [Fact]
    public void Entry_files_read_sigma_and_group_from_csv_and_json()
    {
        string json = Path.Combine(_folder, "s.json");
        File.WriteAllText(json, """{"entries": [{"id": "a", "formula": "Li", "energy_ev": 0, "basis": "total_per_atom", "sigma_ev_per_atom": 0.02, "correlation_group": "ml"}]}""");
        EntryRecord record = Assert.Single(EntryFileReader.Read(json));
        Assert.Equal((0.02, "ml"), (record.SigmaEvPerAtom, record.CorrelationGroup));
        Assert.Equal(0.02, record.ToWire().EnergySigmaEvPerAtom);
        var csv = EntryFileReader.Read(Path.Combine(_folder, "odds.csv"));
        Assert.Null(csv[0].SigmaEvPerAtom);
        Assert.Equal((0.03, "ml"), (csv.Single(r => r.Id == "LiCoO2").SigmaEvPerAtom, csv.Single(r => r.Id == "LiCoO2").CorrelationGroup));
    }

    private static double P(string[] rows, string id) =>
        double.Parse(rows.Single(r => r.StartsWith(id + ",", StringComparison.Ordinal)).Split(',')[4], CultureInfo.InvariantCulture);
}
