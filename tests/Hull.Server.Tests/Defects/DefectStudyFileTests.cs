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
