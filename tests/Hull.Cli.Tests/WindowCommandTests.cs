using System.Globalization;
using System.Text.Json;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>`hull window`, `window-slice` and `dopant-limits` against a real server: columns, formats, exit codes.</summary>
public sealed class WindowCommandTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;

    private string Server => _server.Address.ToString();

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        string file = Path.Combine(_folder, "licoo.csv");
        // Invented formation energies per atom, as in the other CLI tests.
        File.WriteAllText(file, """
            id,formula,energy_ev,basis,note
            Li,Li,0,formation_per_atom,
            Co,Co,0,formation_per_atom,
            O,O,0,formation_per_atom,
            Al,Al,0,formation_per_atom,
            Li2O,Li2O,-2.0,formation_per_atom,
            CoO,CoO,-1.2,formation_per_atom,
            LiCoO2,LiCoO2,-1.8,formation_per_atom,
            LiAlO2,LiAlO2,-2.3,formation_per_atom,
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "w", file, "--create", "--server", Server)).ExitCode);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task Window_rows_are_vertices_with_one_column_per_potential()
    {
        var csv = await CliRun.RunAsync("window", "w", "LiCoO2", "--server", Server, "--csv");
        Assert.Equal(0, csv.ExitCode);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("vertex,dmu_Co_ev,dmu_Li_ev,dmu_O_ev,Li_volts_vs_metal,limiting_phases,at_reference", rows[0]);
        Assert.True(rows.Length >= 4);
        foreach (string row in rows.Skip(1))
        {
            double[] v = row.Split(',')[1..5].Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray();
            // LiCoO2 at −1.8 eV/atom: Δμ_Co + Δμ_Li + 2Δμ_O = −7.2 eV per formula unit; V = −Δμ_Li.
            Assert.Equal(-7.2, v[0] + v[1] + 2 * v[2], 1e-6);
            Assert.Equal(-v[1], v[3], 1e-6);
        }

        var table = await CliRun.RunAsync("window", "w", "LiCoO2", "--by-formula", "--server", Server);
        Assert.Equal(0, table.ExitCode);
        Assert.Contains("window of dimension 2", table.Out);
        Assert.Contains("richest", table.Out);

        var json = await CliRun.RunAsync("dopant-limits", "w", "LiCoO2", "Al", "--server", Server, "--json");
        Assert.Equal(0, json.ExitCode);
        using JsonDocument doc = JsonDocument.Parse(json.Out);
        JsonElement limit = doc.RootElement.GetProperty("limits")[0];
        Assert.Equal("Al", limit.GetProperty("dopant").GetString());
        Assert.Equal("LiAlO2", limit.GetProperty("overall_limiting_phase_ids")[0].GetString());
    }

    [Fact]
    public async Task Bad_window_questions_exit_with_their_codes()
    {
        Assert.Equal(ExitCodes.NotFound, (await CliRun.RunAsync("window", "w", "nope", "--server", Server)).ExitCode);
        var positive = await CliRun.RunAsync("window-slice", "w", "LiCoO2", "--fix", "O=0.5", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, positive.ExitCode);
        Assert.Contains("above the element's reference", positive.Err);
        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("window-slice", "w", "LiCoO2", "--fix", "O", "--server", Server)).ExitCode);
        var inHost = await CliRun.RunAsync("dopant-limits", "w", "LiCoO2", "Co", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, inHost.ExitCode);
        Assert.Contains("already an element of the host", inHost.Err);
        var miss = await CliRun.RunAsync("window-slice", "w", "LiCoO2", "--fix", "O=-20", "--server", Server);
        Assert.Equal(0, miss.ExitCode);
        Assert.Contains("the slice misses the window", miss.Out);
    }

    [Fact]
    public async Task A_computed_molecule_option_reads_oxygen_against_the_datasets_total_energy_reference()
    {
        // The Li-Co-O set above in total energies per formula unit (invented): references Li −1.9, Co −7.1,
        // O −4.95 eV/atom, each compound's total = Σ references + its formation energy × atoms.
        string file = Path.Combine(_folder, "licoo-total.csv");
        File.WriteAllText(file, """
            id,formula,energy_ev,basis
            Li,Li,-1.9,total_per_formula_unit
            Co,Co,-7.1,total_per_formula_unit
            O2,O2,-9.9,total_per_formula_unit
            Li2O,Li2O,-14.75,total_per_formula_unit
            CoO,CoO,-14.45,total_per_formula_unit
            LiCoO2,LiCoO2,-26.1,total_per_formula_unit
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "t", file, "--create", "--server", Server)).ExitCode);

        var csv = await CliRun.RunAsync("window", "t", "LiCoO2", "--gas-temperature", "1000", "--gas-molecule", "O2=-9.86,0.098", "--server", Server, "--csv");
        Assert.Equal(0, csv.ExitCode);
        string[] rows = csv.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        string[] header = rows[0].Split(',');
        int mu = Array.IndexOf(header, "dmu_O_ev"), log10 = Array.IndexOf(header, "log10_p_O2_bar");
        Assert.True(mu >= 0 && log10 >= 0, rows[0]);
        foreach (string row in rows.Skip(1))
        {
            string[] cells = row.Split(',');
            // Δμ_O(1000 K, p) = −1.030608 eV + ½ k_B·1000·ln p for this molecule against E_ref(O) = −4.95 eV/atom (worked
            // in the server's window gas tests from the NIST-JANAF O2 rows): log10 p = 2 (Δμ_O + 1.030608) / (k_B·1000·ln 10).
            double hand = 2 * (double.Parse(cells[mu], CultureInfo.InvariantCulture) + 1.030608) / (8.617333262e-5 * 1000 * Math.Log(10));
            Assert.Equal(hand, double.Parse(cells[log10], CultureInfo.InvariantCulture), 2e-3);
        }

        Assert.Equal(ExitCodes.Usage, (await CliRun.RunAsync("window", "t", "LiCoO2", "--gas-molecule", "O2=-9.86", "--server", Server)).ExitCode);
        var notGas = await CliRun.RunAsync("window", "t", "LiCoO2", "--gas-molecule", "Mg=-1,0", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, notGas.ExitCode);
        Assert.Contains("settings.gas_molecules[0].gas", notGas.Err);
        var formation = await CliRun.RunAsync("window", "w", "LiCoO2", "--gas-temperature", "1000", "--gas-molecule", "O2=-9.86,0.098", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, formation.ExitCode);
        Assert.Contains("reference for O", formation.Err);
    }

    [Fact]
    public async Task Window_figure_writes_the_svg_and_lists_the_drawn_vertices()
    {
        string path = Path.Combine(_folder, "licoo2-window.svg");
        var run = await CliRun.RunAsync("window-figure", "w", "LiCoO2", "--x", "Li", "--y", "Co", "--output", path, "--server", Server, "--csv");
        Assert.Equal(0, run.ExitCode);
        string svg = File.ReadAllText(path);
        Assert.StartsWith("<?xml", svg, StringComparison.Ordinal);
        Assert.Contains("x-element=\"Li\" y-element=\"Co\" dependent=\"O\"", svg, StringComparison.Ordinal);
        string[] rows = run.Out.Split(Environment.NewLine, StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal("vertex,dmu_Co_ev,dmu_Li_ev,dmu_O_ev,Li_volts_vs_metal,limiting_phases,at_reference", rows[0]);
        int markers = svg.Split("data-kind=\"window-vertex\"").Length - 1;
        Assert.Equal(rows.Length - 1, markers);

        var table = await CliRun.RunAsync("window-figure", "w", "LiCoO2", "--output", path, "--server", Server);
        Assert.Contains("drawn on dmu_Co (x) and dmu_Li (y), dmu_O from the compound's energy", table.Out);
        var section = await CliRun.RunAsync("window-figure", "w", "LiCoO2", "--at", "O=-1", "--output", path, "--server", Server);
        Assert.Equal(ExitCodes.Rejected, section.ExitCode);
        Assert.Contains("takes no section potentials", section.Err);
    }
}
