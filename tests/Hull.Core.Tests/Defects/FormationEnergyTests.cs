using Hull.Core.Defects;

namespace Hull.Core.Tests.Defects;

/// <summary>
/// Formation energies, transition levels, negative U and complex binding of the study worked by hand below.
/// </summary>
/// <remarks>
/// Worked by hand (E_F above the VBM; a_q = E_f(q; E_F = 0); E_f(q) = a_q + q E_F):
/// V_O: a(2+) = 1.0, a(+) = 3.5, a(0) = 5.0.
///   ε(2+/+) = (1.0 − 3.5)/(1 − 2) = 2.5; ε(2+/0) = (1.0 − 5.0)/(0 − 2) = 2.0; ε(+/0) = (3.5 − 5.0)/(0 − 1) = 1.5.
///   From E_F = −∞ the 2+ line is lowest; it meets the 0 line first (2.0 &lt; 2.5), so the thermodynamic level is
///   ε(2+/0) = 2.0 and + is never lowest: ε(2+/+) and ε(+/0) are not-ground levels.
///   U(+) = a(2+) + a(0) − 2a(+) = 1.0 + 5.0 − 7.0 = −1.0 &lt; 0: negative U.
/// Li_Mg: a(0) = 2.0, a(−) = 8.5: ε(0/−) = (2.0 − 8.5)/(−1 − 0) = 6.5, above the 6.0 eV gap: flagged.
/// V_O+Li_Mg: a(+) = 5.0, a(0) = 6.2. Parts summing to +: V_O(2+) + Li_Mg(−) = 9.5, V_O(+) + Li_Mg(0) = 5.5,
///   least 5.5, binding 5.5 − 5.0 = 0.5. Summing to 0: V_O(0) + Li_Mg(0) = 7.0, V_O(+) + Li_Mg(−) = 12.0,
///   least 7.0, binding 7.0 − 6.2 = 0.8.
/// </remarks>
public sealed class FormationEnergyTests
{
    // The published α has 4 decimals: 5e-5 · q² e²/(4πε₀)/(2εL) ≤ 1.5e-6 eV for |q| ≤ 2.
    private const double HandEv = 2e-6;

    private static FormationEnergyCalculator Calculator() => new(WorkedDefectStudy.Study(), WorkedDefectStudy.References, WorkedDefectStudy.Point);

    [Fact]
    public void Formation_energies_are_the_hand_intercepts_plus_q_times_the_fermi_level()
    {
        var calc = Calculator();
        var vacancy = calc.Study.Find("V_O")!;
        foreach (double fermi in new[] { 0.0, 1.3, 6.0 })
        {
            foreach (var (q, a) in WorkedDefectStudy.VacancyIntercepts)
            {
                var f = calc.At(vacancy, vacancy.State(q)!, fermi);
                Assert.Equal(a + q * fermi, f.TotalEv, HandEv);
                // the terms add up and each is what the formula says
                Assert.Equal(q * (WorkedDefectStudy.Vbm + fermi), f.ElectronReservoirEv, 12);
                Assert.Equal(-(-1) * (-4.9 - 1.0), f.ChemicalPotentialEv, 12);
                Assert.Equal(q * q * WorkedDefectStudy.C, f.ImageChargeEv, HandEv);
                Assert.Equal(0.0, f.AlignmentEv);
                Assert.Equal(f.SupercellDifferenceEv + f.ChemicalPotentialEv + f.ElectronReservoirEv + f.ImageChargeEv + f.AlignmentEv, f.TotalEv, 12);
            }
        }

        // At E_F = 1.0 the 2+ state is lowest: 1.0 + 2·1.0 = 3.0 against 4.5 and 5.0.
        Assert.Equal(2, calc.Lowest(vacancy, 1.0).Charge);
        Assert.Equal(0, calc.Lowest(vacancy, 3.0).Charge);
    }

    [Fact]
    public void Thermodynamic_and_not_ground_levels_and_negative_u()
    {
        var calc = Calculator();
        var vacancy = calc.Study.Find("V_O")!;
        var levels = ChargeTransitions.Levels("V_O", calc.AtValenceBandMaximum(vacancy), WorkedDefectStudy.Gap);
        var thermodynamic = Assert.Single(levels, l => l.Kind == TransitionLevelKind.Thermodynamic);
        Assert.Equal((2, 0), (thermodynamic.Charge, thermodynamic.OtherCharge));
        Assert.Equal(2.0, thermodynamic.LevelEv, HandEv);
        Assert.True(thermodynamic.InsideGap);
        Assert.Equal(1.0 + 2 * 2.0, thermodynamic.FormationEnergyEv, HandEv);
        var others = levels.Where(l => l.Kind == TransitionLevelKind.NotGround).ToDictionary(l => (l.Charge, l.OtherCharge), l => l.LevelEv);
        Assert.Equal(2, others.Count);
        Assert.Equal(2.5, others[(2, 1)], HandEv);
        Assert.Equal(1.5, others[(1, 0)], HandEv);

        var u = Assert.Single(ChargeTransitions.EffectiveU("V_O", calc.AtValenceBandMaximum(vacancy)));
        Assert.Equal(1, u.Charge);
        Assert.Equal(-1.0, u.UEv, HandEv);
        Assert.True(u.IsNegative);
    }

    [Fact]
    public void Levels_outside_the_gap_are_flagged()
    {
        var calc = Calculator();
        var dopant = calc.Study.Find("Li_Mg")!;
        var level = Assert.Single(ChargeTransitions.Levels("Li_Mg", calc.AtValenceBandMaximum(dopant), WorkedDefectStudy.Gap));
        Assert.Equal(TransitionLevelKind.Thermodynamic, level.Kind);
        Assert.Equal(6.5, level.LevelEv, HandEv);
        Assert.False(level.InsideGap);
    }

    [Fact]
    public void Three_lines_through_one_point_give_one_thermodynamic_level()
    {
        // Worked by hand: a(+) = 1, a(0) = 2, a(−) = 3 meet at E_F = 1 (1 + 1 = 2 = 3 − 1): one level ε(+/−) = 1.
        var levels = ChargeTransitions.Levels("X", new Dictionary<int, double> { [1] = 1, [0] = 2, [-1] = 3 }, 3);
        var t = Assert.Single(levels, l => l.Kind == TransitionLevelKind.Thermodynamic);
        Assert.Equal((1, -1, 1.0), (t.Charge, t.OtherCharge, t.LevelEv));
        Assert.Equal(0.0, Assert.Single(ChargeTransitions.EffectiveU("X", new Dictionary<int, double> { [1] = 1, [0] = 2, [-1] = 3 })).UEv);
    }

    [Fact]
    public void Complex_binding_energies_against_the_cheapest_parts()
    {
        var bindings = ComplexBindings.All(Calculator()).ToDictionary(b => b.Charge);
        Assert.Equal(2, bindings.Count);
        Assert.Equal(0.5, bindings[1].BindingEnergyEv, HandEv);
        Assert.Equal([("V_O", 1), ("Li_Mg", 0)], bindings[1].Parts);
        Assert.Equal(0.8, bindings[0].BindingEnergyEv, HandEv);
        Assert.Equal([("V_O", 0), ("Li_Mg", 0)], bindings[0].Parts);
        // Independent of Δμ: atoms are conserved (common practice).
        var shifted = new ChemicalPotentialPoint("other", new Dictionary<string, double> { ["O"] = -3.0, ["Mg"] = -1.0, ["Li"] = -0.5 });
        var again = ComplexBindings.All(new FormationEnergyCalculator(WorkedDefectStudy.Study(), WorkedDefectStudy.References, shifted));
        Assert.Equal(0.5, again.Single(b => b.Charge == 1).BindingEnergyEv, HandEv);
    }

    [Fact]
    public void A_dopant_without_elemental_reference_or_delta_mu_is_refused()
    {
        var noLi = WorkedDefectStudy.References.Where(p => p.Key != "Li").ToDictionary();
        var e = Assert.Throws<DefectInputException>(() => new FormationEnergyCalculator(WorkedDefectStudy.Study(), noLi, WorkedDefectStudy.Point));
        Assert.Equal("defects[1].atoms.Li", e.Field);
        Assert.Contains("dopant Li has no elemental reference", e.Message);
        var noMu = new ChemicalPotentialPoint("p", new Dictionary<string, double> { ["O"] = 0, ["Mg"] = 0 });
        Assert.Equal("delta_mu.Li", Assert.Throws<DefectInputException>(() => new FormationEnergyCalculator(WorkedDefectStudy.Study(), WorkedDefectStudy.References, noMu)).Field);
    }

    [Fact]
    public void Bulk_energy_far_from_the_dataset_host_is_a_warning()
    {
        var study = WorkedDefectStudy.Study();
        Assert.Null(study.CompareWithDatasetHost(-400.0 / 32 + 0.005));
        Assert.Contains("different settings", study.CompareWithDatasetHost(-400.0 / 32 + 0.05));
    }
}
