using Hull.Core.Chemistry;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Electrochemistry;
using Xunit;
using static Hull.Core.Tests.Thermo.OpenElementHullTests;

namespace Hull.Core.Tests.Thermo.Electrochemistry;

public sealed class InsertionVoltageTests
{
    /// <summary>
    /// Hand-worked Li into Sn, formation energies per formula unit with one Sn, G(x) for Li_xSn: LiSn −0.80 eV,
    /// Li2Sn −1.30, Li3Sn −2.00, Li4Sn −2.30. The lower hull of G against x runs 0 → 1 → 3 → 4, slopes −0.80, −0.60,
    /// −0.30 eV per Li (Li2Sn lies 0.10 eV above the chord −1.40 and makes no plateau), then Li metal (slope 0).
    /// V = −slope/1: 0.80, 0.60, 0.30 V; the Δx-weighted mean (0.80·1 + 0.60·2 + 0.30·1)/4 = 0.575 V. For a
    /// pseudo-binary plateau from Li_x1Sn to Li_x2Sn, V = −[E(x2) − E(x1) − (x2 − x1) E_Li]/(x2 − x1), E_Li = 0.
    /// </summary>
    [Fact]
    public void Hand_worked_host_with_three_plateaus_and_a_metastable_intermediate()
    {
        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0), Formation("Sn", "Sn", 0), Formation("LiSn", "LiSn", -0.80),
            Formation("Li2Sn", "Li2Sn", -1.30), Formation("Li3Sn", "Li3Sn", -2.00), Formation("Li4Sn", "Li4Sn", -2.30),
        ];
        VoltageProfile profile = InsertionVoltages.Profile(SystemHull.OverElements(entries), Composition.Parse("Sn"), "Li");
        Assert.Equal(3, profile.Plateaus.Count);
        Assert.Equal([0.80, 0.60, 0.30], profile.Plateaus.Select(p => Math.Round(p.VoltsAgainstMetal, 12)));
        Assert.Equal([0.0, 1.0, 3.0], profile.Plateaus.Select(p => p.IonsPerHostFrom));
        Assert.Equal([1.0, 3.0, 4.0], profile.Plateaus.Select(p => p.IonsPerHostTo));
        Assert.Equal(["LiSn", "Li3Sn"], profile.Plateaus[1].Phases.Select(p => p.Phase.Id).Order(StringComparer.Ordinal).Reverse());
        Assert.DoesNotContain(profile.Plateaus, p => p.Phases.Any(q => q.Phase.Id == "Li2Sn"));
        Assert.Equal(0.575, profile.AverageVoltsAgainstMetal, 12);
        Assert.True(profile.EndsAtIonMetal);
        Assert.Equal(Composition.Parse("Li4Sn"), profile.FullyInserted);
        // Two-phase formula on each plateau, E per formula unit Li_xSn.
        double[] e = [0.0, -0.80, -1.30, -2.00, -2.30];
        foreach ((double x1, double x2, VoltagePlateau plateau) in new[] { (0.0, 1.0, profile.Plateaus[0]), (1.0, 3.0, profile.Plateaus[1]), (3.0, 4.0, profile.Plateaus[2]) })
        {
            Assert.Equal(-(e[(int)x2] - e[(int)x1] - ((x2 - x1) * 0.0)) / (x2 - x1), plateau.VoltsAgainstMetal, 12);
        }

        // Capacity: 26 801.48 × 4 / M(Sn) mAh/g (common practice: Q = z Δx F / (3.6 M)); M(Sn) = 118.710 g/mol
        // (IUPAC standard atomic weight); energy density Q·V̄.
        Assert.Equal(26801.48 * 4 / 118.710, profile.CapacityPerHostMassMilliampHoursPerGram, 0.05);
        Assert.Equal(profile.CapacityPerHostMassMilliampHoursPerGram * 0.575, profile.EnergyDensityPerHostMassWattHoursPerKilogram, 9);
    }

    /// <summary>
    /// A conversion path, hand-worked: FeF2 + 2 Li → Fe + 2 LiF with formation energies LiF −6.0 and FeF2 −7.0 eV per
    /// formula unit gives one three-phase plateau 0 ≤ x ≤ 2 at V = −(2·(−6.0) − (−7.0))/2 = 2.5 V, then Li metal.
    /// </summary>
    [Fact]
    public void Conversion_region_is_one_plateau_with_three_phases()
    {
        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0), Formation("Fe", "Fe", 0), Formation("F", "F", 0),
            Formation("LiF", "LiF", -6.0), Formation("FeF2", "FeF2", -7.0),
        ];
        VoltageProfile profile = InsertionVoltages.Profile(SystemHull.OverElements(entries), Composition.Parse("FeF2"), "Li");
        VoltagePlateau plateau = Assert.Single(profile.Plateaus);
        Assert.True(plateau.IsConversion);
        Assert.Equal(["Fe", "FeF2", "LiF"], plateau.Phases.Select(p => p.Phase.Id));
        Assert.Equal(2.5, plateau.VoltsAgainstMetal, 12);
        Assert.Equal(2.0, plateau.IonsPerHostTo, 12);
    }

    /// <summary>
    /// A divalent ion, hand-worked: Mg2Sn at −1.0 eV per formula unit gives one plateau 0 ≤ x ≤ 2 with slope −0.5 eV
    /// per Mg, so V = 0.5/2 = 0.25 V (z = 2 for Mg, common practice), and the capacity counts two electrons per Mg.
    /// </summary>
    [Fact]
    public void Magnesium_counts_two_electrons()
    {
        PhaseEntry[] entries = [Formation("Mg", "Mg", 0), Formation("Sn", "Sn", 0), Formation("Mg2Sn", "Mg2Sn", -1.0)];
        VoltageProfile profile = InsertionVoltages.Profile(SystemHull.OverElements(entries), Composition.Parse("Sn"), "Mg");
        Assert.Equal(2, profile.ChargeNumber);
        Assert.Equal(0.25, Assert.Single(profile.Plateaus).VoltsAgainstMetal, 12);
        Assert.Equal(InsertionVoltages.Capacity(1, 4.0, Composition.Parse("Sn")), profile.CapacityPerHostMassMilliampHoursPerGram, 9);
        Assert.Equal(0.125, InsertionVoltages.Profile(SystemHull.OverElements(entries), Composition.Parse("Sn"), "Mg", chargeNumber: 4).Plateaus[0].VoltsAgainstMetal, 12);
    }

    /// <summary>LiCoO2 at Δx = 1: 273.8 mAh/g per mass of LiCoO2 and 294.7 per mass of CoO2 (common practice, from the molar masses).</summary>
    [Fact]
    public void Lithium_cobalt_oxide_theoretical_capacity()
    {
        Assert.Equal(273.8, InsertionVoltages.Capacity(1, 1.0, Composition.Parse("LiCoO2")), 0.05);
        Assert.Equal(294.7, InsertionVoltages.Capacity(1, 1.0, Composition.Parse("CoO2")), 0.05);

        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0), Formation("Co", "Co", 0), Formation("O", "O", 0), Formation("CoO2", "CoO2", -4.0),
            Formation("Li0.5CoO2", "Li0.5CoO2", -6.3), Formation("LiCoO2", "LiCoO2", -8.2), Formation("Li2O", "Li2O", -6.2),
            Formation("CoO", "CoO", -2.5),
        ];
        VoltageProfile profile = InsertionVoltages.Profile(
            SystemHull.OverElements(entries), Composition.Parse("CoO2"), "Li", insertedEnd: Composition.Parse("LiCoO2"));
        Assert.Equal(1.0, profile.IonsPerHostInserted, 12);
        Assert.False(profile.EndsAtIonMetal);
        Assert.Equal(294.7, profile.CapacityPerHostMassMilliampHoursPerGram, 0.05);
        Assert.Equal(273.8, profile.CapacityPerInsertedMassMilliampHoursPerGram, 0.05);
        // Two plateaus by the two-phase formula: (−6.3 + 4.0)/0.5 → 4.6 V, then (−8.2 + 6.3)/0.5 → 3.8 V.
        Assert.Equal([4.6, 3.8], profile.Plateaus.Select(p => Math.Round(p.VoltsAgainstMetal, 12)));
    }

    [Theory]
    [InlineData(51, "FeMnO4")]
    [InlineData(52, "MnO2")]
    [InlineData(53, "Fe2O3")]
    public void Each_plateau_voltage_is_minus_the_scipy_dual_for_the_ion(int seed, string host)
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed, compounds: 200);
        SystemHull hull = SystemHull.OverElements(entries);
        VoltageProfile profile = InsertionVoltages.Profile(hull, Composition.Parse(host), "Li");
        Assert.True(profile.Plateaus.Count >= 2, $"only {profile.Plateaus.Count} plateaus; the check needs more");

        string[] components = [.. hull.Components];
        Composition hostComposition = Composition.Parse(host);
        double[][] queries = profile.Plateaus.Select(p =>
        {
            double mid = (p.IonsPerHostFrom + p.IonsPerHostTo) / 2;
            double[] amounts = components.Select(c => hostComposition.AmountOf(c).ToDouble() + (c == "Li" ? mid : 0)).ToArray();
            return amounts.Select(a => a / amounts.Sum()).ToArray();
        }).ToArray();
        long[][] amounts = entries.Select(e => components.Select(c => (long)e.Composition.AmountOf(c).ToDouble()).ToArray()).ToArray();
        IReadOnlyList<HullLpAnswer> lp = ScipyLpRunner.Solve(
            new HullLpProblem(amounts, hull.Entries.Select(e => e.AxisEnergyEvPerAtom).ToArray(), queries));
        int li = Array.IndexOf(components, "Li");
        for (int k = 0; k < profile.Plateaus.Count; k++)
        {
            // y_Li − E_Li with E_Li = 0 on the formation-energy axis; z = 1.
            Assert.Equal(-lp[k].Duals![li], profile.Plateaus[k].VoltsAgainstMetal, 1e-7);
        }

        // Voltages fall as the host fills (convexity of the hull).
        for (int k = 1; k < profile.Plateaus.Count; k++)
        {
            Assert.True(profile.Plateaus[k].VoltsAgainstMetal < profile.Plateaus[k - 1].VoltsAgainstMetal);
        }
    }

    /// <summary>
    /// On total energies: the LP over total energies per atom has the absolute μ_Li as its dual y_Li, and each
    /// plateau's voltage is −(y_Li − E_Li)/z with E_Li lithium's reference energy per atom (common practice).
    /// </summary>
    [Fact]
    public void Plateau_voltage_is_minus_the_scipy_dual_less_the_metal_energy_on_total_energies()
    {
        var references = new Dictionary<string, double> { ["Fe"] = -8.3, ["Li"] = -1.9, ["Mn"] = -9.0, ["O"] = -4.9 };
        PhaseEntry[] totals = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 54, compounds: 200).Select(e =>
        {
            double perUnit = (e.EnergyEv * e.Composition.AtomsPerFormulaUnit.ToDouble())
                + e.Composition.Elements.Sum(s => e.Composition.AmountOf(s).ToDouble() * references[s]);
            return new PhaseEntry(e.Id, e.Composition, perUnit, EnergyBasis.TotalPerFormulaUnit);
        }).ToArray();
        SystemHull hull = SystemHull.OverElements(totals, new ElementalReferences(references));
        Composition host = Composition.Parse("FeMnO4");
        VoltageProfile profile = InsertionVoltages.Profile(hull, host, "Li");
        Assert.True(profile.Plateaus.Count >= 2);

        string[] components = [.. hull.Components];
        double[][] queries = profile.Plateaus.Select(p =>
        {
            double mid = (p.IonsPerHostFrom + p.IonsPerHostTo) / 2;
            double[] amounts = components.Select(c => host.AmountOf(c).ToDouble() + (c == "Li" ? mid : 0)).ToArray();
            return amounts.Select(a => a / amounts.Sum()).ToArray();
        }).ToArray();
        long[][] amounts = totals.Select(e => components.Select(c => (long)e.Composition.AmountOf(c).ToDouble()).ToArray()).ToArray();
        IReadOnlyList<HullLpAnswer> lp = ScipyLpRunner.Solve(new HullLpProblem(amounts, totals.Select(e => e.EnergyEvPerAtom).ToArray(), queries));
        int li = Array.IndexOf(components, "Li");
        for (int k = 0; k < profile.Plateaus.Count; k++)
        {
            Assert.Equal(-(lp[k].Duals![li] - references["Li"]) / 1, profile.Plateaus[k].VoltsAgainstMetal, 1e-7);
        }
    }

    [Fact]
    public void Bad_input_names_what_and_where()
    {
        PhaseEntry[] entries = [Formation("Li", "Li", 0), Formation("Sn", "Sn", 0), Formation("Mg", "Mg", 0), Formation("LiSn", "LiSn", -0.8)];
        SystemHull hull = SystemHull.OverElements(entries);
        var error = Assert.Throws<ThermoInputException>(() => InsertionVoltages.Profile(hull, Composition.Parse("Sn"), "Na"));
        Assert.Contains("'Na' is not an element of the chemical system Li-Mg-Sn", error.Message);
        error = Assert.Throws<ThermoInputException>(() => InsertionVoltages.Profile(hull, Composition.Parse("Sn"), "Mg"));
        Assert.Contains("no phase containing Mg besides the metal", error.Message);
        error = Assert.Throws<ThermoInputException>(() => InsertionVoltages.Profile(hull, Composition.Parse("SnO"), "Li"));
        Assert.Contains("O, which is not in the chemical system", error.Message);
        error = Assert.Throws<ThermoInputException>(() => InsertionVoltages.Profile(hull, Composition.Parse("Sn"), "Li", insertedEnd: Composition.Parse("LiMg")));
        Assert.Contains("not the host Sn plus Li", error.Message);
        error = Assert.Throws<ThermoInputException>(() => InsertionVoltages.Profile(hull, Composition.Parse("Sn"), "Li", chargeNumber: 0));
        Assert.Contains("positive integer", error.Message);
        error = Assert.Throws<ThermoInputException>(() => InsertionVoltages.Profile(hull, Composition.Parse("Li"), "Li"));
        Assert.Contains("is the ion Li itself", error.Message);
    }
}
