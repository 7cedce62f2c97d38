using Hull.Core.Defects.Conditions;
using Hull.Core.Thermo;
using Hull.Core.Windows;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// The chemical-potential points a defect study is evaluated at: the corundum window's two vertices, named by what
/// Al2O3 coexists with there, and a Mg dopant at its solubility limit, worked by hand from handbook enthalpies.
/// </summary>
public sealed class DefectConditionPointTests
{
    // 1 eV per particle = 96.485 kJ/mol (CODATA: e * N_A = 96 485.33 C/mol).
    private const double KilojoulesPerMolePerEv = 96.485;

    // The hand arithmetic is carried to 1e-12 eV.
    private const double ToleranceEv = 1e-9;

    // CRC Handbook of Chemistry and Physics, 97th ed. (2016), section 5, ΔfH°(298.15 K) in kJ/mol — from memory.
    private const double Spinel = -2299.9;   // MgAl2O4
    private const double Periclase = -601.6;  // MgO
    private const double Corundum = -1675.7;  // Al2O3

    private static PhaseEntry Fu(string id, string formula, double kilojoulesPerMole) =>
        Entry(id, formula, kilojoulesPerMole / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit);

    private static readonly List<PhaseEntry> Entries =
    [
        Fu("spinel", "MgAl2O4", Spinel), Fu("periclase", "MgO", Periclase), Fu("corundum", "Al2O3", Corundum),
        Fu("Mg", "Mg", 0), Fu("Al", "Al", 0), Fu("O2", "O2", 0),
    ];

    private static SystemHull Host => SystemHull.OverElements(Entries.Where(e => !e.Composition.Contains("Mg")).ToList());

    private static SystemHull Extended => SystemHull.OverElements(Entries);

    [Fact]
    public void Corundum_vertices_are_named_by_what_coexists_and_carry_the_Mg_limit()
    {
        StabilityWindow window = StabilityWindows.Of(Host, "corundum");
        var points = DefectConditionPoints.AtVertices(window, new Dictionary<string, SystemHull> { ["Mg"] = Extended });
        Assert.Equal(2, points.Count);

        // h_A = −1675.7/96.485 = −17.367466445561 eV, h_M = −6.235166087993, h_S = −23.836865834067 (per formula unit).
        // Al-rich: Δμ_Al = 0, Δμ_O = h_A/3 = −5.789155481854; Mg: MgO allows h_M − Δμ_O = −0.446010606139, spinel
        //   h_S − 2Δμ_Al − 4Δμ_O = −0.680243906651: spinel limits.
        // O-rich: Δμ_O = 0, Δμ_Al = h_A/2 = −8.683733222781; MgO allows −6.235166087993, spinel h_S − h_A = −6.469399388506.
        DefectConditionPoint alRich = DefectConditionPoints.Select(points, "Al");
        Assert.Equal(0.0, alRich.Point.DeltaMuEv["Al"], ToleranceEv);
        Assert.Equal(-5.789155481854, alRich.Point.DeltaMuEv["O"], ToleranceEv);
        Assert.Equal(-0.680243906651, alRich.Point.DeltaMuEv["Mg"], ToleranceEv);
        DopantPotential mg = Assert.Single(alRich.Dopants);
        Assert.Equal(["spinel"], mg.LimitingPhaseIds);
        Assert.False(mg.Given);

        DefectConditionPoint oRich = DefectConditionPoints.Select(points, "O");
        Assert.Equal(-8.683733222781, oRich.Point.DeltaMuEv["Al"], ToleranceEv);
        Assert.Equal(0.0, oRich.Point.DeltaMuEv["O"], ToleranceEv);
        Assert.Equal(-6.469399388506, oRich.Point.DeltaMuEv["Mg"], ToleranceEv);
        Assert.Same(points[oRich.VertexNumber - 1], DefectConditionPoints.Select(points, oRich.VertexNumber.ToString(System.Globalization.CultureInfo.InvariantCulture)));
    }

    [Fact]
    public void The_dopant_limit_at_each_vertex_is_the_window_modules_own()
    {
        // Two routes to one number: the window module's per-vertex dopant limit, and the ceiling at a point.
        DopantLimit limit = DopantLimits.Of(Host, Extended, "corundum", "Mg");
        foreach (HostVertexDopantLimit v in limit.PerHostVertex)
        {
            DopantPotential ceiling = DefectConditionPoints.DopantCeiling(Extended, limit.Host.Elements, limit.Host.Vertices[v.HostVertex].ChemicalPotentialsEv, "Mg");
            Assert.Equal(v.MaxDopantPotentialEv, ceiling.DeltaMuEv, ToleranceEv);
            Assert.Equal(v.LimitingPhases.Select(p => p.Id), ceiling.LimitingPhaseIds);
        }
    }

    [Fact]
    public void A_given_point_off_the_window_is_warned_about_and_bad_selectors_are_refused()
    {
        StabilityWindow window = StabilityWindows.Of(Host, "corundum");
        var warnings = new List<string>();
        // Δμ_Al = −8, Δμ_O = −3: 2(−8) + 3(−3) = −25 eV per formula unit, not h_A = −17.37: off the host's plane.
        var given = DefectConditionPoints.Given(window, Host, new Dictionary<string, double> { ["Al"] = -8, ["O"] = -3 },
            new Dictionary<string, SystemHull> { ["Mg"] = Extended }, warnings);
        Assert.Contains(warnings, w => w.Contains("off the host's formation energy", StringComparison.Ordinal));
        Assert.Equal(DefectConditionPoints.GivenLabel, given.Label);
        Assert.True(given.Point.DeltaMuEv.ContainsKey("Mg"));

        var points = DefectConditionPoints.AtVertices(window, new Dictionary<string, SystemHull>());
        var error = Assert.Throws<Hull.Core.Defects.DefectInputException>(() => DefectConditionPoints.Select(points, "Mg"));
        Assert.Equal("conditions.vertex", error.Field);
        Assert.Contains("1 (", error.Message, StringComparison.Ordinal);
        Assert.Throws<Hull.Core.Defects.DefectInputException>(() =>
            DefectConditionPoints.Given(window, Host, new Dictionary<string, double> { ["Al"] = -8 }, new Dictionary<string, SystemHull>(), []));
    }
}
