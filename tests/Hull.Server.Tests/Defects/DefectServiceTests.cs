using System.Xml.Linq;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests.Defects;

/// <summary>
/// The defect service over gRPC on a corundum host built from handbook enthalpies: formation energies at the
/// window's vertices and at (T, p) worked by hand, transition levels and negative-U of a constructed vacancy, the
/// image-charge term against the published Madelung constant, byte-for-byte export, and every listed bad input.
/// </summary>
public sealed partial class DefectServiceTests : IAsyncLifetime
{
    // 1 eV per particle = 96.485 kJ/mol (CODATA: e * N_A = 96 485.33 C/mol).
    private const double KilojoulesPerMolePerEv = 96.485;

    // CRC Handbook of Chemistry and Physics, 97th ed. (2016), section 5, ΔfH°(298.15 K) in kJ/mol — from memory.
    // Per formula unit: h_A = −1675.7/96.485 = −17.367466445561 eV, h_M = −6.235166087993, h_S = −23.836865834067.
    private const double Corundum = -1675.7, Periclase = -601.6, Spinel = -2299.9;

    // Elemental references (total energy per atom) of the test dataset: inputs of the test, not outside values.
    private const double AlRef = -3.75, MgRef = -1.6, ORef = -4.95;

    // Madelung constant of a point charge in a neutralising background, simple cubic lattice, referred to the cube
    // edge (Leslie & Gillan, J. Phys. C 18, 973 (1985)): 2.8373; e²/4πε0 = 14.3996 eV Å (CODATA). For L = 10 Å and
    // ε = 10: E_lat(q) = q² α 14.3996 / (2 ε L) = q² × 0.20428 eV. The literal's five digits bound the tolerance.
    private const double MadelungSimpleCubic = 2.8373;
    private const double ImageChargeToleranceEv = 2e-5;
    private static double ImageCharge(int q) => q * q * MadelungSimpleCubic * 14.3996 / (2 * 10.0 * 10.0);

    // Bulk: 8 Al2O3 at the dataset's own energy per formula unit, h_A + 2 AlRef + 3 ORef = −39.717466445561 eV.
    private const double BulkEv = -317.7397;

    private static string Json(double bulkEv = BulkEv) => $$"""
        {"layout": "hull-defect-study-1",
         "host": {"formula": "Al2O3", "formula_units": 8, "atoms": {"Al": 16, "O": 24}, "total_energy_ev": {{bulkEv.ToString(System.Globalization.CultureInfo.InvariantCulture)}},
                  "lattice_vectors_angstrom": [[10, 0, 0], [0, 10, 0], [0, 0, 10]], "vbm_ev": 2.0, "band_gap_ev": 6.0, "dielectric": 10.0},
         "model_charge": {"point": true},
         "defects": [
           {"name": "V_O", "kind": "vacancy", "atoms": {"O": -1}, "site_set": "O", "sites_per_formula_unit": 3, "position_fractional": [0, 0, 0]},
           {"name": "Mg_Al", "kind": "substitution", "atoms": {"Mg": 1, "Al": -1}, "site_set": "Al", "sites_per_formula_unit": 2, "position_fractional": [0.5, 0.5, 0.5]}]}
        """;

    // E(X^q) − E(bulk): V_O +2: 4, +1: 8, 0: 10 eV; Mg_Al 0: 8 eV. CRLF line ends and a trailing blank line, to see
    // that the export gives the bytes back.
    private const string Csv = "defect,charge,total_energy_ev,shift_volts\r\nV_O,2,-313.7397,0.05\r\nV_O,1,-309.7397,\r\nV_O,0,-307.7397,\r\nMg_Al,0,-309.7397,\r\n\r\n";

    private const double Tolerance = 1e-6;

    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        Entry Fu(string id, string formula, double kjPerMol) => new() { Id = id, Formula = formula, EnergyEv = kjPerMol / KilojoulesPerMolePerEv, Basis = EnergyBasis.FormationPerFormulaUnit };
        Entry Ref(string id, string formula, double ev) => new() { Id = id, Formula = formula, EnergyEv = ev, Basis = EnergyBasis.TotalPerAtom };
        await Data.CreateWithAsync(C, "d", Ref("Al", "Al", AlRef), Ref("Mg", "Mg", MgRef), Ref("O", "O", ORef),
            Fu("corundum", "Al2O3", Corundum), Fu("periclase", "MgO", Periclase), Fu("spinel", "MgAl2O4", Spinel));
        await Data.CreateWithAsync(C, "no-mg", Ref("Al", "Al", AlRef), Ref("O", "O", ORef), Fu("corundum", "Al2O3", Corundum));
        await Import("d", "s", Json(), Csv);
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private Task<ImportDefectStudyResponse> Import(string dataset, string name, string json, string csv) =>
        C.Defects.ImportDefectStudyAsync(new ImportDefectStudyRequest { Dataset = dataset, StudyName = name, StudyJson = json, ChargeStatesCsv = csv, SourceLabel = "test" }, C.Call()).ResponseAsync;

    private static DefectFormationEnergy Of(DefectPointEnergies p, string defect, int q) => p.Energies.Single(e => e.Defect == defect && e.Charge == q);

    [Fact]
    public async Task Formation_energies_at_both_vertices_are_the_hand_worked_ones()
    {
        var response = await C.Defects.GetDefectFormationEnergiesAsync(new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "s" }, C.Call());
        Assert.Equal("corundum", response.HostEntryId);
        Assert.Empty(response.Warnings);
        Assert.Equal(2, response.Points.Count);
        DefectPointEnergies oRich = response.Points.Single(p => p.Point.Label == "O"), alRich = response.Points.Single(p => p.Point.Label == "Al");
        Assert.Equal(["Al", "O", "Mg"], oRich.Point.Potentials.Select(p => p.Element));

        // O-rich: Δμ_O = 0, Δμ_Al = h_A/2 = −8.683733222781, Δμ_Mg at the spinel limit h_S − h_A = −6.469399388506.
        // V_O 0: 10 − (−1)(ORef + 0) = 5.05. V_O +2 at E_F = 0: 4 + ORef + 2 × 2.0 + E_lat(2) − 2 × 0.05.
        Assert.Equal(5.05, Of(oRich, "V_O", 0).FormationEnergyEv, Tolerance);
        DefectFormationEnergy v2 = Of(oRich, "V_O", 2);
        Assert.Equal(ImageCharge(2), v2.ImageChargeEv, ImageChargeToleranceEv);
        Assert.Equal(-0.1, v2.AlignmentEv, 12);
        Assert.Equal(4.0, v2.SupercellDifferenceEv, Tolerance);
        Assert.Equal(4.0, v2.ElectronReservoirEv, 12);
        Assert.Equal(4 + ORef + 4 + ImageCharge(2) - 0.1, v2.FormationEnergyEv, ImageChargeToleranceEv);
        Assert.True(v2.Lowest);
        // Mg_Al 0: 8 − [(MgRef + Δμ_Mg) − (AlRef + Δμ_Al)] = 5.85 − Δμ_Mg + Δμ_Al.
        Assert.Equal(5.85 + 6.469399388506 - 8.683733222781, Of(oRich, "Mg_Al", 0).FormationEnergyEv, Tolerance);
        DefectDopantPotential mg = Assert.Single(oRich.Point.Dopants);
        Assert.Equal(["spinel"], mg.LimitingPhaseIds);

        // Al-rich: Δμ_O = h_A/3 = −5.789155481854, Mg at the spinel limit h_S − 4Δμ_O = −0.680243906651.
        Assert.Equal(5.05 - 5.789155481854, Of(alRich, "V_O", 0).FormationEnergyEv, Tolerance);
        Assert.Equal(5.85 + 0.680243906651 - 0.0, Of(alRich, "Mg_Al", 0).FormationEnergyEv, Tolerance);

        // Every correction term on its own: E_lat(1) for V_O +1, no alignment input there.
        DefectChargeStateCorrection c1 = response.Corrections.Single(c => c.Defect == "V_O" && c.Charge == 1);
        Assert.Equal(ImageCharge(1), c1.ImageChargeEv, ImageChargeToleranceEv);
        Assert.Equal("none", c1.AlignmentMethod);
        Assert.Equal("given", response.Corrections.Single(c => c.Defect == "V_O" && c.Charge == 2).AlignmentMethod);
    }

    [Fact]
    public async Task Fermi_levels_move_each_state_by_q_and_mark_the_lowest()
    {
        var request = new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "s", Conditions = new DefectConditions { Vertex = "O" } };
        request.FermiLevelsEv.AddRange([0.0, 3.0]);
        request.Defects.Add("V_O");
        var response = await C.Defects.GetDefectFormationEnergiesAsync(request, C.Call());
        DefectPointEnergies p = Assert.Single(response.Points);
        Assert.Equal(6, p.Energies.Count);
        var at0 = p.Energies.Where(e => e.FermiLevelEv == 0).ToDictionary(e => e.Charge);
        var at3 = p.Energies.Where(e => e.FermiLevelEv == 3).ToDictionary(e => e.Charge);
        foreach (int q in new[] { 2, 1, 0 }) Assert.Equal(at0[q].FormationEnergyEv + 3 * q, at3[q].FormationEnergyEv, 1e-9);
        // At 3 eV (above ε(+2/0) = 0.641 eV) the neutral vacancy is lowest.
        Assert.True(at3[0].Lowest);
        Assert.False(at3[2].Lowest);
    }

    [Fact]
    public async Task Transition_levels_and_negative_U_are_the_hand_worked_ones()
    {
        var response = await C.Defects.GetChargeTransitionLevelsAsync(new GetChargeTransitionLevelsRequest
        {
            Dataset = "d", StudyName = "s", Conditions = new DefectConditions { Vertex = "O" },
        }, C.Call());
        // At O-rich, E_F = 0: a_{+2} = 4 + ORef + 4 + E_lat(2) − 0.1 = 3.767120, a_{+1} = 8 + ORef + 2 + E_lat(1) = 5.254280,
        // a_0 = 5.05. U(+1) = a_2 + a_0 − 2a_1 = −1.691440: negative-U, so the one thermodynamic level is
        // ε(+2/0) = (a_2 − a_0)/(0 − 2) = 0.641440; ε(+2/+1) = 1.487160 and ε(+1/0) = −0.204280 (below the VBM) are
        // between non-ground states.
        double a2 = 4 + ORef + 4 + ImageCharge(2) - 0.1, a1 = 8 + ORef + 2 + ImageCharge(1), a0 = 5.05;
        DefectTransitionLevel thermo = Assert.Single(response.Levels, l => l.Defect == "V_O" && l.Thermodynamic);
        Assert.Equal((2, 0), (thermo.Charge, thermo.OtherCharge));
        Assert.Equal((a0 - a2) / 2, thermo.LevelEv, ImageChargeToleranceEv);
        Assert.True(thermo.InsideGap);
        Assert.Equal(a0, thermo.FormationEnergyEv, ImageChargeToleranceEv);
        DefectTransitionLevel below = response.Levels.Single(l => l.Defect == "V_O" && l.Charge == 1 && l.OtherCharge == 0);
        Assert.False(below.Thermodynamic);
        Assert.False(below.InsideGap);
        Assert.Equal(-(a1 - a0), below.LevelEv, ImageChargeToleranceEv);
        Assert.Equal(a1 - a2, response.Levels.Single(l => l.Defect == "V_O" && l.Charge == 2 && l.OtherCharge == 1).LevelEv, ImageChargeToleranceEv);

        DefectEffectiveU u = Assert.Single(response.EffectiveU);
        Assert.Equal(a2 + a0 - 2 * a1, u.UEv, ImageChargeToleranceEv);
        Assert.True(u.Negative);
        Assert.Contains(response.Warnings, w => w.Contains("negative-U", StringComparison.Ordinal));
        Assert.Equal("O", response.Point.Label);
    }

    [Fact]
    public async Task A_gas_at_T_and_p_fixes_oxygen_and_the_window_gives_aluminium()
    {
        var request = new GetDefectFormationEnergiesRequest
        {
            Dataset = "d", StudyName = "s",
            Conditions = new DefectConditions { Gas = new DefectGasConditions { Gas = "O2", TemperatureK = 1000, PressureBar = 1, Reference = DefectGasReference.Fitted } },
        };
        var response = await C.Defects.GetDefectFormationEnergiesAsync(request, C.Call());
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 at 1000 K: H° − H°(298.15 K) = 22.703 kJ/mol,
        // S° = 243.578 J/(mol K) — from memory. Fitted reference: Δμ_O = [H − H(298.15) − T S] / 2 per atom at 1 bar.
        // The tables' Shomate fit agrees to about 0.01 kJ/mol, 5e-5 eV per atom.
        double deltaMuO = (22.703 - 1000 * 0.243578) / 2 / 96.4853321233;
        Assert.Equal(deltaMuO, response.Gas.DeltaMuEv, 2e-4);
        DefectPointEnergies p = Assert.Single(response.Points);
        Assert.Equal(response.Gas.DeltaMuEv, p.Point.Potentials.Single(x => x.Element == "O").DeltaMuEv, 12);
        // On the corundum plane: 2Δμ_Al + 3Δμ_O = h_A.
        Assert.Equal((-17.367466445561 - 3 * response.Gas.DeltaMuEv) / 2, p.Point.Potentials.Single(x => x.Element == "Al").DeltaMuEv, 1e-9);
        Assert.Equal(5.05 + response.Gas.DeltaMuEv, Of(p, "V_O", 0).FormationEnergyEv, Tolerance);

        // A computed molecule instead: E_ref = E_mol + ZPE, anchored at 0 K, so Δμ adds H°(298.15) − H°(0) = 8.683
        // kJ/mol (NIST-JANAF, from memory) and half the zero-point energy, which the answer writes out. With
        // E_mol = 2 ORef and ZPE = 0.1 eV: Δμ_O = 0.05 + (8.683 + 22.703 − 243.578) / 2 / 96.4853321233.
        request.Conditions.Gas.Reference = DefectGasReference.ComputedMolecule;
        request.Conditions.Gas.MoleculeEnergyEv = 2 * ORef;
        request.Conditions.Gas.ZeroPointEnergyEv = 0.1;
        var computed = await C.Defects.GetDefectFormationEnergiesAsync(request, C.Call());
        Assert.Equal(0.05 + (8.683 + 22.703 - 243.578) / 2 / 96.4853321233, computed.Gas.DeltaMuEv, 2e-4);
        Assert.Equal(0.05, computed.Gas.ZeroPointOffsetEv, 12);
        request.Conditions.Gas.Reference = DefectGasReference.Fitted;

        // So hot and thin a gas that Al2O3 gives up its oxygen: the host is not stable there.
        request.Conditions.Gas.TemperatureK = 3000;
        request.Conditions.Gas.PressureBar = 1e-20;
        var unstable = await Assert.ThrowsAsync<RpcException>(() => C.Defects.GetDefectFormationEnergiesAsync(request, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.FailedPrecondition, unstable.StatusCode);
        Assert.Contains("is not stable with O2 at 3000 K", unstable.Status.Detail, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_given_point_is_used_as_given_and_warned_about_when_off_the_window()
    {
        // On the corundum plane (2Δμ_Al + 3Δμ_O = h_A): Δμ_O = −3, Δμ_Al = (h_A + 9)/2 = −4.183733222781; Mg given
        // at −5 eV, below its limit there (spinel: h_S − 2Δμ_Al − 4Δμ_O = −3.469 eV; MgO: h_M − Δμ_O = −3.235 eV).
        var point = new DefectGivenPoint();
        point.Potentials.Add(new DefectElementPotential { Element = "O", DeltaMuEv = -3 });
        point.Potentials.Add(new DefectElementPotential { Element = "Al", DeltaMuEv = -4.183733222781 });
        point.Potentials.Add(new DefectElementPotential { Element = "Mg", DeltaMuEv = -5 });
        var request = new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "s", Conditions = new DefectConditions { Point = point } };
        var on = await C.Defects.GetDefectFormationEnergiesAsync(request, C.Call());
        Assert.Empty(on.Warnings);
        DefectPointEnergies p = Assert.Single(on.Points);
        Assert.Equal("given", p.Point.Label);
        Assert.True(Assert.Single(p.Point.Dopants).Given);
        Assert.Equal(5.05 - 3, Of(p, "V_O", 0).FormationEnergyEv, Tolerance);
        Assert.Equal(5.85 + 5 - 4.183733222781, Of(p, "Mg_Al", 0).FormationEnergyEv, Tolerance);

        // Off the plane by 1 eV in Δμ_O, and Mg above its spinel limit there (h_S − 2Δμ_Al − 4Δμ_O = −7.469 eV).
        point.Potentials[0].DeltaMuEv = -2;
        point.Potentials[2].DeltaMuEv = -1;
        var off = await C.Defects.GetDefectFormationEnergiesAsync(request, C.Call());
        Assert.Contains(off.Warnings, w => w.Contains("off the host's formation energy", StringComparison.Ordinal));
        Assert.Contains(off.Warnings, w => w.Contains("above its solubility limit", StringComparison.Ordinal));
    }

    [Fact]
    public async Task Export_gives_the_bytes_back_and_old_versions_stay()
    {
        string changed = Csv.Replace("V_O,0,-307.7397", "V_O,0,-307.5397", StringComparison.Ordinal);
        var second = await Import("d", "versions", Json(), Csv);
        var third = await Import("d", "versions", Json(), changed);
        Assert.Equal(1, second.Study.StudyVersion);
        Assert.Equal(2, third.Study.StudyVersion);
        var first = await C.Defects.ExportDefectStudyAsync(new ExportDefectStudyRequest { Dataset = "d", StudyName = "versions", StudyVersion = 1 }, C.Call());
        Assert.Equal(Csv, first.ChargeStatesCsv);
        Assert.Equal(Json(), first.StudyJson);
        var latest = await C.Defects.ExportDefectStudyAsync(new ExportDefectStudyRequest { Dataset = "d", StudyName = "versions" }, C.Call());
        Assert.Equal(changed, latest.ChargeStatesCsv);
        Assert.NotEqual(first.Study.ContentSha256, latest.Study.ContentSha256);

        var v1 = await C.Defects.GetDefectFormationEnergiesAsync(new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "versions", StudyVersion = 1, Conditions = new DefectConditions { Vertex = "O" } }, C.Call());
        var v2 = await C.Defects.GetDefectFormationEnergiesAsync(new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "versions", Conditions = new DefectConditions { Vertex = "O" } }, C.Call());
        Assert.Equal(0.2, Of(v2.Points[0], "V_O", 0).FormationEnergyEv - Of(v1.Points[0], "V_O", 0).FormationEnergyEv, 1e-9);
        var listed = await C.Defects.ListDefectStudiesAsync(new ListDefectStudiesRequest { Dataset = "d" }, C.Call());
        Assert.Equal(2, listed.Studies.Single(s => s.StudyName == "versions").LatestVersion);
    }

    [Fact]
    public async Task A_bulk_unlike_the_datasets_host_is_a_warning_in_every_answer()
    {
        // One eV per formula unit above the dataset's −39.717466 eV: different calculation settings.
        var imported = await Import("d", "mismatch", Json(BulkEv + 8.0), Csv);
        Assert.Contains(imported.Warnings, w => w.Contains("+1.0000 eV per formula unit", StringComparison.Ordinal));
        var energies = await C.Defects.GetDefectFormationEnergiesAsync(new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "mismatch" }, C.Call());
        Assert.Contains(energies.Warnings, w => w.Contains("different settings", StringComparison.Ordinal));
        var levels = await C.Defects.GetChargeTransitionLevelsAsync(new GetChargeTransitionLevelsRequest { Dataset = "d", StudyName = "mismatch" }, C.Call());
        Assert.Contains(levels.Warnings, w => w.Contains("different settings", StringComparison.Ordinal));
    }

    [Fact]
    public async Task The_figure_is_served_as_svg_with_its_levels()
    {
        var response = await C.Defects.DrawDefectFormationFigureAsync(new DrawDefectFormationFigureRequest { Dataset = "d", StudyName = "s", Conditions = new DefectConditions { Vertex = "O" } }, C.Call());
        XDocument svg = XDocument.Parse(response.Svg);
        Assert.Equal(2, response.DefectCount);
        // V_O's one thermodynamic level ε(+2/0) = 0.64 eV lies inside 0..6 eV; Mg_Al has one charge state.
        Assert.Equal(1, response.MarkedLevelCount);
        XElement metadata = svg.Descendants().Single(e => e.Name.LocalName == "figure");
        Assert.Equal("defect-formation", (string?)metadata.Attribute("kind"));
        Assert.Equal("s", (string?)metadata.Attribute("study"));
        Assert.Equal(["V_O", "Mg_Al"], svg.Descendants().Where(e => e.Name.LocalName == "polyline").Select(e => (string)e.Attribute("data-defect")!));
    }

    public static TheoryData<string, StatusCode, string> BadRequests() => new()
    {
        { "unknown-study", StatusCode.NotFound, "study_name" },
        { "unknown-study-version", StatusCode.NotFound, "study_version" },
        { "unknown-vertex", StatusCode.InvalidArgument, "conditions.vertex" },
        { "unknown-gas", StatusCode.InvalidArgument, "conditions.gas.gas" },
        { "hot-gas", StatusCode.InvalidArgument, "conditions.gas.temperature_k" },
        { "no-pressure", StatusCode.InvalidArgument, "conditions.gas.pressure_bar" },
        { "unknown-defect", StatusCode.InvalidArgument, "defects[0]" },
        { "point-missing-host-element", StatusCode.InvalidArgument, "conditions.point.O" },
        { "fermi-not-finite", StatusCode.InvalidArgument, "fermi_levels_ev[0]" },
        { "host-entry-other-formula", StatusCode.InvalidArgument, "host_entry_id" },
    };

    [Theory]
    [MemberData(nameof(BadRequests))]
    public async Task Bad_questions_name_the_field(string which, StatusCode status, string field)
    {
        var request = new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = "s" };
        switch (which)
        {
            case "unknown-study": request.StudyName = "nope"; break;
            case "unknown-study-version": request.StudyVersion = 9; break;
            case "unknown-vertex": request.Conditions = new DefectConditions { Vertex = "Mg" }; break;
            case "unknown-gas": request.Conditions = new DefectConditions { Gas = new DefectGasConditions { Gas = "X2", TemperatureK = 300, PressureBar = 1 } }; break;
            case "hot-gas": request.Conditions = new DefectConditions { Gas = new DefectGasConditions { Gas = "O2", TemperatureK = 20000, PressureBar = 1 } }; break;
            case "no-pressure": request.Conditions = new DefectConditions { Gas = new DefectGasConditions { Gas = "O2", TemperatureK = 1000, PressureBar = 0 } }; break;
            case "unknown-defect": request.Defects.Add("V_X"); break;
            case "point-missing-host-element":
                request.Conditions = new DefectConditions { Point = new DefectGivenPoint() };
                request.Conditions.Point.Potentials.Add(new DefectElementPotential { Element = "Al", DeltaMuEv = -8 });
                break;
            case "fermi-not-finite": request.FermiLevelsEv.Add(double.NaN); break;
            case "host-entry-other-formula": request.HostEntryId = "Al"; break;
        }

        var error = await Assert.ThrowsAsync<RpcException>(() => C.Defects.GetDefectFormationEnergiesAsync(request, C.Call()).ResponseAsync);
        Assert.Equal(status, error.StatusCode);
        Assert.Contains(field, Data.Violations(error).Select(v => v.Field));
    }

    [Fact]
    public async Task A_refused_import_writes_nothing_and_says_where()
    {
        var badGap = await Assert.ThrowsAsync<RpcException>(() => Import("d", "bad", Json().Replace("\"band_gap_ev\": 6.0", "\"band_gap_ev\": -1", StringComparison.Ordinal), Csv));
        Assert.Equal(StatusCode.InvalidArgument, badGap.StatusCode);
        Assert.Equal(["study_json.bulk.band_gap_ev"], Data.Violations(badGap).Select(v => v.Field));

        var badRow = await Assert.ThrowsAsync<RpcException>(() => Import("d", "bad", Json(), Csv.Replace("V_O,1,", "V_O,one,", StringComparison.Ordinal)));
        Assert.Equal(["charge_states_csv line 3 column charge"], Data.Violations(badRow).Select(v => v.Field));

        // A dopant the dataset has no reference for.
        var noMg = await Assert.ThrowsAsync<RpcException>(() => Import("no-mg", "bad", Json(), Csv));
        Assert.Equal(StatusCode.FailedPrecondition, noMg.StatusCode);
        Assert.Contains("dopant Mg", noMg.Status.Detail, StringComparison.Ordinal);

        foreach (string dataset in new[] { "d", "no-mg" })
        {
            var listed = await C.Defects.ListDefectStudiesAsync(new ListDefectStudiesRequest { Dataset = dataset }, C.Call());
            Assert.DoesNotContain(listed.Studies, s => s.StudyName == "bad");
        }
    }
}
