using System.Globalization;
using System.Text.Json;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>`hull defects ...` against a real server: import, CSV columns per correction term, levels, figure, export, usage errors.</summary>
public sealed class DefectCommandTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;

    private string Server => _server.Address.ToString();

    private string StudyJson => Path.Combine(_folder, "study.json");

    private string StudyCsv => Path.Combine(_folder, "states.csv");

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        string entries = Path.Combine(_folder, "mgo.csv");
        // Test inputs: MgO at −3.0 eV/atom (−6.0 eV per formula unit) with total-energy references.
        File.WriteAllText(entries, """
            id,formula,energy_ev,basis,note
            Mg,Mg,-1.5,total_per_atom,
            O,O,-4.9,total_per_atom,
            MgO,MgO,-6.0,formation_per_formula_unit,
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "m", entries, "--create", "--server", Server)).ExitCode);
        // Bulk per formula unit: −6.0 − 1.5 − 4.9 = −12.4 eV, 32 formula units.
        File.WriteAllText(StudyJson, """
            {"layout": "hull-defect-study-1",
             "host": {"formula": "MgO", "formula_units": 32, "atoms": {"Mg": 32, "O": 32}, "total_energy_ev": -396.8,
                      "lattice_vectors_angstrom": [[8.4, 0, 0], [0, 8.4, 0], [0, 0, 8.4]], "vbm_ev": 1.0, "band_gap_ev": 7.0, "dielectric": 9.8},
             "defects": [{"name": "V_O", "kind": "vacancy", "atoms": {"O": -1}, "site_set": "O", "sites_per_formula_unit": 1, "position_fractional": [0, 0, 0]}]}
            """);
        File.WriteAllText(StudyCsv, "defect,charge,total_energy_ev\nV_O,2,-388.8\nV_O,0,-385.8\n");
        var imported = await CliRun.RunAsync("defects", "import", "m", "mgo-vo", StudyJson, StudyCsv, "--server", Server);
        Assert.True(imported.ExitCode == 0, imported.Err);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task Energies_come_as_csv_with_a_column_per_term()
    {
        var csv = await CliRun.RunAsync("defects", "energies", "m", "mgo-vo", "--vertex", "O", "--fermi", "0", "--fermi", "2", "--csv", "--server", Server);
        Assert.True(csv.ExitCode == 0, csv.Err);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("point,defect,charge,fermi_level_ev,formation_energy_ev,supercell_difference_ev,chemical_potential_ev,electron_reservoir_ev,image_charge_ev,alignment_ev,correction_ev,lowest", rows[0]);
        Assert.Equal(5, rows.Length);
        foreach (string row in rows.Skip(1))
        {
            // The terms add up to E_f, whatever the point.
            double[] v = row.Split(',')[4..11].Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray();
            Assert.Equal(v[0], v[1] + v[2] + v[3] + v[6], 1e-3);
            Assert.Equal(v[6], v[4] + v[5], 1e-3);
        }

        // V_O 0 at the O-rich vertex: E(def) − E(bulk) − (−1)(μ_O^ref + 0) = 11.0 − 4.9 = 6.1 eV.
        string neutral = rows.Single(r => r.Contains(",V_O,0,0,", StringComparison.Ordinal));
        Assert.Equal(6.1, double.Parse(neutral.Split(',')[4], CultureInfo.InvariantCulture), 1e-4);

        var json = await CliRun.RunAsync("defects", "energies", "m", "mgo-vo", "--json", "--server", Server);
        using JsonDocument doc = JsonDocument.Parse(json.Out);
        Assert.Equal(2, doc.RootElement.GetProperty("points").GetArrayLength());
    }

    [Fact]
    public async Task Levels_figure_and_export_work_from_the_command_line()
    {
        var levels = await CliRun.RunAsync("defects", "levels", "m", "mgo-vo", "--vertex", "1", "--server", Server);
        Assert.True(levels.ExitCode == 0, levels.Err);
        Assert.Contains("+2/0", levels.Out);
        Assert.Contains("thermodynamic", levels.Out);

        string svg = Path.Combine(_folder, "f.svg");
        var figure = await CliRun.RunAsync("defects", "figure", "m", "mgo-vo", "--vertex", "O", "-o", svg, "--server", Server);
        Assert.True(figure.ExitCode == 0, figure.Err);
        Assert.StartsWith("<?xml", File.ReadAllText(svg), StringComparison.Ordinal);

        string jsonOut = Path.Combine(_folder, "out.json"), csvOut = Path.Combine(_folder, "out.csv");
        var export = await CliRun.RunAsync("defects", "export", "m", "mgo-vo", "--study-json-out", jsonOut, "--charge-states-out", csvOut, "--server", Server);
        Assert.True(export.ExitCode == 0, export.Err);
        Assert.Equal(File.ReadAllBytes(StudyJson), File.ReadAllBytes(jsonOut));
        Assert.Equal(File.ReadAllBytes(StudyCsv), File.ReadAllBytes(csvOut));

        var listed = await CliRun.RunAsync("defects", "list", "m", "--csv", "--server", Server);
        Assert.Contains("mgo-vo,1", listed.Out);
    }

    [Fact]
    public async Task Conflicting_or_incomplete_conditions_are_usage_errors()
    {
        var both = await CliRun.RunAsync("defects", "energies", "m", "mgo-vo", "--vertex", "O", "--gas", "O2", "--server", Server);
        Assert.Equal(2, both.ExitCode);
        Assert.Contains("give one of --vertex, --point or --gas", both.Err);
        var noT = await CliRun.RunAsync("defects", "energies", "m", "mgo-vo", "--gas", "O2", "--server", Server);
        Assert.Equal(2, noT.ExitCode);
        var badVertex = await CliRun.RunAsync("defects", "energies", "m", "mgo-vo", "--vertex", "Zn", "--server", Server);
        Assert.NotEqual(0, badVertex.ExitCode);
        Assert.Contains("conditions.vertex", badVertex.Err);
    }

    private async Task ImportWithCarriers()
    {
        // Invented band inputs of the test: N_c, N_v at 300 K and a background donor.
        string json = File.ReadAllText(StudyJson).Replace("\"defects\":", "\"carriers\": {\"conduction_states_300k_per_cm3\": 5e18, \"valence_states_300k_per_cm3\": 2e19, \"extra_donors_per_cm3\": 1e12},\n \"defects\":", StringComparison.Ordinal);
        string path = Path.Combine(_folder, "study-carriers.json");
        File.WriteAllText(path, json);
        var imported = await CliRun.RunAsync("defects", "import", "m", "mgo-vo-c", path, StudyCsv, "--server", Server);
        Assert.True(imported.ExitCode == 0, imported.Err);
    }

    [Fact]
    public async Task Fermi_levels_come_as_csv_equal_to_the_json_and_their_concentrations_balance()
    {
        await ImportWithCarriers();
        var csv = await CliRun.RunAsync("defects", "fermi", "m", "mgo-vo-c", "--solve-at", "1800", "--quench-to", "300", "--csv", "--server", Server);
        Assert.True(csv.ExitCode == 0, csv.Err);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("point,state,temperature_k,fermi_level_ev,electrons_per_cm3,holes_per_cm3,status,form,statistics", rows[0]);
        // MgO has two vertices (O-rich, Mg-rich), each grown and quenched.
        Assert.Equal(5, rows.Length);
        var json = await CliRun.RunAsync("defects", "fermi", "m", "mgo-vo-c", "--solve-at", "1800", "--quench-to", "300", "--json", "--server", Server);
        using var doc = JsonDocument.Parse(json.Out);
        var first = doc.RootElement.GetProperty("points")[0];
        double fermi = double.Parse(rows[1].Split(',')[3], CultureInfo.InvariantCulture);
        Assert.Equal(first.GetProperty("equilibrium").GetProperty("fermi_level_ev").GetDouble(), fermi);
        Assert.Equal("frozen", first.GetProperty("quenched").GetProperty("form").GetString());

        // Charge neutrality from the printed numbers: p − n + N_D + Σ q c_q = 0 (the solve's condition, re-summed here).
        var states = await CliRun.RunAsync("defects", "fermi", "m", "mgo-vo-c", "--solve-at", "1800", "--vertex", "O", "--charge-states", "--csv", "--server", Server);
        Assert.True(states.ExitCode == 0, states.Err);
        string[] stateRows = states.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("point,state,temperature_k,defect,charge,formation_energy_ev,per_cm3", stateRows[0]);
        var solution = JsonDocument.Parse((await CliRun.RunAsync("defects", "fermi", "m", "mgo-vo-c", "--solve-at", "1800", "--vertex", "O", "--json", "--server", Server)).Out)
            .RootElement.GetProperty("points")[0].GetProperty("equilibrium");
        double charge = solution.GetProperty("holes_per_cm3").GetDouble() - solution.GetProperty("electrons_per_cm3").GetDouble() + 1e12;
        double scale = solution.GetProperty("holes_per_cm3").GetDouble() + solution.GetProperty("electrons_per_cm3").GetDouble() + 1e12;
        foreach (string row in stateRows.Skip(1))
        {
            string[] cells = row.Split(',');
            double q = double.Parse(cells[4], CultureInfo.InvariantCulture), c = double.Parse(cells[6], CultureInfo.InvariantCulture);
            charge += q * c;
            scale += Math.Abs(q) * c;
        }

        Assert.True(Math.Abs(charge) < 1e-8 * scale, $"net charge {charge} of {scale}");
    }

    [Fact]
    public async Task Carrier_figure_is_written_and_carrier_questions_say_what_is_missing()
    {
        await ImportWithCarriers();
        string svg = Path.Combine(_folder, "carriers.svg");
        var figure = await CliRun.RunAsync("defects", "carrier-figure", "m", "mgo-vo-c", "--vertex", "O", "--sweep", "1000", "--sweep", "1500", "--sweep", "2000", "-o", svg, "--server", Server);
        Assert.True(figure.ExitCode == 0, figure.Err);
        Assert.Contains("kind=\"carriers\"", File.ReadAllText(svg));

        var noTemperature = await CliRun.RunAsync("defects", "fermi", "m", "mgo-vo-c", "--server", Server);
        Assert.Equal(2, noTemperature.ExitCode);
        Assert.Contains("--solve-at", noTemperature.Err);
        var noCarriers = await CliRun.RunAsync("defects", "fermi", "m", "mgo-vo", "--solve-at", "1000", "--server", Server);
        Assert.NotEqual(0, noCarriers.ExitCode);
        Assert.Contains("no \"carriers\" block", noCarriers.Err);
        var noDopant = await CliRun.RunAsync("defects", "solubility", "m", "mgo-vo-c", "--growth", "1500", "--server", Server);
        Assert.NotEqual(0, noDopant.ExitCode);
        Assert.Contains("dopant", noDopant.Err);
    }
}
