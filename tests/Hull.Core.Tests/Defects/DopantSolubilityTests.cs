using Hull.Core.Defects;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Windows;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// Li in the worked MgO study: the extended (Mg-O-Li) polytope from handbook enthalpies, and the dopant solved at
/// every vertex against SciPy brentq on the formulas with intercepts shifted by hand.
/// </summary>
public sealed class DopantSolubilityTests
{
    // 1 eV per particle = 96.485 kJ/mol (CODATA: e N_A = 96 485.33 C/mol).
    private const double KilojoulesPerMolePerEv = 96.485;

    // CRC Handbook of Chemistry and Physics, 97th ed. (2016), section 5, ΔfH°(298.15 K) in kJ/mol — from memory.
    private const double Periclase = -601.6; // MgO
    private const double LithiumOxide = -597.9; // Li2O

    private const double Nc300 = 1e19, Nv300 = 5e19;

    private static PhaseEntry Fu(string id, string formula, double kilojoulesPerMole) =>
        Entry(id, formula, kilojoulesPerMole / KilojoulesPerMolePerEv, EnergyBasis.FormationPerFormulaUnit);

    private static DopantLimit Limit()
    {
        List<PhaseEntry> entries = [Fu("periclase", "MgO", Periclase), Fu("lithia", "Li2O", LithiumOxide), Fu("Mg", "Mg", 0), Fu("O2", "O2", 0), Fu("Li", "Li", 0)];
        var host = SystemHull.OverElements(entries.Where(e => !e.Composition.Contains("Li")).ToArray());
        return DopantLimits.Of(host, SystemHull.OverElements(entries), "periclase", "Li");
    }

    [Theory]
    [InlineData(CarrierStatistics.FermiDirac, ConcentrationForm.Dilute)]
    [InlineData(CarrierStatistics.Boltzmann, ConcentrationForm.SiteBlocking)]
    public void Every_extended_vertex_matches_scipy_and_the_most_soluble_is_named(CarrierStatistics statistics, ConcentrationForm form)
    {
        var limit = Limit();
        // h_MgO = −601.6/96.485 = −6.235166 eV, h_Li2O = −597.9/96.485 = −6.196818 eV. Host: Δμ_Mg + Δμ_O = h_MgO,
        // Δμ_O in [h_MgO, 0]; Li2O: 2Δμ_Li + Δμ_O ≤ h_Li2O; Δμ_Li ≤ 0. The upper surface min(0, (h_Li2O − Δμ_O)/2)
        // has three vertices: Δμ_O = h_MgO and Δμ_O = h_Li2O at Δμ_Li = 0, and Δμ_O = 0 at Δμ_Li = h_Li2O/2 = −3.098409.
        Assert.Equal(3, limit.ExtendedVertices.Count);
        Assert.Equal(0.0, limit.OverallMaxEv, 9);
        int oxygen = limit.ExtendedElements.ToList().IndexOf("O"), lithium = limit.ExtendedElements.ToList().IndexOf("Li");
        Assert.Contains(limit.ExtendedVertices, v => Math.Abs(v.ChemicalPotentialsEv[oxygen]) < 1e-9 && Math.Abs(v.ChemicalPotentialsEv[lithium] - LithiumOxide / KilojoulesPerMolePerEv / 2) < 1e-9);

        var study = WorkedDefectStudy.Study();
        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(Nc300, Nv300), statistics, form);
        double[] temperatures = [900, 1400];
        var result = DopantSolubility.Evaluate(study, WorkedDefectStudy.References, limit, model, temperatures);
        Assert.Equal("Li", result.Dopant);
        Assert.Equal(3, result.Vertices.Count);

        var reference = new CarriersReference();
        var tasks = new int[temperatures.Length, 3];
        for (int v = 0; v < 3; v++)
        {
            var deltaMu = result.Vertices[v].Point.DeltaMuEv;
            for (int i = 0; i < limit.ExtendedElements.Count; i++) Assert.Equal(limit.ExtendedVertices[v].ChemicalPotentialsEv[i], deltaMu[limit.ExtendedElements[i]]);
            var ensemble = WorkedDefectStudy.HandEnsemble(deltaMu);
            for (int t = 0; t < temperatures.Length; t++) tasks[t, v] = reference.Neutrality(ensemble, Nc300, Nv300, temperatures[t], statistics, form);
        }

        var results = reference.Run();
        for (int t = 0; t < temperatures.Length; t++)
        {
            var sweep = result.Temperatures[t];
            Assert.Equal(temperatures[t], sweep.TemperatureK);
            var expectedTotals = new double[3];
            for (int v = 0; v < 3; v++)
            {
                var expected = results[tasks[t, v]]!;
                double[] totals = CarriersReference.Values(expected["totals"]);
                // One Li per Li_Mg and per complex. The study's intercepts carry the 4-digit Madelung constant: ~2e-6 eV.
                expectedTotals[v] = totals[1] + totals[2];
                var solved = sweep.PerVertex[v];
                Assert.Equal(expected["fermi"]!.GetValue<double>(), solved.Solution.FermiLevelEv, 1e-5);
                Assert.True(Math.Abs(solved.DopantPerCubicCentimetre / expectedTotals[v] - 1) < 1e-4,
                    $"T {temperatures[t]}, vertex {v}: {solved.DopantPerCubicCentimetre:G6} against {expectedTotals[v]:G6}");
            }

            int best = Array.IndexOf(expectedTotals, expectedTotals.Max());
            Assert.Equal(best, sweep.MostSolubleVertex);
            Assert.Equal(sweep.PerVertex[best].DopantPerCubicCentimetre, sweep.MaxDopantPerCubicCentimetre);
        }

        // Lithium metal is water-reactive: the answer says so.
        var caution = Assert.Single(result.Cautions, c => c.Contains("contains Li"));
        Assert.Contains("local safety rules and licensed practice", caution);
    }

    [Fact]
    public void A_dopant_no_defect_carries_and_an_empty_sweep_are_refused()
    {
        var limit = Limit();
        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(Nc300, Nv300));
        var noLithium = DefectStudy.Create(WorkedDefectStudy.Bulk(), [WorkedDefectStudy.Defects()[0]], ModelCharge.Point);
        Assert.Equal("dopant", Assert.Throws<DefectInputException>(() => DopantSolubility.Evaluate(noLithium, WorkedDefectStudy.References, limit, model, [1000])).Field);
        Assert.Equal("temperatures_k", Assert.Throws<DefectInputException>(() => DopantSolubility.Evaluate(WorkedDefectStudy.Study(), WorkedDefectStudy.References, limit, model, [])).Field);
        var overlap = Assert.Throws<DefectInputException>(() => DopantSolubility.Evaluate(WorkedDefectStudy.Study(), WorkedDefectStudy.References, limit, model, [1000], new Dictionary<string, double> { ["O"] = -1 }));
        Assert.Equal("delta_mu.O", overlap.Field);
    }
}
