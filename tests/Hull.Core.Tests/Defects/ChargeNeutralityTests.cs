using Hull.Core.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Defects;

/// <summary>The self-consistent Fermi level against closed forms worked below and against SciPy's brentq.</summary>
public sealed class ChargeNeutralityTests
{
    // k_B, CODATA 2018 (exact since the 2019 SI).
    private const double KbEvPerK = 1.380649e-23 / 1.602176634e-19;

    private const double Sites = WorkedDefectStudy.SitesPerCubicCentimetre;

    /// <summary>
    /// One donor D⁺ (V_O, degeneracy 2) and one acceptor A⁻ (Li_Mg, degeneracy 3) in the worked MgO study, Boltzmann
    /// carriers. With x = E_F/k_BT, p = N_v e^{−x}, n = N_c e^{−E_g/k_BT} e^{x}, [D⁺] = N_D e^{−a/k_BT} e^{−x} and
    /// [A⁻] = N_A e^{−b/k_BT} e^{x} (N_D, N_A the site densities times degeneracies, a and b the E_F = 0 formation
    /// energies), neutrality p + [D⁺] = n + [A⁻] gives e^{2x} = (N_D e^{−a/k_BT} + N_v) / (N_A e^{−b/k_BT} + N_c e^{−E_g/k_BT}):
    /// E_F = (k_BT/2) ln[(N_D e^{−a/k_BT} + N_v) / (N_A e^{−b/k_BT} + N_c e^{−E_g/k_BT})].
    /// </summary>
    [Theory]
    [InlineData(0.8, 3.0, 1200)]   // defects dominate: E_F near (b − a)/2
    [InlineData(2.5, 6.5, 900)]    // few acceptors: the donor against electrons
    [InlineData(4.0, 7.5, 1500)]   // both costly: nearly intrinsic
    public void Compensated_donor_and_acceptor_match_the_closed_form(double a, double b, double temperatureK)
    {
        var defects = new List<DefectInput>
        {
            WorkedDefectStudy.Defect("V_O", DefectKind.Vacancy, WorkedDefectStudy.VacancyAtoms, new() { [1] = a }) with { Degeneracy = 2 },
            WorkedDefectStudy.Defect("Li_Mg", DefectKind.Substitution, WorkedDefectStudy.DopantAtoms, new() { [-1] = b }) with { Degeneracy = 3 },
        };
        var study = DefectStudy.Create(WorkedDefectStudy.Bulk(), defects, ModelCharge.Point);
        var calculator = new FormationEnergyCalculator(study, WorkedDefectStudy.References, WorkedDefectStudy.Point);
        const double nc300 = 2e19, nv300 = 3e19;
        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(nc300, nv300), CarrierStatistics.Boltzmann);
        var solution = ChargeNeutrality.Solve(DefectEnsemble.FromCalculator(calculator), model, temperatureK);

        double kt = KbEvPerK * temperatureK, scale = Math.Pow(temperatureK / 300, 1.5);
        double nc = nc300 * scale, nv = nv300 * scale, gap = WorkedDefectStudy.Gap;
        double nd = 2 * Sites, na = 3 * Sites;
        // The study's intercepts carry the published Madelung constant to 4 digits (see WorkedDefectStudy): a and b to ~2e-6 eV.
        double aStudy = calculator.At(study.Find("V_O")!, study.Find("V_O")!.State(1)!, 0).TotalEv;
        double bStudy = calculator.At(study.Find("Li_Mg")!, study.Find("Li_Mg")!.State(-1)!, 0).TotalEv;
        Assert.Equal(a, aStudy, 2e-6);
        Assert.Equal(b, bStudy, 2e-6);
        double expected = kt / 2 * Math.Log((nd * Math.Exp(-aStudy / kt) + nv) / (na * Math.Exp(-bStudy / kt) + nc * Math.Exp(-gap / kt)));

        Assert.Equal(FermiSolveStatus.Converged, solution.Status);
        Assert.Equal(ConcentrationForm.Dilute, solution.Form);
        Assert.Equal(expected, solution.FermiLevelEv, 1e-11);

        // The net charge again, from the study's formation energies at the returned E_F.
        double ef = solution.FermiLevelEv;
        double donor = 2 * Sites * Math.Exp(-calculator.At(study.Find("V_O")!, study.Find("V_O")!.State(1)!, ef).TotalEv / kt);
        double acceptor = 3 * Sites * Math.Exp(-calculator.At(study.Find("Li_Mg")!, study.Find("Li_Mg")!.State(-1)!, ef).TotalEv / kt);
        double p = nv * Math.Exp(-ef / kt), n = nc * Math.Exp((ef - gap) / kt);
        Assert.True(Math.Abs(p + donor - n - acceptor) <= 1e-10 * (p + donor + n + acceptor), $"net {p + donor - n - acceptor:G4}");
        Assert.Equal(donor, solution.TotalOf("V_O"), donor * 1e-10);
        Assert.Equal(acceptor, solution.TotalOf("Li_Mg"), acceptor * 1e-10);
    }

    [Fact]
    public void Random_defect_sets_agree_with_scipy_brentq()
    {
        var random = new Random(1717);
        var reference = new CarriersReference();
        var cases = new List<(DefectEnsemble Ensemble, CarrierModel Model, double T, int Task)>();
        for (int k = 0; k < 12; k++)
        {
            double gap = 1 + 3 * random.NextDouble();
            var form = k % 3 == 2 ? ConcentrationForm.SiteBlocking : ConcentrationForm.Dilute;
            var statistics = k % 2 == 0 ? CarrierStatistics.FermiDirac : CarrierStatistics.Boltzmann;
            var setSites = new Dictionary<string, double> { ["A"] = 1e21 + 5e22 * random.NextDouble(), ["B"] = 1e21 + 5e22 * random.NextDouble() };
            var species = new List<DefectSpecies>();
            int count = 1 + random.Next(6);
            for (int d = 0; d < count; d++)
            {
                var charges = Enumerable.Range(-3, 7).OrderBy(_ => random.Next()).Take(1 + random.Next(4)).ToArray();
                // E_f at mid-gap between 0.3 and 3 eV, and on blocking cases some near or below zero.
                double low = form == ConcentrationForm.SiteBlocking ? -0.3 : 0.3;
                var states = charges.Select(q => new SpeciesChargeState(q, low + (3 - low) * random.NextDouble() - q * gap / 2, new[] { 1.0, 2.0, 4.0 }[random.Next(3)])).ToArray();
                string set = random.Next(2) == 0 ? "A" : "B";
                species.Add(new DefectSpecies($"X{d}", set, form == ConcentrationForm.SiteBlocking ? setSites[set] : 1e21 + 5e22 * random.NextDouble(), states, new Dictionary<string, int>()));
            }

            double donors = k % 4 == 1 ? 1e17 * random.NextDouble() : 0, acceptors = k % 4 == 3 ? 1e18 * random.NextDouble() : 0;
            double nc = 1e18 + 5e19 * random.NextDouble(), nv = 1e18 + 5e19 * random.NextDouble(), t = 400 + 1200 * random.NextDouble();
            var ensemble = DefectEnsemble.Create(gap, species);
            var model = new CarrierModel(ParabolicBands.FromEffectiveStates(nc, nv), statistics, form, donors, acceptors);
            cases.Add((ensemble, model, t, reference.Neutrality(ensemble, nc, nv, t, statistics, form, donors, acceptors)));
        }

        var results = reference.Run();
        foreach (var (ensemble, model, t, task) in cases)
        {
            var expected = results[task]!;
            var solution = ChargeNeutrality.Solve(ensemble, model, t);
            string label = $"case {task} ({model.Statistics}, {model.Form}, {ensemble.Species.Count} defects, {t:F0} K)";
            Assert.True(solution.IsConverged, label);
            Assert.True(Math.Abs(expected["fermi"]!.GetValue<double>() - solution.FermiLevelEv) < 1e-9, $"{label}: E_F {solution.FermiLevelEv:R} against {expected["fermi"]}");
            AssertRelative(expected["n"]!.GetValue<double>(), solution.ElectronsPerCubicCentimetre, 1e-8, $"{label}: n");
            AssertRelative(expected["p"]!.GetValue<double>(), solution.HolesPerCubicCentimetre, 1e-8, $"{label}: p");
            double[] totals = CarriersReference.Values(expected["totals"]);
            for (int d = 0; d < totals.Length; d++) AssertRelative(totals[d], solution.Defects[d].PerCubicCentimetre, 1e-8, $"{label}: {ensemble.Species[d].Name}");
            Assert.True(solution.RelativeChargeImbalance < 1e-9, $"{label}: imbalance {solution.RelativeChargeImbalance:G3}");
        }
    }

    [Fact]
    public void Heavy_extra_donors_push_the_level_into_the_conduction_band()
    {
        var host = DefectEnsemble.Create(1.12, []);
        var boltzmann = new CarrierModel(ParabolicBands.FromEffectiveStates(2.8e19, 1.04e19), CarrierStatistics.Boltzmann, ExtraDonorsPerCubicCentimetre: 1e21);
        var solution = ChargeNeutrality.Solve(host, boltzmann, 300);
        // n = N_D with p negligible (p/n ~ 1e-40): E_F = E_C + k_BT ln(N_D/N_c) (common practice), above the CBM.
        Assert.Equal(FermiSolveStatus.Converged, solution.Status);
        Assert.Equal(1.12 + KbEvPerK * 300 * Math.Log(1e21 / 2.8e19), solution.FermiLevelEv, 1e-11);

        // Fermi–Dirac: n = N_c F_1/2(η) = N_D; η then inverts F_1/2 (checked against the integral, not a formula of ours).
        var fd = ChargeNeutrality.Solve(host, boltzmann with { Statistics = CarrierStatistics.FermiDirac }, 300);
        double eta = (fd.FermiLevelEv - 1.12) / (KbEvPerK * 300);
        Assert.Equal(1e21 / 2.8e19, FermiDiracIntegral.Half(eta), 1e-9);
        Assert.True(eta > 5, $"η = {eta}");
    }

    [Fact]
    public void A_band_too_small_for_the_fixed_charge_has_no_neutral_level()
    {
        // The table's conduction band holds 0.5 eV × 1e20 states/eV = 5e19 cm^-3, fewer than 1e21 donors' electrons.
        var table = TabulatedBands.Create([-1, 0, 1, 1.5], [1e20, 1e20, 1e20, 1e20]);
        var solution = ChargeNeutrality.Solve(DefectEnsemble.Create(1.0, []), new CarrierModel(table, ExtraDonorsPerCubicCentimetre: 1e21), 300);
        Assert.Equal(FermiSolveStatus.NoNeutralLevel, solution.Status);
        Assert.False(solution.IsConverged);
    }

    [Fact]
    public void Site_blocking_saturates_where_the_dilute_form_exceeds_the_sites()
    {
        // One neutral defect with E_f = −0.5 eV at 1000 K, g = 1: w = e^{0.5/k_BT}; dilute c = N w exceeds N, site
        // blocking gives c = N w / (1 + w) (worked by hand: w ≈ 331, c/N ≈ 0.99699).
        double kt = KbEvPerK * 1000, w = Math.Exp(0.5 / kt);
        var ensemble = DefectEnsemble.Create(2.0, [new DefectSpecies("V", "A", Sites, [new SpeciesChargeState(0, -0.5, 1)], new Dictionary<string, int>())]);
        var bands = ParabolicBands.FromEffectiveStates(1e19, 1e19);
        var blocking = ChargeNeutrality.Solve(ensemble, new CarrierModel(bands, Form: ConcentrationForm.SiteBlocking), 1000);
        var dilute = ChargeNeutrality.Solve(ensemble, new CarrierModel(bands), 1000);
        Assert.Equal(ConcentrationForm.SiteBlocking, blocking.Form);
        Assert.Equal(0.99699, blocking.Defects[0].SiteFraction, 5);
        Assert.Equal(w / (1 + w), blocking.Defects[0].SiteFraction, 12);
        Assert.Equal(w, dilute.Defects[0].SiteFraction, 12 - 3);

        var mismatched = DefectEnsemble.Create(2.0,
        [
            new DefectSpecies("V", "A", Sites, [new SpeciesChargeState(0, 1, 1)], new Dictionary<string, int>()),
            new DefectSpecies("W", "A", 2 * Sites, [new SpeciesChargeState(0, 1, 1)], new Dictionary<string, int>()),
        ]);
        var error = Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(mismatched, new CarrierModel(bands, Form: ConcentrationForm.SiteBlocking), 1000));
        Assert.Equal("defects[1].sites", error.Field);
        Assert.Contains("share the site set 'A'", error.Message);
    }

    [Fact]
    public void Per_charge_degeneracies_replace_the_defects_own_and_are_checked()
    {
        var study = WorkedDefectStudy.Study();
        var calculator = new FormationEnergyCalculator(study, WorkedDefectStudy.References, WorkedDefectStudy.Point);
        var ensemble = DefectEnsemble.FromCalculator(calculator, new Dictionary<(string, int), double> { [("V_O", 1)] = 2 });
        var vacancy = ensemble.Species.Single(s => s.Name == "V_O");
        Assert.Equal([1.0, 2.0, 1.0], vacancy.ChargeStates.Select(s => s.Degeneracy));
        Assert.Equal(Sites, vacancy.SitesPerCubicCentimetre, Sites * 1e-12);
        Assert.Equal("degeneracies.V_O.3", Assert.Throws<DefectInputException>(() => DefectEnsemble.FromCalculator(calculator, new Dictionary<(string, int), double> { [("V_O", 3)] = 2 })).Field);
        Assert.Equal("degeneracies.V_X", Assert.Throws<DefectInputException>(() => DefectEnsemble.FromCalculator(calculator, new Dictionary<(string, int), double> { [("V_X", 1)] = 2 })).Field);
    }

    private static void AssertRelative(double expected, double actual, double tolerance, string label)
    {
        double scale = Math.Max(Math.Abs(expected), 1e-300);
        Assert.True(Math.Abs(actual - expected) <= tolerance * scale || (expected < 1e-250 && actual < 1e-250), $"{label}: {actual:G10} against {expected:G10}");
    }
}
