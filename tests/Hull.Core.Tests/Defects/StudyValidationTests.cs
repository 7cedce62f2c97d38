using Hull.Core.Defects;

namespace Hull.Core.Tests.Defects;

/// <summary>Inconsistent study input is refused with a message that says what and a field that says where.</summary>
public sealed class StudyValidationTests
{
    private static DefectInputException Refused(Func<DefectStudy> create) => Assert.Throws<DefectInputException>(() => create());

    [Fact]
    public void Charge_state_listed_twice()
    {
        var defects = WorkedDefectStudy.Defects();
        defects[0] = defects[0] with { ChargeStates = [.. defects[0].ChargeStates, defects[0].ChargeStates[0]] };
        var e = Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), defects));
        Assert.Equal("defects[0].charge_states[3].charge", e.Field);
        Assert.Contains("twice", e.Message);
    }

    [Fact]
    public void Supercell_atoms_that_do_not_match_bulk_plus_defect()
    {
        var defects = WorkedDefectStudy.Defects();
        var state = defects[0].ChargeStates[0] with { SupercellAtoms = new Dictionary<string, int> { ["Mg"] = 32, ["O"] = 32 } };
        defects[0] = defects[0] with { ChargeStates = [state, .. defects[0].ChargeStates.Skip(1)] };
        var e = Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), defects));
        Assert.Equal("defects[0].charge_states[0].supercell_atoms.O", e.Field);
        Assert.Contains("make 31", e.Message);
        // the right counts pass
        defects[0] = defects[0] with { ChargeStates = [state with { SupercellAtoms = new Dictionary<string, int> { ["Mg"] = 32, ["O"] = 31 } }, .. defects[0].ChargeStates.Skip(1)] };
        DefectStudy.Create(WorkedDefectStudy.Bulk(), defects);
    }

    [Fact]
    public void Bulk_atoms_that_do_not_match_the_formula_units()
    {
        var bulk = WorkedDefectStudy.Bulk() with { Atoms = new Dictionary<string, int> { ["Mg"] = 32, ["O"] = 30 } };
        Assert.Equal("bulk.atoms.O", Refused(() => DefectStudy.Create(bulk, WorkedDefectStudy.Defects())).Field);
    }

    [Fact]
    public void Atoms_that_do_not_fit_the_kind()
    {
        var defects = WorkedDefectStudy.Defects();
        defects[0] = defects[0] with { AtomsExchanged = new Dictionary<string, int> { ["O"] = 1 } };
        var e = Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), defects));
        Assert.Equal("defects[0].atoms", e.Field);
        Assert.Contains("a vacancy removes atoms", e.Message);
        var removeTooMany = WorkedDefectStudy.Defects();
        removeTooMany[0] = removeTooMany[0] with { AtomsExchanged = new Dictionary<string, int> { ["O"] = -33 } };
        Assert.Contains("holds 32", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), removeTooMany)).Message);
    }

    [Fact]
    public void Complex_whose_atoms_are_not_its_parts()
    {
        var defects = WorkedDefectStudy.Defects();
        defects[2] = defects[2] with { AtomsExchanged = new Dictionary<string, int> { ["Li"] = 1, ["Mg"] = -1 } };
        var e = Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), defects));
        Assert.Equal("defects[2].atoms", e.Field);
        Assert.Contains("constituents together exchange", e.Message);
        var unknown = WorkedDefectStudy.Defects();
        unknown[2] = unknown[2] with { Constituents = ["V_O", "Na_Mg"] };
        Assert.Equal("defects[2].constituents[1]", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), unknown)).Field);
    }

    [Fact]
    public void Dielectric_tensor_that_is_not_positive_definite()
    {
        // eigenvalues of [[2, 3], [3, 2]] are 5 and −1 (worked by hand)
        var e = Assert.Throws<DefectInputException>(() => DielectricTensor.FromMatrix(Matrix3.FromRows([[2.0, 3.0, 0.0], [3.0, 2.0, 0.0], [0.0, 0.0, 4.0]])));
        Assert.Contains("not positive definite", e.Message);
        Assert.Contains("not symmetric", Assert.Throws<DefectInputException>(() => DielectricTensor.FromMatrix(Matrix3.FromRows([[5.0, 1.0, 0.0], [0.0, 5.0, 0.0], [0.0, 0.0, 5.0]]))).Message);
        Assert.Throws<DefectInputException>(() => DielectricTensor.Scalar(-3));
    }

    [Fact]
    public void Singular_lattice()
    {
        var e = Assert.Throws<DefectInputException>(() => LatticeCell.Create(new(5, 0, 0), new(0, 5, 0), new(5, 5, 0)));
        Assert.Contains("singular", e.Message);
        Assert.Equal("lattice_vectors_angstrom", e.Field);
    }

    [Fact]
    public void Unknown_element_and_bad_numbers()
    {
        var defects = WorkedDefectStudy.Defects();
        defects[1] = defects[1] with { AtomsExchanged = new Dictionary<string, int> { ["Xx"] = 1, ["Mg"] = -1 } };
        Assert.Equal("defects[1].atoms.Xx", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), defects)).Field);
        Assert.Equal("bulk.band_gap_ev", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk() with { BandGapEv = 0 }, WorkedDefectStudy.Defects())).Field);
        var degenerate = WorkedDefectStudy.Defects();
        degenerate[0] = degenerate[0] with { Degeneracy = 0 };
        Assert.Equal("defects[0].degeneracy", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), degenerate)).Field);
        var twice = WorkedDefectStudy.Defects();
        twice[1] = twice[1] with { Name = "V_O" };
        Assert.Equal("defects[1].name", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), twice)).Field);
    }

    [Fact]
    public void Bad_alignment_input_is_refused_at_creation_with_its_path()
    {
        var defects = WorkedDefectStudy.Defects();
        var state = defects[0].ChargeStates[0] with { Alignment = new AlignmentInput.PlanarAverages([new PlanarProfile(5, new double[8], new double[8])]) };
        defects[0] = defects[0] with { ChargeStates = [state, .. defects[0].ChargeStates.Skip(1)] };
        Assert.Equal("defects[0].charge_states[0].alignment.profiles[0].axis", Refused(() => DefectStudy.Create(WorkedDefectStudy.Bulk(), defects)).Field);
    }

    [Fact]
    public void Site_density_per_formula_unit_converts_to_per_cubic_centimetre()
    {
        // Worked by hand: 32 sites in 1000 Å³ = 1e-21 cm³ → 3.2e22 cm^-3.
        Assert.Equal(3.2e22, SiteDensity.PerFormulaUnit(1).SitesPerCubicCentimetre(32, 1000), 1e10);
    }
}
