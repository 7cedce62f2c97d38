using System.Globalization;
using System.Xml.Linq;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests.Defects;

/// <summary>
/// The carrier calls over gRPC on the same corundum host: the self-consistent Fermi level of one donor and one
/// acceptor against the Boltzmann closed form, the quench's conservation and its limit, the Mg solubility against
/// the dilute formula at every vertex of the host + Mg window, the carrier figure, and the refusals.
/// </summary>
public sealed partial class DefectServiceTests
{
    // CODATA 2018: k_B = 1.380649e-23 J/K / 1.602176634e-19 J/eV, exact.
    private const double BoltzmannEvPerK = 8.617333262e-5;

    // Invented band inputs of the test (not outside values): N_c, N_v at 300 K.
    private const double Nc300 = 4.0e18, Nv300 = 2.0e19;

    private const string CarrierBlock = """
        "carriers": {"conduction_states_300k_per_cm3": 4.0e18, "valence_states_300k_per_cm3": 2.0e19},
        """;

    // Site densities: 3 O and 2 Al sites per formula unit, 8 formula units in 1000 Å³ = 1e-21 cm³.
    private const double OSitesPerCm3 = 3 * 8 / 1e-21, AlSitesPerCm3 = 2 * 8 / 1e-21;

    private static string CarrierJson() => Json().Replace("\"model_charge\": {\"point\": true},", "\"model_charge\": {\"point\": true}," + CarrierBlock, StringComparison.Ordinal);

    // One singly charged donor and one singly charged acceptor, nothing else.
    private static string DonorAcceptorJson() => $$"""
        {"layout": "hull-defect-study-1",
         "host": {"formula": "Al2O3", "formula_units": 8, "atoms": {"Al": 16, "O": 24}, "total_energy_ev": {{BulkEv.ToString(CultureInfo.InvariantCulture)}},
                  "lattice_vectors_angstrom": [[10, 0, 0], [0, 10, 0], [0, 0, 10]], "vbm_ev": 2.0, "band_gap_ev": 6.0, "dielectric": 10.0},
         "model_charge": {"point": true},
         {{CarrierBlock}}
         "defects": [
           {"name": "V_O", "kind": "vacancy", "atoms": {"O": -1}, "site_set": "O", "sites_per_formula_unit": 3, "position_fractional": [0, 0, 0]},
           {"name": "V_Al", "kind": "vacancy", "atoms": {"Al": -1}, "site_set": "Al", "sites_per_formula_unit": 2, "position_fractional": [0.5, 0.5, 0.5]}]}
        """;

    private const string DonorAcceptorCsv = "defect,charge,total_energy_ev\nV_O,1,-313.7397\nV_Al,-1,-300.7397\n";

    private async Task<GetDefectFormationEnergiesResponse> AtVbm(string study, string vertex) =>
        await C.Defects.GetDefectFormationEnergiesAsync(new GetDefectFormationEnergiesRequest { Dataset = "d", StudyName = study, Conditions = new DefectConditions { Vertex = vertex } }, C.Call());

    [Fact]
    public async Task Fermi_level_of_one_donor_and_one_acceptor_is_the_Boltzmann_closed_form()
    {
        await Import("d", "da", DonorAcceptorJson(), DonorAcceptorCsv);
        const double t = 1500;
        var response = await C.Defects.SolveFermiLevelAsync(new FermiLevelRequest
        {
            Dataset = "d", StudyName = "da", Conditions = new DefectConditions { Vertex = "O" }, TemperatureK = t, Statistics = FermiStatistics.Boltzmann,
        }, C.Call());
        FermiSolution s = Assert.Single(response.Points).Equilibrium;
        Assert.Equal("converged", s.Status);
        Assert.Equal("boltzmann", s.Statistics);
        Assert.Equal("dilute", s.Form);

        // a = E_f(D⁺; E_F = 0), b = E_f(A⁻; E_F = 0) from the formation-energy call (issue 11's, checked by hand above).
        // With p = N_v e^{−E_F/kT}, n = N_c e^{(E_F−E_g)/kT}, c(D⁺) = N_D e^{−(a+E_F)/kT}, c(A⁻) = N_A e^{−(b−E_F)/kT},
        // p + c(D⁺) = n + c(A⁻) gives e^{−2E_F/kT} (N_v + N_D e^{−a/kT}) = N_c e^{−E_g/kT} + N_A e^{−b/kT}, so
        // E_F = (kT/2) ln[(N_D e^{−a/kT} + N_v) / (N_A e^{−b/kT} + N_c e^{−E_g/kT})]; N_c, N_v scale as T^{3/2}.
        var energies = (await AtVbm("da", "O")).Points[0];
        double a = Of(energies, "V_O", 1).FormationEnergyEv, b = Of(energies, "V_Al", -1).FormationEnergyEv;
        double kt = BoltzmannEvPerK * t, scale = Math.Pow(t / 300, 1.5);
        double nc = Nc300 * scale, nv = Nv300 * scale;
        double expected = kt / 2 * Math.Log((OSitesPerCm3 * Math.Exp(-a / kt) + nv) / (AlSitesPerCm3 * Math.Exp(-b / kt) + nc * Math.Exp(-6.0 / kt)));
        Assert.Equal(expected, s.FermiLevelEv, 1e-9);

        // Every concentration from its formula at the returned level, and the charge they carry balanced.
        double donors = OSitesPerCm3 * Math.Exp(-(a + s.FermiLevelEv) / kt), acceptors = AlSitesPerCm3 * Math.Exp(-(b - s.FermiLevelEv) / kt);
        double holes = nv * Math.Exp(-s.FermiLevelEv / kt), electrons = nc * Math.Exp((s.FermiLevelEv - 6.0) / kt);
        Assert.Equal(1, s.ChargeStates.Single(c => c.Defect == "V_O").PerCm3 / donors, 1e-8);
        Assert.Equal(1, s.ChargeStates.Single(c => c.Defect == "V_Al").PerCm3 / acceptors, 1e-8);
        Assert.Equal(1, s.HolesPerCm3 / holes, 1e-8);
        Assert.Equal(1, s.ElectronsPerCm3 / electrons, 1e-8);
        Assert.True(Math.Abs(holes + donors - electrons - acceptors) < 1e-8 * (holes + donors + electrons + acceptors));
        Assert.Equal(a + s.FermiLevelEv, s.ChargeStates.Single(c => c.Defect == "V_O").FormationEnergyEv, 1e-9);
        Assert.Equal(0, s.ValenceEdgeEv);
        Assert.Equal(6.0, s.ConductionEdgeEv);
    }

    [Fact]
    public async Task Every_vertex_by_default_and_a_gas_at_its_own_temperature()
    {
        await Import("d", "c", CarrierJson(), Csv);
        var all = await C.Defects.SolveFermiLevelAsync(new FermiLevelRequest { Dataset = "d", StudyName = "c", TemperatureK = 1200 }, C.Call());
        Assert.Equal(["O", "Al"], all.Points.Select(p => p.Point.Label).Order(StringComparer.Ordinal).Reverse());
        Assert.All(all.Points, p => Assert.Equal("converged", p.Equilibrium.Status));
        Assert.All(all.Points, p => Assert.Null(p.Quenched));
        Assert.All(all.Points, p => Assert.Equal(["V_O", "Mg_Al"], p.Equilibrium.Defects.Select(d => d.Defect)));
        Assert.All(all.Points, p => Assert.Equal([2, 1, 0, 0], p.Equilibrium.ChargeStates.Select(c => c.Charge)));

        var gas = await C.Defects.SolveFermiLevelAsync(new FermiLevelRequest
        {
            Dataset = "d", StudyName = "c",
            Conditions = new DefectConditions { Gas = new DefectGasConditions { Gas = "O2", TemperatureK = 1000, PressureBar = 1, Reference = DefectGasReference.Fitted } },
        }, C.Call());
        Assert.NotNull(gas.Gas);
        Assert.All(gas.Points, p => Assert.Equal(1000, p.Equilibrium.TemperatureK));
    }

    [Fact]
    public async Task Quench_keeps_the_growth_totals_and_at_the_growth_temperature_is_the_equilibrium()
    {
        await Import("d", "c", CarrierJson(), Csv);
        FermiLevelRequest Request(double operating) => new()
        {
            Dataset = "d", StudyName = "c", Conditions = new DefectConditions { Vertex = "Al" }, TemperatureK = 1600, OperatingTemperatureK = operating,
        };
        var cold = Assert.Single((await C.Defects.SolveFermiLevelAsync(Request(300), C.Call())).Points);
        Assert.Equal("frozen", cold.Quenched.Form);
        Assert.Equal(300, cold.Quenched.TemperatureK);
        for (int d = 0; d < cold.Equilibrium.Defects.Count; d++)
        {
            Assert.Equal(1, cold.Quenched.Defects[d].PerCm3 / cold.Equilibrium.Defects[d].PerCm3, 1e-12);
        }

        var same = Assert.Single((await C.Defects.SolveFermiLevelAsync(Request(1600), C.Call())).Points);
        Assert.Equal(same.Equilibrium.FermiLevelEv, same.Quenched.FermiLevelEv, 1e-9);
        for (int c = 0; c < same.Equilibrium.ChargeStates.Count; c++)
        {
            Assert.Equal(1, same.Quenched.ChargeStates[c].PerCm3 / same.Equilibrium.ChargeStates[c].PerCm3, 1e-8);
        }
    }

    [Fact]
    public async Task Mg_solubility_at_every_vertex_is_the_dilute_formula_of_its_neutral_substitution()
    {
        await Import("d", "c", CarrierJson(), Csv);
        var request = new DefectSolubilityRequest { Dataset = "d", StudyName = "c" };
        request.TemperaturesK.AddRange([1200, 1600]);
        var response = await C.Defects.GetDopantSolubilityAsync(request, C.Call());
        Assert.Equal("Mg", response.Dopant);
        // The highest Δμ_Mg is at the Al-rich side, against spinel: h_S − 4 h_A/3 (worked above).
        Assert.Equal(-0.680243906651, response.MaxDeltaMuEv, Tolerance);
        Assert.Equal(["spinel"], response.LimitingPhaseIds);
        Assert.Empty(response.Cautions);
        Assert.True(response.Vertices.Count >= 2);
        foreach (DefectSolubilityAtTemperature atT in response.Temperatures)
        {
            double kt = BoltzmannEvPerK * atT.TemperatureK;
            foreach (DefectSolubilityAtVertex v in atT.Vertices)
            {
                // Mg_Al has only its neutral state: c = N_Al e^{−E_f/kT}, E_f = 5.85 − Δμ_Mg + Δμ_Al (worked above), whatever E_F.
                var mu = response.Vertices[v.VertexNumber - 1].Potentials.ToDictionary(p => p.Element, p => p.DeltaMuEv);
                double expected = AlSitesPerCm3 * Math.Exp(-(5.85 - mu["Mg"] + mu["Al"]) / kt);
                Assert.Equal(1, v.DopantPerCm3 / expected, 1e-6);
            }

            DefectSolubilityAtVertex best = atT.Vertices.MaxBy(v => v.DopantPerCm3)!;
            Assert.Equal(best.VertexNumber, atT.MostSolubleVertex);
            Assert.Equal(best.DopantPerCm3, atT.MaxDopantPerCm3);
            // The O-rich side dissolves more (Δμ_Al falls faster than Δμ_Mg): not the vertex of the highest Δμ_Mg.
            Assert.NotEqual(1, atT.MostSolubleVertex);
        }
    }

    [Fact]
    public async Task Carrier_figure_draws_every_defect_and_the_Fermi_level()
    {
        await Import("d", "c", CarrierJson(), Csv);
        var request = new DefectCarrierFigureRequest { Dataset = "d", StudyName = "c", Conditions = new DefectConditions { Vertex = "O" } };
        request.TemperaturesK.AddRange([800, 1000, 1200, 1400, 1600]);
        var response = await C.Defects.DrawCarrierFigureAsync(request, C.Call());
        XElement svg = XElement.Parse(response.Svg);
        var paths = svg.Descendants().Where(e => e.Name.LocalName == "path").ToList();
        Assert.Contains(paths, p => (string?)p.Attribute("data-kind") == "fermi-level");
        Assert.Equal(["V_O", "Mg_Al", "n", "p"], paths.Where(p => (string?)p.Attribute("data-kind") is "defect" or "carrier").Select(p => (string)p.Attribute("data-id")!));
        Assert.Equal("O", response.Point.Label);
        XElement meta = svg.Descendants().Single(e => e.Name.LocalName == "figure");
        Assert.Equal(("dilute", "d", "temperature"), ((string)meta.Attribute("form")!, (string)meta.Attribute("dataset")!, ((string)meta.Attribute("x-axis")!).ToLowerInvariant()));

        request.OperatingTemperatureK = 300;
        var quenched = XElement.Parse((await C.Defects.DrawCarrierFigureAsync(request, C.Call())).Svg);
        Assert.Equal("frozen", (string)quenched.Descendants().Single(e => e.Name.LocalName == "figure").Attribute("form")!);
        Assert.Contains("quenched to 300 K", quenched.Descendants().First(e => e.Name.LocalName == "title").Value, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_figure_along_the_path_between_two_vertices_draws_the_Fermi_level_solved_at_each_point_of_the_path()
    {
        await Import("d", "c", CarrierJson(), Csv);
        // The Fermi level at both vertices and at the given point halfway between them (Δμ of every element averaged,
        // dopants included), each from SolveFermiLevel; the figure's path of 3 points must pass through the same three
        // levels. Its page y is affine in E_F, so the check compares the middle's share of the rise between the ends.
        async Task<FermiPointSolution> Solve(DefectConditions at) => Assert.Single((await C.Defects.SolveFermiLevelAsync(
            new FermiLevelRequest { Dataset = "d", StudyName = "c", Conditions = at, TemperatureK = 1400 }, C.Call())).Points);
        FermiPointSolution o = await Solve(new DefectConditions { Vertex = "O" }), al = await Solve(new DefectConditions { Vertex = "Al" });
        var middle = new DefectGivenPoint();
        foreach (DefectElementPotential p in o.Point.Potentials)
        {
            double other = al.Point.Potentials.Single(q => q.Element == p.Element).DeltaMuEv;
            middle.Potentials.Add(new DefectElementPotential { Element = p.Element, DeltaMuEv = (p.DeltaMuEv + other) / 2 });
        }

        FermiPointSolution mid = await Solve(new DefectConditions { Point = middle });
        double share = (mid.Equilibrium.FermiLevelEv - o.Equilibrium.FermiLevelEv) / (al.Equilibrium.FermiLevelEv - o.Equilibrium.FermiLevelEv);
        Assert.True(Math.Abs(al.Equilibrium.FermiLevelEv - o.Equilibrium.FermiLevelEv) > 0.05, "the two vertices must give different Fermi levels for this check to mean anything");

        var request = new DefectCarrierFigureRequest
        {
            Dataset = "d", StudyName = "c", Conditions = new DefectConditions { Vertex = "O" }, PathTo = new DefectConditions { Vertex = "Al" }, PathPoints = 3,
        };
        request.TemperaturesK.Add(1400);
        XElement svg = XElement.Parse((await C.Defects.DrawCarrierFigureAsync(request, C.Call())).Svg);
        string d = (string)svg.Descendants().Single(e => e.Name.LocalName == "path" && (string?)e.Attribute("data-kind") == "fermi-level").Attribute("d")!;
        double[] ys = [.. d.Split(['M', 'L'], StringSplitOptions.RemoveEmptyEntries).Select(pair => double.Parse(pair.Split(',')[1], System.Globalization.CultureInfo.InvariantCulture))];
        Assert.Equal(3, ys.Length);
        Assert.Equal(share, (ys[1] - ys[0]) / (ys[2] - ys[0]), 2);
        Assert.Contains("from window vertex", svg.Descendants().First(e => e.Name.LocalName == "title").Value, StringComparison.Ordinal);

        // A path takes one temperature and 2 to 1001 points.
        request.TemperaturesK.Add(1500);
        Assert.Contains("temperatures_k", Data.Violations(await Assert.ThrowsAsync<RpcException>(() => C.Defects.DrawCarrierFigureAsync(request, C.Call()).ResponseAsync)).Select(v => v.Field));
        request.TemperaturesK.RemoveAt(1);
        request.PathPoints = 1;
        Assert.Contains("path_points", Data.Violations(await Assert.ThrowsAsync<RpcException>(() => C.Defects.DrawCarrierFigureAsync(request, C.Call()).ResponseAsync)).Select(v => v.Field));
    }

    public static TheoryData<string, StatusCode, string> BadCarrierRequests() => new()
    {
        { "no-carriers", StatusCode.FailedPrecondition, "" },
        { "no-temperature", StatusCode.InvalidArgument, "temperature_k" },
        { "cold-operating", StatusCode.InvalidArgument, "operating_temperature_k" },
        { "bad-statistics", StatusCode.InvalidArgument, "statistics" },
        { "solubility-no-temperatures", StatusCode.InvalidArgument, "temperatures_k" },
        { "solubility-unknown-dopant", StatusCode.InvalidArgument, "dopant" },
        { "solubility-negative-temperature", StatusCode.InvalidArgument, "temperatures_k[1]" },
        { "figure-falling-temperatures", StatusCode.InvalidArgument, "temperatures_k[1]" },
    };

    [Theory]
    [MemberData(nameof(BadCarrierRequests))]
    public async Task Bad_carrier_questions_name_the_field(string which, StatusCode status, string field)
    {
        await Import("d", "c", CarrierJson(), Csv);
        Task call = which switch
        {
            "no-carriers" => C.Defects.SolveFermiLevelAsync(new FermiLevelRequest { Dataset = "d", StudyName = "s", TemperatureK = 300 }, C.Call()).ResponseAsync,
            "no-temperature" => C.Defects.SolveFermiLevelAsync(new FermiLevelRequest { Dataset = "d", StudyName = "c" }, C.Call()).ResponseAsync,
            "cold-operating" => C.Defects.SolveFermiLevelAsync(new FermiLevelRequest { Dataset = "d", StudyName = "c", TemperatureK = 1000, OperatingTemperatureK = -5 }, C.Call()).ResponseAsync,
            "bad-statistics" => C.Defects.SolveFermiLevelAsync(new FermiLevelRequest { Dataset = "d", StudyName = "c", TemperatureK = 1000, Statistics = (FermiStatistics)9 }, C.Call()).ResponseAsync,
            "solubility-no-temperatures" => C.Defects.GetDopantSolubilityAsync(new DefectSolubilityRequest { Dataset = "d", StudyName = "c" }, C.Call()).ResponseAsync,
            "solubility-unknown-dopant" => C.Defects.GetDopantSolubilityAsync(new DefectSolubilityRequest { Dataset = "d", StudyName = "c", Dopant = "Zn", TemperaturesK = { 1000 } }, C.Call()).ResponseAsync,
            "solubility-negative-temperature" => C.Defects.GetDopantSolubilityAsync(new DefectSolubilityRequest { Dataset = "d", StudyName = "c", TemperaturesK = { 1000, -1 } }, C.Call()).ResponseAsync,
            _ => C.Defects.DrawCarrierFigureAsync(new DefectCarrierFigureRequest { Dataset = "d", StudyName = "c", TemperaturesK = { 1000, 900 } }, C.Call()).ResponseAsync,
        };
        var error = await Assert.ThrowsAsync<RpcException>(() => call);
        Assert.Equal(status, error.StatusCode);
        if (field.Length > 0) Assert.Contains(field, Data.Violations(error).Select(v => v.Field));
        else Assert.Contains("no \"carriers\" block", error.Status.Detail, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_bad_carriers_block_is_refused_at_import_naming_its_path()
    {
        var both = await Assert.ThrowsAsync<RpcException>(() => Import("d", "bad", CarrierJson().Replace("\"valence_states_300k_per_cm3\": 2.0e19", "\"valence_states_300k_per_cm3\": 2.0e19, \"hole_mass_ratio\": 1", StringComparison.Ordinal), Csv));
        Assert.Equal(StatusCode.InvalidArgument, both.StatusCode);
        Assert.Equal(["study_json.carriers"], Data.Violations(both).Select(v => v.Field));
        var negative = await Assert.ThrowsAsync<RpcException>(() => Import("d", "bad", CarrierJson().Replace("2.0e19", "-2.0e19", StringComparison.Ordinal), Csv));
        Assert.Equal(["study_json.carriers.valence_states_300k_per_cm3"], Data.Violations(negative).Select(v => v.Field));
        var listing = await C.Defects.ListDefectStudiesAsync(new ListDefectStudiesRequest { Dataset = "d" }, C.Call());
        Assert.DoesNotContain(listing.Studies, s => s.StudyName == "bad");
    }
}
