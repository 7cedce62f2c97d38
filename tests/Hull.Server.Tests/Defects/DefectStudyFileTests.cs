using Hull.Core.Defects;
using Hull.Server.Defects;

namespace Hull.Server.Tests.Defects;

/// <summary>The study file reader builds the same study as the model it describes, and says where input is bad.</summary>
public sealed class DefectStudyFileTests
{
    private const string Json = """
        {"layout": "hull-defect-study-1",
         "host": {"formula": "MgO", "formula_units": 32, "atoms": {"Mg": 32, "O": 32}, "total_energy_ev": -400.0,
                  "lattice_vectors_angstrom": [[10, 0, 0], [0, 10, 0], [0, 0, 10]], "vbm_ev": 2.0, "band_gap_ev": 6.0,
                  "dielectric": 10.0},
         "model_charge": {"point": true},
         "defects": [
           {"name": "V_O", "kind": "vacancy", "atoms": {"O": -1}, "site_set": "O", "sites_per_formula_unit": 1,
            "position_fractional": [0.5, 0.5, 0.5]}]}
        """;

    private const string Csv = "defect,charge,total_energy_ev,shift_volts\nV_O,2,-396.1,0.05\nV_O,0,-389.0,\n";

    [Fact]
    public void Reads_the_study_the_file_describes()
    {
        var study = DefectStudyFile.Read(Json, Csv);
        var direct = DefectStudy.Create(
            new BulkSupercell("MgO", 32, new Dictionary<string, int> { ["Mg"] = 32, ["O"] = 32 }, -400.0,
                LatticeCell.Create(new(10, 0, 0), new(0, 10, 0), new(0, 0, 10)), 2.0, 6.0, DielectricTensor.Scalar(10.0)),
            [new DefectInput("V_O", DefectKind.Vacancy, new Dictionary<string, int> { ["O"] = -1 }, "O", SiteDensity.PerFormulaUnit(1), 1, new(0.5, 0.5, 0.5),
                [new ChargeStateInput(2, -396.1, new AlignmentInput.GivenShift(0.05)), new ChargeStateInput(0, -389.0)])],
            ModelCharge.Point);
        var a = study.Defects[0].State(2)!.Correction;
        var b = direct.Defects[0].State(2)!.Correction;
        Assert.Equal(b.ImageChargeEv, a.ImageChargeEv);
        Assert.Equal(b.AlignmentEv, a.AlignmentEv);
        // −qΔV with q = 2, ΔV = 0.05 V (the formula)
        Assert.Equal(-0.1, a.AlignmentEv, 12);
        Assert.Equal(-396.1, study.Defects[0].State(2)!.TotalEnergyEv);
        Assert.Null(study.Defects[0].State(0)!.Correction.Alignment);
    }

    [Fact]
    public void Says_where_the_input_is_bad()
    {
        Assert.Equal("charge_states_csv line 3 column total_energy_ev",
            Assert.Throws<DefectInputException>(() => DefectStudyFile.Read(Json, "defect,charge,total_energy_ev\nV_O,2,-396.1\nV_O,0,abc\n")).Field);
        Assert.Equal("charge_states_csv line 2",
            Assert.Throws<DefectInputException>(() => DefectStudyFile.Read(Json, "defect,charge,total_energy_ev\nV_X,2,-396.1\nV_O,0,-389\n")).Field);
        Assert.Equal("host.band_gap_ev", Assert.Throws<DefectInputException>(() => DefectStudyFile.Read(Json.Replace("\"band_gap_ev\": 6.0", "\"band_gap_ev\": \"6\""), Csv)).Field);
        Assert.Equal("layout", Assert.Throws<DefectInputException>(() => DefectStudyFile.Read(Json.Replace("hull-defect-study-1", "other"), Csv)).Field);
        Assert.Equal("study_json", Assert.Throws<DefectInputException>(() => DefectStudyFile.Read("{", Csv)).Field);
    }

    private static string WithCarriers(string block) => Json.Replace("\"model_charge\": {\"point\": true},", "\"model_charge\": {\"point\": true}, \"carriers\": " + block + ",", StringComparison.Ordinal);

    [Fact]
    public void Reads_the_carriers_block_and_leaves_older_files_without_one()
    {
        Assert.Null(DefectStudyFile.ReadCarriers(Json));
        var states = DefectStudyFile.ReadCarriers(WithCarriers("""
            {"conduction_states_300k_per_cm3": 2.8e19, "valence_states_300k_per_cm3": 1.04e19, "extra_donors_per_cm3": 1e16,
             "gap_temperature": {"alpha_ev_per_k": 4.73e-4, "beta_k": 636, "reference_temperature_k": 0, "valence_band_share": 0.25}}
            """))!;
        var bands = Assert.IsType<ParabolicBands>(states.Bands);
        Assert.Equal(2.8e19, bands.ConductionStates300KPerCubicCentimetre);
        Assert.Equal(1.04e19, bands.ValenceStates300KPerCubicCentimetre);
        Assert.Equal(1e16, states.ExtraDonorsPerCubicCentimetre);
        Assert.Equal(0, states.ExtraAcceptorsPerCubicCentimetre);
        Assert.Equal(new GapTemperatureDependence(4.73e-4, 636, 0, 0.25), states.GapTemperature);

        // N_c = 2 (2π m* k_B T / h²)^{3/2}: with m* = 1 at 300 K, 2.5094e19 cm^-3 (CODATA 2018 m_e, k_B, h; worked by hand).
        var masses = Assert.IsType<ParabolicBands>(DefectStudyFile.ReadCarriers(WithCarriers("""{"electron_mass_ratio": 1.0, "hole_mass_ratio": 4.0}"""))!.Bands);
        Assert.Equal(2.5094e19, masses.ConductionStates300KPerCubicCentimetre, 0.0001e19);
        Assert.Equal(8 * masses.ConductionStates300KPerCubicCentimetre, masses.ValenceStates300KPerCubicCentimetre, 1e6);

        var table = Assert.IsType<TabulatedBands>(DefectStudyFile.ReadCarriers(WithCarriers("""
            {"density_of_states": [{"energy_ev": -2, "states_per_ev_cm3": 1e22}, {"energy_ev": 0, "states_per_ev_cm3": 0},
                                   {"energy_ev": 6, "states_per_ev_cm3": 0}, {"energy_ev": 8, "states_per_ev_cm3": 1e22}]}
            """))!.Bands);
        Assert.Equal([-2.0, 0, 6, 8], table.EnergiesEv);
    }

    [Theory]
    [InlineData("""{"conduction_states_300k_per_cm3": 1e19, "valence_states_300k_per_cm3": 1e19, "electron_mass_ratio": 1}""", "carriers")]
    [InlineData("""{"extra_donors_per_cm3": 1e16}""", "carriers")]
    [InlineData("""{"electron_mass_ratio": 1, "hole_mass_ratio": -2}""", "carriers.hole_mass_ratio")]
    [InlineData("""{"electron_mass_ratio": 1}""", "carriers.hole_mass_ratio")]
    [InlineData("""{"electron_mass_ratio": 1, "hole_mass_ratio": 1, "extra_acceptors_per_cm3": -1}""", "carriers.extra_acceptors_per_cm3")]
    [InlineData("""{"electron_mass_ratio": 1, "hole_mass_ratio": 1, "holes": 1}""", "carriers.holes")]
    [InlineData("""{"electron_mass_ratio": 1, "hole_mass_ratio": 1, "gap_temperature": {"alpha_ev_per_k": 4e-4, "beta_k": 600, "reference_temperature_k": 0, "valence_band_share": 1.5}}""", "carriers.gap_temperature.valence_band_share")]
    [InlineData("""{"electron_mass_ratio": 1, "hole_mass_ratio": 1, "gap_temperature": {"alpha_ev_per_k": 4e-4, "beta_k": 600}}""", "carriers.gap_temperature.reference_temperature_k")]
    [InlineData("""{"density_of_states": [{"energy_ev": -2, "states_per_ev_cm3": 1e22}, {"energy_ev": 0, "states_per_ev_cm3": 0}, {"energy_ev": 3, "states_per_ev_cm3": 5}, {"energy_ev": 8, "states_per_ev_cm3": 1e22}]}""", "carriers.density_of_states[2]")]
    [InlineData("""{"density_of_states": [{"energy_ev": -2, "states_per_ev_cm3": 1e22}, {"energy_ev": -3, "states_per_ev_cm3": 0}, {"energy_ev": 6, "states_per_ev_cm3": 0}, {"energy_ev": 8, "states_per_ev_cm3": 1e22}]}""", "carriers.density_of_states[1].energy_ev")]
    [InlineData("""{"density_of_states": [{"energy_ev": -2}]}""", "carriers.density_of_states[0].states_per_ev_cm3")]
    public void Says_where_the_carriers_block_is_bad(string block, string field)
    {
        Assert.Equal(field, Assert.Throws<DefectInputException>(() => DefectStudyFile.Read(WithCarriers(block), Csv)).Field);
    }

    [Fact]
    public void Reads_the_demo_study()
    {
        // Only that the demo's files are well formed: their numbers are invented and checked nowhere.
        string folder = Path.Combine(FindRepoRoot(), "data-demo", "defects");
        var study = DefectStudyFile.Read(File.ReadAllText(Path.Combine(folder, "al2o3-study.json")), File.ReadAllText(Path.Combine(folder, "al2o3-charge-states.csv")));
        Assert.Equal(4, study.Defects.Count);
    }

    private static string FindRepoRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "Hull.sln"))) dir = dir.Parent;
        return dir?.FullName ?? throw new InvalidOperationException("Hull.sln not found above the test folder");
    }
}
