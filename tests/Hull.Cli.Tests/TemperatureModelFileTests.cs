using System.Text.Json;
using Hull.Cli.Input;
using Hull.Protos.V1;

namespace Hull.Cli.Tests;

/// <summary>
/// Temperature models in entry files: S° as an entry column, G(T) tables nested in JSON or in a table file of their
/// own; `hull import` carries them, `hull export` gives them back in the same layouts, and bad files are refused with
/// file and line before anything is sent.
/// </summary>
public sealed class TemperatureModelFileTests : ServerBackedTests
{
    // NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982) — from memory: S°(298.15 K) of Ag2O(s)
    // 121.3, Ag(s) 42.55 J/(mol K); ΔfH°(Ag2O) = −31.05 kJ/mol = −0.3218 eV per formula unit (÷ 96.485 kJ/mol per eV).
    private const string SilverCsv = """
        id,formula,energy_ev,basis,standard_entropy_j_per_mol_k,temperature_model_formula
        ag,Ag,0,formation_per_atom,42.55,
        ag2o,Ag2O,-0.3218,formation_per_formula_unit,121.3,Ag2O
        o2,O2,0,formation_per_atom,,
        ag2o-table,Ag2O,-0.3218,formation_per_formula_unit,,
        """;

    // G(T) − H°(298.15 K) = −T S° of Ag2O in the Ellingham approximation, −T × 121.3 / 96485.33212 eV, by hand.
    private const string SilverTables = """
        entry_id,anchor,temperature_k,free_energy_above_anchor_ev
        # Ag2O with S° held constant
        ag2o-table,fitted_298k,300,-0.377156
        ag2o-table,fitted_298k,500,-0.628594
        ag2o-table,fitted_298k,700,-0.880031
        """;

    private static EntryTemperatureModel Entropy(double value, string formula = "") => new() { StandardEntropyJPerMolK = value, Formula = formula };

    private static EntryTemperatureModel SilverOxideTable() => new()
    {
        FreeEnergyTable = new EntryFreeEnergyTable
        {
            Anchor = FreeEnergyAnchor.Fitted298K,
            Rows =
            {
                new EntryFreeEnergyRow { TemperatureK = 300, FreeEnergyAboveAnchorEv = -0.377156 },
                new EntryFreeEnergyRow { TemperatureK = 500, FreeEnergyAboveAnchorEv = -0.628594 },
                new EntryFreeEnergyRow { TemperatureK = 700, FreeEnergyAboveAnchorEv = -0.880031 },
            },
        },
    };

    [Fact]
    public void Csv_columns_and_the_table_file_make_the_models()
    {
        string entries = File("silver.csv", SilverCsv);
        var records = EntryFileReader.Read(entries);
        Assert.Equal(Entropy(42.55), records[0].TemperatureModel);
        Assert.Equal(Entropy(121.3, "Ag2O"), records[1].TemperatureModel);
        Assert.Null(records[2].TemperatureModel);
        Assert.Null(records[3].TemperatureModel);

        var tables = FreeEnergyTableFile.Read(File("tables.csv", SilverTables));
        Assert.Equal(3, Assert.Single(tables).FirstLine);
        var attached = FreeEnergyTableFile.Attach([(entries, records)], "tables.csv", tables);
        Assert.Equal(SilverOxideTable(), attached[0].Records[3].TemperatureModel);
        Assert.Equal(records.Take(3), attached[0].Records.Take(3));
        Assert.Equal(SilverOxideTable(), attached[0].Records[3].ToWire().TemperatureModel);
    }

    [Fact]
    public void Json_entries_carry_entropy_or_a_nested_table()
    {
        var records = EntryFileReader.Read(File("silver.json", """
            [{"id": "ag", "formula": "Ag", "energy_ev": 0, "basis": "formation_per_atom", "standard_entropy_j_per_mol_k": 42.55},
             {"id": "ag2o", "formula": "Ag2O", "energy_ev": -0.3218, "basis": "formation_per_formula_unit", "temperature_model_formula": "Ag2O",
              "free_energy_table": {"anchor": "fitted_298k", "rows": [{"temperature_k": 300, "free_energy_above_anchor_ev": -0.377156},
                {"temperature_k": 500, "free_energy_above_anchor_ev": -0.628594}, {"temperature_k": 700, "free_energy_above_anchor_ev": -0.880031}]}},
             {"id": "o2", "formula": "O2", "energy_ev": 0, "basis": "formation_per_atom", "standard_entropy_j_per_mol_k": null}]
            """));
        Assert.Equal(Entropy(42.55), records[0].TemperatureModel);
        EntryTemperatureModel table = SilverOxideTable();
        table.Formula = "Ag2O";
        Assert.Equal(table, records[1].TemperatureModel);
        Assert.Null(records[2].TemperatureModel);
    }

    [Theory]
    [InlineData("""{"standard_entropy_j_per_mol_k": 121.3, "free_energy_table": {"anchor": "fitted_298k", "rows": []}}""",
        "both \"standard_entropy_j_per_mol_k\" and \"free_energy_table\" are given; an entry has one temperature model")]
    [InlineData("""{"standard_entropy_j_per_mol_k": "121.3"}""", "\"standard_entropy_j_per_mol_k\" must be a finite number of J/(mol K)")]
    [InlineData("""{"free_energy_table": {"anchor": "room", "rows": []}}""", "anchor 'room' is not one of computed_0k, fitted_298k")]
    [InlineData("""{"free_energy_table": {"rows": []}}""", "\"anchor\" must be given as a string")]
    [InlineData("""{"free_energy_table": {"anchor": "computed_0k", "rows": [{"temperature_k": "hot", "free_energy_above_anchor_ev": 0}]}}""",
        "rows[0]: \"temperature_k\" must be a finite number")]
    [InlineData("""{"free_energy_table": {"anchor": "computed_0k", "rows": [{"t": 300}]}}""", "rows[0]: unknown field \"t\"")]
    [InlineData("""{"temperature_model_formula": "Ag2O"}""", "names the temperature-model formula 'Ag2O' but has neither")]
    public void Bad_json_models_are_refused_with_the_entry(string model, string message)
    {
        string json = "[{\"id\": \"ag2o\", \"formula\": \"Ag2O\", \"energy_ev\": -0.3218, \"basis\": \"formation_per_formula_unit\", " + model[1..] + "]";
        string path = File("bad.json", json);
        var e = Assert.Throws<InputFileException>(() =>
        {
            var records = EntryFileReader.Read(path);
            TemperatureModelText.RequireKinds(path, records);
        });
        Assert.Contains("entries[0]", e.Message);
        Assert.Contains(message, e.Message);
    }

    [Theory]
    [InlineData("entry_id,anchor,temperature_k\nx,fitted_298k,300\n", 1, "the header has no 'free_energy_above_anchor_ev' column")]
    [InlineData("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\nag2o-table,warm,300,-0.38\n", 2, "anchor 'warm' is not one of computed_0k, fitted_298k")]
    [InlineData("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\nag2o-table,fitted_298k,300K,-0.38\n", 2, "column 'temperature_k': '300K' is not a finite number of K")]
    [InlineData("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\nag2o-table,fitted_298k,300,-0.38\nag2o-table,computed_0k,500,-0.63\n", 3,
        "entry 'ag2o-table': anchor 'computed_0k' differs from 'fitted_298k' on line 2; one table has one anchor")]
    [InlineData("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\nmissing,fitted_298k,300,-0.38\n", 2, "entry 'missing' is in none of the entry files imported with it")]
    [InlineData("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\nag2o,fitted_298k,300,-0.38\n", 2,
        "entry 'ag2o' already has a standard entropy in silver.csv line 3; an entry has one temperature model")]
    [InlineData("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\n", null, "no points")]
    public void Bad_table_files_are_refused_with_their_line(string text, int? line, string message)
    {
        string entries = File("silver.csv", SilverCsv);
        string tables = File("tables.csv", text);
        var e = Assert.Throws<InputFileException>(() =>
            FreeEnergyTableFile.Attach([(entries, EntryFileReader.Read(entries))], tables, FreeEnergyTableFile.Read(tables)));
        Assert.Equal(line, e.Line);
        Assert.Contains(message, e.Message);
        Assert.Contains("tables.csv", e.Message);
    }

    [Fact]
    public async Task Import_and_export_round_trip_the_models_in_both_layouts()
    {
        string entries = File("silver.csv", SilverCsv);
        string tables = File("tables.csv", SilverTables);
        var imported = await CliRun.RunAsync("import", "one", entries, "--free-energy-tables", tables, "--create", "--server", Server);
        Assert.True(imported.ExitCode == 0, imported.Err);

        // JSON: one file holds everything.
        var json = await CliRun.RunAsync("export", "one", "--json", "--server", Server);
        Assert.Equal(0, json.ExitCode);
        using (JsonDocument document = JsonDocument.Parse(json.Out))
        {
            JsonElement[] rows = [.. document.RootElement.GetProperty("entries").EnumerateArray()];
            Assert.Equal(["ag", "ag2o", "ag2o-table", "o2"], rows.Select(r => r.GetProperty("id").GetString()));
            Assert.Equal(42.55, rows[0].GetProperty("standard_entropy_j_per_mol_k").GetDouble());
            Assert.Equal("Ag2O", rows[1].GetProperty("temperature_model_formula").GetString());
            JsonElement table = rows[2].GetProperty("free_energy_table");
            Assert.Equal("fitted_298k", table.GetProperty("anchor").GetString());
            Assert.Equal([300.0, 500.0, 700.0], table.GetProperty("rows").EnumerateArray().Select(p => p.GetProperty("temperature_k").GetDouble()));
            Assert.False(rows[3].TryGetProperty("standard_entropy_j_per_mol_k", out _));
        }

        // CSV: the tables need a file of their own; without one nothing is written.
        string csv = Path.Combine(Folder, "exported.csv");
        string csvTables = Path.Combine(Folder, "exported-tables.csv");
        var refused = await CliRun.RunAsync("export", "one", "--csv", "-o", csv, "--server", Server);
        Assert.Equal(ExitCodes.Usage, refused.ExitCode);
        Assert.Contains("has G(T) tables on 1 entry; a CSV export writes them to a file of their own: add --free-energy-tables FILE", refused.Err);
        Assert.False(System.IO.File.Exists(csv));
        Assert.Equal(0, (await CliRun.RunAsync("export", "one", "--csv", "-o", csv, "--free-energy-tables", csvTables, "--server", Server)).ExitCode);
        Assert.StartsWith("id,formula,energy_ev,basis,note,standard_entropy_j_per_mol_k,temperature_model_formula", System.IO.File.ReadAllText(csv));
        Assert.Equal("entry_id,anchor,temperature_k,free_energy_above_anchor_ev\nag2o-table,fitted_298k,300,-0.377156\nag2o-table,fitted_298k,500,-0.628594\nag2o-table,fitted_298k,700,-0.880031\n",
            System.IO.File.ReadAllText(csvTables).ReplaceLineEndings("\n"));

        string jsonFile = File("exported.json", json.Out);
        Assert.Equal(0, (await CliRun.RunAsync("import", "two", csv, "--free-energy-tables", csvTables, "--create", "--server", Server)).ExitCode);
        Assert.Equal(0, (await CliRun.RunAsync("import", "three", jsonFile, "--create", "--server", Server)).ExitCode);

        // The same content, models included, in all three datasets.
        string Content(string dataset)
        {
            var run = CliRun.RunAsync("export", dataset, "--json", "--server", Server).GetAwaiter().GetResult();
            using JsonDocument document = JsonDocument.Parse(run.Out);
            return document.RootElement.GetProperty("entries").GetRawText();
        }

        Assert.Equal(Content("one"), Content("two"));
        Assert.Equal(Content("one"), Content("three"));

        // The table view sums up each table in one cell.
        var view = await CliRun.RunAsync("export", "one", "--server", Server);
        Assert.Contains("fitted_298k, 3 points, 300-700 K", view.Out);
    }

    [Fact]
    public async Task A_model_the_server_refuses_is_named_by_file_line_and_field_and_nothing_is_written()
    {
        string entries = File("silver.csv", SilverCsv.Replace("ag2o,Ag2O,-0.3218,formation_per_formula_unit,121.3,Ag2O", "ag2o,Ag2O,-0.3218,formation_per_formula_unit,121.3,AgO"));
        string tables = File("tables.csv", SilverTables.Replace("ag2o-table,fitted_298k,500", "ag2o-table,fitted_298k,250"));
        var run = await CliRun.RunAsync("import", "bad", entries, "--free-energy-tables", tables, "--create", "--server", Server);
        Assert.Equal(ExitCodes.Rejected, run.ExitCode);
        Assert.Contains("silver.csv line 3 (id 'ag2o'), temperature_model.formula: Entry 'ag2o' is Ag2O, but its temperature model (S° = 121.3 J/(mol K) per AgO) is for AgO", run.Err);
        Assert.Contains("silver.csv line 5 (id 'ag2o-table'), temperature_model.free_energy_table.rows: Row 1 of the tabulated free energy of Ag2O is at 250 K, not above row 0 (300 K)", run.Err);
        var versions = await CliRun.RunAsync("versions", "list", "bad", "--json", "--server", Server);
        Assert.DoesNotContain("\"version\"", versions.Out);
    }

    [Fact]
    public async Task Exports_of_datasets_without_models_keep_their_layout()
    {
        string file = File("plain.csv", "id,formula,energy_ev,basis\nag,Ag,0,formation_per_atom\n");
        Assert.Equal(0, (await CliRun.RunAsync("import", "plain", file, "--create", "--server", Server)).ExitCode);
        var csv = await CliRun.RunAsync("export", "plain", "--csv", "--server", Server);
        Assert.Equal("id,formula,energy_ev,basis,note\nag,Ag,0,formation_per_atom,\n", csv.Out.ReplaceLineEndings("\n"));
        var json = await CliRun.RunAsync("export", "plain", "--json", "--server", Server);
        Assert.DoesNotContain("standard_entropy", json.Out);
    }

    [Fact]
    public async Task An_export_with_models_and_uncertainties_has_both_column_pairs_in_the_documented_order_and_imports_again()
    {
        string file = File("both.csv", """
            id,formula,energy_ev,basis,correlation_group,sigma_ev_per_atom,standard_entropy_j_per_mol_k
            ag,Ag,0,formation_per_atom,,,42.55
            ag2o,Ag2O,-0.3218,formation_per_formula_unit,ml,0.02,
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "both", file, "--create", "--server", Server)).ExitCode);
        var csv = await CliRun.RunAsync("export", "both", "--csv", "--server", Server);
        Assert.Equal("""
            id,formula,energy_ev,basis,note,standard_entropy_j_per_mol_k,temperature_model_formula,sigma_ev_per_atom,correlation_group
            ag,Ag,0,formation_per_atom,,42.55,,,
            ag2o,Ag2O,-0.3218,formation_per_formula_unit,,,,0.02,ml

            """.ReplaceLineEndings("\n"), csv.Out.ReplaceLineEndings("\n"));
        string again = File("again.csv", csv.Out);
        Assert.Equal(0, (await CliRun.RunAsync("import", "again", again, "--create", "--server", Server)).ExitCode);
        var second = await CliRun.RunAsync("export", "again", "--csv", "--server", Server);
        Assert.Equal(csv.Out, second.Out);
    }
}
