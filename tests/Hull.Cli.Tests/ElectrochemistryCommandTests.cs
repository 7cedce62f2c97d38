using System.Globalization;
using System.Text.Json;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>`hull open-hull`, `voltage`, `react` and `ion-window` against a real server: columns, figures, usage errors.</summary>
public sealed class ElectrochemistryCommandTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;

    private string Server => _server.Address.ToString();

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        string file = Path.Combine(_folder, "lifef.csv");
        // The hand-worked Li-Fe-F system of the Core tests: LiF −6.0 and FeF2 −7.0 eV per formula unit.
        File.WriteAllText(file, """
            id,formula,energy_ev,basis,note
            Li,Li,0,formation_per_atom,
            Fe,Fe,0,formation_per_atom,
            F,F,0,formation_per_atom,
            LiF,LiF,-6.0,formation_per_formula_unit,
            FeF2,FeF2,-7.0,formation_per_formula_unit,
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "e", file, "--create", "--server", Server)).ExitCode);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task Voltage_rows_are_plateaus_and_the_figure_is_written()
    {
        string svg = Path.Combine(_folder, "v.svg");
        var csv = await CliRun.RunAsync("voltage", "e", "FeF2", "--ion", "Li", "--figure", svg, "--server", Server, "--csv");
        Assert.True(csv.ExitCode == 0, csv.Err);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("plateau,x_from,x_to,volts_vs_metal,kind,phases", rows[0]);
        string[] plateau = rows[1].Split(',');
        // The conversion FeF2 + 2 Li -> Fe + 2 LiF at 2.5 V (hand-worked in the Core tests).
        Assert.Equal(2.5, double.Parse(plateau[3], CultureInfo.InvariantCulture), 9);
        Assert.Equal("conversion", plateau[4]);
        Assert.Contains("kind=\"voltage-profile\"", File.ReadAllText(svg));

        var table = await CliRun.RunAsync("voltage", "e", "FeF2", "--ion", "Li", "--server", Server);
        Assert.Contains("Gibbs", table.Out);
        Assert.Contains("safety rules", table.Out);
    }

    [Fact]
    public async Task React_open_hull_and_window_answer()
    {
        var react = await CliRun.RunAsync("react", "e", "Li", "FeF2", "--server", Server, "--json");
        Assert.True(react.ExitCode == 0, react.Err);
        using JsonDocument doc = JsonDocument.Parse(react.Out);
        int best = doc.RootElement.GetProperty("most_negative_index").GetInt32();
        JsonElement point = doc.RootElement.GetProperty("points")[best];
        Assert.Equal("2/5", point.GetProperty("atom_fraction_exact").GetString());
        Assert.Equal(-1.0, point.GetProperty("reaction_energy_ev_per_atom").GetDouble(), 9);

        var open = await CliRun.RunAsync("open-hull", "e", "Li-Fe-F", "--open", "F=-3.5", "--server", Server);
        Assert.True(open.ExitCode == 0, open.Err);
        Assert.Contains("grand potential (F open at -3.5 eV)", open.Out);

        var window = await CliRun.RunAsync("ion-window", "e", "FeF2", "--ion", "Li", "--server", Server, "--csv");
        Assert.True(window.ExitCode == 0, window.Err);
        Assert.StartsWith("reduction,2.5", window.Out.Split(Environment.NewLine)[1]);
    }

    [Fact]
    public async Task Bad_values_are_usage_errors_or_named_refusals()
    {
        var usage = await CliRun.RunAsync("open-hull", "e", "Li-Fe-F", "--open", "F:-3", "--server", Server);
        Assert.Equal(2, usage.ExitCode);
        Assert.Contains("--open 'F:-3' is not ELEMENT=EV", usage.Err);

        var refused = await CliRun.RunAsync("react", "e", "LiF", "LiF", "--server", Server);
        Assert.NotEqual(0, refused.ExitCode);
        Assert.Contains("same phase", refused.Err);

        var notOpenable = await CliRun.RunAsync("open-hull", "e", "Li-Fe-F", "--open", "O=-1", "--server", Server);
        Assert.NotEqual(0, notOpenable.ExitCode);
        Assert.Contains("open_elements[0]", notOpenable.Err);
    }
}
