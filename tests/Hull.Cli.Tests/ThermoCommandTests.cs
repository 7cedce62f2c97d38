using System.Globalization;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>
/// `hull thermo decompose|hull|gas|figure` against a real server on the silver oxide of the NBS Tables of Chemical
/// Thermodynamic Properties (1982) — from memory: Ag2O ΔfH° = −31.05 kJ/mol, S° = 121.3 J/(mol K), Ag S° = 42.55,
/// O2 S° = 205.138; columns, the caution, the figure and a bad models file.
/// </summary>
public sealed class ThermoCommandTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;
    private string _models = null!;

    private string Server => _server.Address.ToString();

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        string file = Path.Combine(_folder, "ag-o.csv");
        // −31.05 kJ/mol over e N_A = 96.48533212 kJ/mol per eV (CODATA 2018 — from memory)
        string energy = (-31.05 / 96.48533212).ToString("R", CultureInfo.InvariantCulture);
        File.WriteAllText(file, $"""
            id,formula,energy_ev,basis,note
            Ag,Ag,0,formation_per_atom,
            O,O,0,formation_per_atom,
            Ag2O,Ag2O,{energy},formation_per_formula_unit,
            """);
        _models = Path.Combine(_folder, "entropies.csv");
        File.WriteAllText(_models, """
            # NBS Tables (1982) — from memory
            entry_id,formula,standard_entropy_j_per_mol_k,source
            Ag,Ag,42.55,NBS 1982
            Ag2O,Ag2O,121.3,NBS 1982
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "ag", file, "--create", "--server", Server)).ExitCode);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task Decompose_prints_the_crossing_and_the_caution()
    {
        var csv = await CliRun.RunAsync("thermo", "decompose", "ag", "Ag2O", "--pressure", "0.21", "--from", "300", "--to", "900",
            "--models", _models, "--treatment", "ellingham", "--standard-entropy", "205.138", "--server", Server, "--csv");
        Assert.True(csv.ExitCode == 0, csv.Err);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("temperature_k,direction,reaction,gas_molecules_released_per_formula_unit,method", rows[0]);
        string[] crossing = rows[1].Split(',');
        // 31050 / (66.369 − ½ R ln 0.21) = 426.18 K, by hand
        Assert.Equal(426.18, double.Parse(crossing[0], CultureInfo.InvariantCulture), 0.01);
        Assert.Equal("decomposes above", crossing[1]);

        var table = await CliRun.RunAsync("thermo", "decompose", "ag", "Ag2O", "--pressure", "0.21", "--models", _models, "--server", Server);
        Assert.True(table.ExitCode == 0, table.Err);
        Assert.Contains("fire hazard", table.Out);
        Assert.Contains("tabulated gas", table.Out);
    }

    [Fact]
    public async Task Hull_gas_and_figure_answer()
    {
        var hull = await CliRun.RunAsync("thermo", "hull", "ag", "Ag-O", "--temperature", "400", "--pressure", "0.21", "--models", _models, "--server", Server);
        Assert.True(hull.ExitCode == 0, hull.Err);
        Assert.Contains("stable: Ag2O", hull.Out);
        var gas = await CliRun.RunAsync("thermo", "gas", "--temperature", "1000", "--pressure", "0.21", "--delta-mu", "-1.2", "--server", Server);
        Assert.True(gas.ExitCode == 0, gas.Err);
        Assert.Contains("delta mu", gas.Out);
        Assert.Contains("T = ", gas.Out);
        string svg = Path.Combine(_folder, "t.svg");
        var figure = await CliRun.RunAsync("thermo", "figure", "ag", "Ag2O", "--pressure", "1", "--models", _models, "--output", svg, "--server", Server);
        Assert.True(figure.ExitCode == 0, figure.Err);
        Assert.Contains("kind=\"temperature-stability\"", File.ReadAllText(svg));
    }

    [Fact]
    public async Task A_bad_models_file_or_a_missing_pressure_is_refused()
    {
        string bad = Path.Combine(_folder, "bad.csv");
        File.WriteAllText(bad, "entry_id,formula,standard_entropy_j_per_mol_k,source\nAg2O,Ag2O,lots,x\n");
        var run = await CliRun.RunAsync("thermo", "decompose", "ag", "Ag2O", "--pressure", "1", "--models", bad, "--server", Server);
        Assert.NotEqual(0, run.ExitCode);
        Assert.Contains("line 2", run.Err);
        Assert.Contains("'lots' is not a number", run.Err);
        var noPressure = await CliRun.RunAsync("thermo", "decompose", "ag", "Ag2O", "--models", _models, "--server", Server);
        Assert.Equal(2, noPressure.ExitCode);
        Assert.Contains("--pressure is required", noPressure.Err);
        var mismatch = Path.Combine(_folder, "mismatch.csv");
        File.WriteAllText(mismatch, "entry_id,formula,standard_entropy_j_per_mol_k,source\nAg,Ag,42.55,x\nAg2O,AgO,57.8,x\n");
        var refused = await CliRun.RunAsync("thermo", "decompose", "ag", "Ag2O", "--pressure", "1", "--models", mismatch, "--server", Server);
        Assert.NotEqual(0, refused.ExitCode);
        Assert.Contains("models[1].model.formula", refused.Err);
    }
}
