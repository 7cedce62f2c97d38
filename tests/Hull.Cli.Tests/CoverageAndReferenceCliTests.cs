using System.Text.Json;
using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>
/// `hull` warns when an answer comes from a thinly covered system, takes explicit elemental references, reports
/// systems without a reference instead of failing, and names file lines when a file's row is refused.
/// </summary>
public sealed class CoverageAndReferenceCliTests : IAsyncLifetime
{
    private HullServer _server = null!;
    private string _folder = null!;

    private string Server => _server.Address.ToString();

    public async Task InitializeAsync()
    {
        (_server, _folder) = await CliRun.StartServerAsync();
        string file = Path.Combine(_folder, "mgzr.csv");
        // Total energies; no pure Zr entry.
        System.IO.File.WriteAllText(file, """
            id,formula,energy_ev,basis,note
            O2,O2,-4.93,total_per_atom,
            Mg,Mg,-1.54,total_per_atom,
            MgO,MgO,-12.0,total_per_formula_unit,
            ZrO2,ZrO2,-28.5,total_per_formula_unit,
            """);
        var import = await CliRun.RunAsync("import", "mgzr", file, "--create", "--server", Server, "--quiet");
        Assert.Equal(0, import.ExitCode);
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task A_candidate_against_an_element_without_entries_warns()
    {
        var result = await CliRun.RunAsync("assess", "mgzr", "TiO2", "-3.0", "--server", Server);
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("warning: O-Ti: the dataset has no entry of Ti", result.Err);
        Assert.Contains("warning: O-Ti: no competing phase", result.Err);

        var covered = await CliRun.RunAsync("assess", "mgzr", "MgO2", "-1.0", "--server", Server);
        Assert.Equal(0, covered.ExitCode);
        Assert.DoesNotContain("warning", covered.Err);
    }

    [Fact]
    public async Task An_explicit_reference_answers_a_total_energy_and_is_recorded()
    {
        var refused = await CliRun.RunAsync("stability", "mgzr", "ZrO2", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, refused.ExitCode);
        Assert.Contains("element Zr", refused.Err);

        var answered = await CliRun.RunAsync("stability", "mgzr", "ZrO2", "--reference", "Zr=-8.5", "--server", Server, "--json");
        Assert.Equal(0, answered.ExitCode);
        using JsonDocument json = JsonDocument.Parse(answered.Out);
        JsonElement zr = json.RootElement.GetProperty("references").EnumerateArray().Single(r => r.GetProperty("symbol").GetString() == "Zr");
        Assert.True(zr.GetProperty("given_by_caller").GetBoolean());
        Assert.Contains("warning: O-Zr: the dataset has no entry of Zr", answered.Err);

        var bad = await CliRun.RunAsync("stability", "mgzr", "ZrO2", "--reference", "Zr:-8.5", "--server", Server);
        Assert.Equal(ExitCodes.Usage, bad.ExitCode);
        Assert.Contains("--reference Zr:-8.5: write SYMBOL=EV_PER_ATOM", bad.Err);
    }

    [Fact]
    public async Task The_analysis_answers_the_rest_and_reports_the_system_without_reference()
    {
        var result = await CliRun.RunAsync("analyze", "mgzr", "--server", Server);
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("MgO", result.Out);
        Assert.DoesNotContain("ZrO2", result.Out);
        Assert.Contains("warning: chemical system O-Zr cannot be analysed: no elemental reference for Zr", result.Err);
        Assert.Contains("Without a result: ZrO2.", result.Err);
    }

    [Fact]
    public async Task A_refused_candidate_from_a_file_is_named_by_file_line_and_id()
    {
        string file = Path.Combine(_folder, "candidates.csv");
        System.IO.File.WriteAllText(file, """
            id,formula,energy_ev,basis,note
            fine,MgO2,-1.0,formation_per_atom,
            huge,MgO,-1e300,formation_per_atom,
            """);
        var result = await CliRun.RunAsync("assess", "mgzr", "--file", file, "--server", Server);
        Assert.Equal(ExitCodes.Rejected, result.ExitCode);
        Assert.Contains("candidates.csv line 3 (id 'huge'), energy_ev: formation energy -1E+300 eV/atom is outside the accepted ±100 eV/atom", result.Err);
        Assert.True(result.Err.Length < 2000, "no 300-digit numbers");
    }
}
