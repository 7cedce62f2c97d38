using Hull.Core.Thermo;
using Hull.Core.Windows;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Windows;

/// <summary>
/// A hand-worked ternary window from handbook enthalpies of formation: spinel MgAl2O4 against MgO and Al2O3, with
/// CaO as the dopant's oxide. Only ΔfH°(298.15 K) enters (no entropy), so these are 298 K enthalpy windows, not
/// phase boundaries at temperature. Expected vertices are literals worked by hand from the same table values.
/// </summary>
public sealed class HandbookSpinelWindowTests
{
    // 1 eV per particle = 96.485 kJ/mol (CODATA: e * N_A = 96 485.33 C/mol).
    private const double KilojoulesPerMolePerEv = 96.485;

    // The hand arithmetic is carried to 1e-12 eV; 1e-9 eV is the check tolerance.
    private const double ToleranceEv = 1e-9;

    // CRC Handbook of Chemistry and Physics, 97th ed. (2016), section 5, "Standard Thermodynamic Properties of
    // Chemical Substances", ΔfH°(298.15 K) in kJ/mol — from memory.
    internal const double Spinel = -2299.9;   // MgAl2O4
    internal const double Periclase = -601.6;  // MgO
    internal const double Corundum = -1675.7;  // Al2O3
    private const double Lime = -634.9;       // CaO

    internal static PhaseEntry Fu(string id, string formula, double kilojoulesPerMole) =>
        Entry(id, formula, kilojoulesPerMole / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit);

    internal static List<PhaseEntry> Oxides() =>
    [
        Fu("spinel", "MgAl2O4", Spinel), Fu("periclase", "MgO", Periclase), Fu("corundum", "Al2O3", Corundum),
        Fu("Mg", "Mg", 0), Fu("Al", "Al", 0), Fu("O2", "O2", 0),
    ];

    // In eV per formula unit: h_S = −2299.9/96.485 = −23.836865834067, h_M = −601.6/96.485 = −6.235166087993,
    // h_A = −1675.7/96.485 = −17.367466445561, h_C = −634.9/96.485 = −6.580297455563.
    // Window: Δμ_Mg + 2Δμ_Al + 4Δμ_O = h_S; Δμ_Mg + Δμ_O ≤ h_M; 2Δμ_Al + 3Δμ_O ≤ h_A; every Δμ ≤ 0. Vertices:
    //  MgO and Δμ_Al = 0: 3Δμ_O = h_S − h_M → Δμ_O = −5.867233248692, Δμ_Mg = h_M − Δμ_O = −0.367932839301
    //  Al2O3 and Δμ_Al = 0: 3Δμ_O = h_A → Δμ_O = −5.789155481854, Δμ_Mg = h_S − 4Δμ_O = −0.680243906651
    //  MgO and Δμ_O = 0: Δμ_Mg = h_M = −6.235166087993, Δμ_Al = (h_S − h_M)/2 = −8.800849873037
    //  Al2O3 and Δμ_O = 0: Δμ_Al = h_A/2 = −8.683733222781, Δμ_Mg = h_S − h_A = −6.469399388506
    // Element order Al, Mg, O (the hull's).
    internal static readonly double[][] ExpectedVertices =
    [
        [0.0, -0.367932839301, -5.867233248692],
        [0.0, -0.680243906651, -5.789155481854],
        [-8.800849873037, -6.235166087993, 0.0],
        [-8.683733222781, -6.469399388506, 0.0],
    ];

    [Fact]
    public void Spinel_window_has_the_hand_worked_vertices_and_limits()
    {
        StabilityWindow window = StabilityWindows.Of(SystemHull.OverElements(Oxides()), "spinel");
        Assert.Equal(WindowKind.Full, window.Kind);
        Assert.Equal(["Al", "Mg", "O"], window.Elements);
        Assert.Equal(4, window.Vertices.Count);
        foreach (double[] expected in ExpectedVertices)
        {
            WindowVertex v = Assert.Single(window.Vertices, v => v.ChemicalPotentialsEv.Zip(expected).All(t => Math.Abs(t.First - t.Second) <= 1e-6));
            for (int i = 0; i < 3; i++) Assert.Equal(expected[i], v.ChemicalPotentialsEv[i], ToleranceEv);
        }

        // Limiting phases: the Al-rich pair at Δμ_Al = 0 is bounded by MgO and by Al2O3, the O-rich pair likewise.
        WindowVertex alRichMgO = window.Vertices.Single(v => Math.Abs(v.ChemicalPotentialsEv[1] - -0.367932839301) < 1e-6);
        Assert.Equal(["periclase"], alRichMgO.LimitingPhases.Select(p => p.Id));
        Assert.Equal(["Al"], alRichMgO.ElementsAtReference);

        // Oxygen: highest 0 (both O-rich vertices), lowest −5.867233248692 (the MgO / Al-rich vertex).
        ElementExtremes oxygen = window.Extremes[2];
        Assert.Equal(0.0, oxygen.HighestEv, ToleranceEv);
        Assert.Equal(2, oxygen.HighestAtVertices.Count);
        Assert.Equal(-5.867233248692, oxygen.LowestEv, ToleranceEv);

        // Projected on (Δμ_Al, Δμ_Mg), oxygen left out: the quadrilateral's area by the shoelace formula on the
        // literals above in the order Al-rich MgO, Al-rich Al2O3, O-rich Al2O3, O-rich MgO.
        double[][] ring = [ExpectedVertices[0], ExpectedVertices[1], ExpectedVertices[3], ExpectedVertices[2]];
        double twiceArea = 0;
        for (int k = 0; k < 4; k++) twiceArea += ring[k][0] * ring[(k + 1) % 4][1] - ring[(k + 1) % 4][0] * ring[k][1];
        Assert.Equal(["Al", "Mg"], window.Size!.ProjectionElements);
        Assert.Equal(Math.Abs(twiceArea) / 2, window.Size.ProjectedMeasureEvPowK, 1e-8);
    }

    [Fact]
    public void Calcium_limit_is_set_by_lime_at_the_oxygen_lean_vertex()
    {
        List<PhaseEntry> entries = [.. Oxides(), Fu("lime", "CaO", Lime), Fu("Ca", "Ca", 0)];
        SystemHull host = SystemHull.OverElements(entries.Where(e => !e.Composition.Contains("Ca")).ToArray());
        SystemHull extended = SystemHull.OverElements(entries);
        DopantLimit limit = DopantLimits.Of(host, extended, "spinel", "Ca");

        // Δμ_Ca ≤ h_C − Δμ_O: at Δμ_O = −5.867233248692, −6.580297455563 + 5.867233248692 = −0.713064206871; at the
        // O-rich vertices h_C itself, −6.580297455563.
        Assert.Equal(-0.713064206871, limit.OverallMaxEv, ToleranceEv);
        Assert.Equal(["lime"], limit.OverallLimitingPhases.Select(p => p.Id));
        Assert.Equal(["Al", "Mg", "O", "Ca"], limit.ExtendedElements);
        var byOxygen = limit.PerHostVertex.GroupBy(v => Math.Round(limit.Host.Vertices[v.HostVertex].ChemicalPotentialsEv[2], 6)).ToDictionary(g => g.Key, g => g.Max(v => v.MaxDopantPotentialEv));
        Assert.Equal(-0.713064206871, byOxygen[-5.867233], ToleranceEv);
        Assert.Equal(-0.791141973709, byOxygen[-5.789155], ToleranceEv);
        Assert.Equal(-6.580297455563, byOxygen[0.0], ToleranceEv);
        Assert.All(limit.PerHostVertex, v => Assert.Equal(["lime"], v.LimitingPhases.Select(p => p.Id)));
    }

    [Fact]
    public void Slices_through_the_spinel_window()
    {
        SystemHull hull = SystemHull.OverElements(Oxides());

        // Δμ_O = −2: Δμ_Mg + 2Δμ_Al = h_S + 8 = −15.836865834067; MgO gives Δμ_Mg ≤ h_M + 2 = −4.235166087993, so
        // Δμ_Al ≥ (−15.836865834067 + 4.235166087993)/2 = −5.800849873037; Al2O3 gives Δμ_Al ≤ (h_A + 6)/2 =
        // −5.683733222781, so Δμ_Mg ≥ −15.836865834067 + 11.367466445561 = −4.469399388506.
        WindowSlice slice = StabilityWindows.Slice(hull, "spinel", new Dictionary<string, double> { ["O"] = -2.0 });
        Assert.False(slice.Misses);
        Assert.Equal(1, slice.Slice.Dimension);
        Assert.Equal(2, slice.Slice.Vertices.Count);
        Assert.Contains(slice.Slice.Vertices, v => Math.Abs(v.ChemicalPotentialsEv[0] - -5.800849873037) < ToleranceEv
            && Math.Abs(v.ChemicalPotentialsEv[1] - -4.235166087993) < ToleranceEv && v.LimitingPhases.Single().Id == "periclase");
        Assert.Contains(slice.Slice.Vertices, v => Math.Abs(v.ChemicalPotentialsEv[0] - -5.683733222781) < ToleranceEv
            && Math.Abs(v.ChemicalPotentialsEv[1] - -4.469399388506) < ToleranceEv && v.LimitingPhases.Single().Id == "corundum");

        // Δμ_O = −7 is below the lowest oxygen potential of the window (−5.867233248692): the nearest point is that
        // vertex, 7 − 5.867233248692 = 1.132766751308 eV away.
        WindowSlice miss = StabilityWindows.Slice(hull, "spinel", new Dictionary<string, double> { ["O"] = -7.0 });
        Assert.True(miss.Misses);
        Assert.Equal(1.132766751308, miss.DistanceEv!.Value, ToleranceEv);
        Assert.Equal(-0.367932839301, miss.NearestPointEv![1], 1e-8);

        var above = Assert.Throws<WindowInputException>(() => StabilityWindows.Slice(hull, "spinel", new Dictionary<string, double> { ["O"] = 0.5 }));
        Assert.Equal(WindowInputSubject.Slice, above.Subject);
        Assert.Contains("above the element's reference", above.Message);
        WindowSlice allowed = StabilityWindows.Slice(hull, "spinel", new Dictionary<string, double> { ["O"] = 0.5 }, allowAboveReference: true);
        Assert.True(allowed.Misses);
        Assert.Equal(0.5, allowed.DistanceEv!.Value, ToleranceEv);
    }

    [Fact]
    public void Compounds_on_a_tie_line_above_the_hull_and_lowered()
    {
        // Mg2Al2O5 = MgO + MgAl2O4 at exactly the sum of their enthalpies: on the hull, not a vertex; its window is
        // the segment where both coexist (Δμ_Mg + Δμ_O = h_M on the spinel plane): the two MgO vertices above.
        // MgAl2O4 written again 0.5 eV per formula unit higher: above the hull by 0.5/7 = 0.071428571429 eV/atom.
        List<PhaseEntry> entries = [.. Oxides(), Fu("mix", "Mg2Al2O5", Spinel + Periclase), Fu("spinel-hi", "MgAl2O4", Spinel + 0.5 * KilojoulesPerMolePerEv)];
        SystemHull hull = SystemHull.OverElements(entries);
        StabilityWindow segment = StabilityWindows.Of(hull, "mix");
        Assert.Equal(WindowKind.LowerDimensional, segment.Kind);
        Assert.Equal(1, segment.Dimension);
        Assert.Equal(["periclase", "spinel"], segment.CoexistingPhases.Select(p => p.Id).Order(StringComparer.Ordinal));
        Assert.Equal(2, segment.Vertices.Count);
        Assert.Contains(segment.Vertices, v => Math.Abs(v.ChemicalPotentialsEv[1] - -0.367932839301) < 1e-9);
        Assert.Contains(segment.Vertices, v => Math.Abs(v.ChemicalPotentialsEv[1] - -6.235166087993) < 1e-9);

        StabilityWindow none = StabilityWindows.Of(hull, "spinel-hi");
        Assert.Equal(WindowKind.AboveHull, none.Kind);
        Assert.False(none.Exists);
        Assert.Equal(0.5 / 7, none.Compound.EnergyAboveHullEvPerAtom, 1e-9);
        Assert.Equal(["spinel"], none.Compound.Decomposition.Products.Select(p => p.Phase.Id));

        StabilityWindow lowered = StabilityWindows.Of(hull, "spinel-hi", new WindowOptions(aboveHullToleranceEvPerAtom: 0.1));
        Assert.Equal(WindowKind.Lowered, lowered.Kind);
        Assert.Equal(WindowOptions.DefaultLoweringEvPerAtom, lowered.LoweredByEvPerAtom);
        Assert.Equal(2, lowered.Dimension);
        // Lowered by δ per atom, 7δ per formula unit: Σ n_i Δμ_i = h_S − 7δ at every vertex.
        Assert.All(lowered.Vertices, v => Assert.Equal(Spinel / KilojoulesPerMolePerEv - 7 * 1e-3,
            2 * v.ChemicalPotentialsEv[0] + v.ChemicalPotentialsEv[1] + 4 * v.ChemicalPotentialsEv[2], 1e-9));
    }

    [Fact]
    public void Bad_questions_are_refused_with_what_and_where()
    {
        List<PhaseEntry> entries = [.. Oxides(), Fu("lime", "CaO", Lime)];
        SystemHull host = SystemHull.OverElements(Oxides());
        SystemHull extended = SystemHull.OverElements(entries);
        Assert.Equal(WindowInputSubject.Compound, Assert.Throws<WindowInputException>(() => StabilityWindows.Of(host, "nope")).Subject);
        Assert.Contains("does not contain every element", Assert.Throws<WindowInputException>(() => StabilityWindows.Of(host, "periclase")).Message);
        var inHost = Assert.Throws<WindowInputException>(() => DopantLimits.Of(host, SystemHull.OverElements(Oxides()), "spinel", "Mg"));
        Assert.Equal(WindowInputSubject.Dopant, inHost.Subject);
        Assert.Contains("already an element of the host", inHost.Message);
        SystemHull withZinc = SystemHull.OverElements(Oxides(), elements: ["Al", "Mg", "O", "Zn"]);
        Assert.Contains("has no phase in the data", Assert.Throws<WindowInputException>(() => DopantLimits.Of(host, withZinc, "spinel", "Zn")).Message);
        Assert.Contains("not an element symbol", Assert.Throws<WindowInputException>(() => DopantLimits.Of(host, extended, "spinel", "Qq")).Message);
        Assert.Contains("not an element of", Assert.Throws<WindowInputException>(() => StabilityWindows.Slice(host, "spinel", new Dictionary<string, double> { ["Ca"] = -1 })).Message);
        Assert.Contains("cannot leave out", Assert.Throws<WindowInputException>(() => new WindowOptions(projectionOmits: "Ca") is var o ? StabilityWindows.Of(host, "spinel", o) : null).Message);
    }

    [Fact]
    public void Ion_potentials_read_as_volts_against_the_metal()
    {
        // common practice: V = −Δμ/z; Δμ_Li = −3.0 eV is 3.0 V against Li metal, Δμ_Mg = −3.0 eV is 1.5 V against Mg.
        Assert.True(IonVoltage.TryGetChargeNumber("Li", out int li));
        Assert.Equal(3.0, IonVoltage.VoltsAgainstMetal(-3.0, li), 1e-15);
        Assert.True(IonVoltage.TryGetChargeNumber("Mg", out int mg));
        Assert.Equal(1.5, IonVoltage.VoltsAgainstMetal(-3.0, mg), 1e-15);
        Assert.False(IonVoltage.TryGetChargeNumber("O", out _));
    }
}
