using Hull.Core.Defects;
using Hull.Server.Defects;
using Hull.Store;

namespace Hull.Server.Tests.Defects;

/// <summary>Studies are read once per content, and a study that cannot be read is not kept.</summary>
public sealed class DefectStudyCacheTests
{
    private const string Json = """
        {"layout": "hull-defect-study-1",
         "host": {"formula": "MgO", "formula_units": 32, "atoms": {"Mg": 32, "O": 32}, "total_energy_ev": -400.0,
                  "lattice_vectors_angstrom": [[10, 0, 0], [0, 10, 0], [0, 0, 10]], "vbm_ev": 2.0, "band_gap_ev": 6.0, "dielectric": 10.0},
         "defects": [{"name": "V_O", "kind": "vacancy", "atoms": {"O": -1}, "site_set": "O", "sites_per_formula_unit": 1, "position_fractional": [0.5, 0.5, 0.5]}]}
        """;

    [Fact]
    public void Equal_texts_give_the_one_study_and_bad_texts_are_read_again()
    {
        var cache = new DefectStudyCache();
        string csv = "defect,charge,total_energy_ev\nV_O,2,-396.1\n";
        string sha = DefectStudyFingerprint.Compute(Json, csv);
        Assert.Same(cache.Get(sha, Json, csv), cache.Get(sha, Json, csv));

        string bad = "defect,charge,total_energy_ev\nV_O,two,-396.1\n";
        string badSha = DefectStudyFingerprint.Compute(Json, bad);
        Assert.Throws<DefectInputException>(() => cache.Get(badSha, Json, bad));
        // Not kept: the same fingerprint with readable texts (as after a fix of the reader) is read afresh.
        Assert.Equal(2, cache.Get(badSha, Json, csv).Defects[0].ChargeStates[0].Charge);
    }
}
