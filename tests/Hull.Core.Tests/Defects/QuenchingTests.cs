using Hull.Core.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Defects;

/// <summary>Frozen defect totals, re-equilibrated charge states: a hand-worked quench and its limits.</summary>
public sealed class QuenchingTests
{
    // k_B, CODATA 2018 (exact since the 2019 SI).
    private const double KbEvPerK = 1.380649e-23 / 1.602176634e-19;

    private const double Gap = 3.0, Nc300 = 2e19, Nv300 = 1e19, Sites = 3.2e22, GrowthK = 1400, OperatingK = 300;

    // A donor with 0, +, 2+ states: a_0 = 1.6, ε(+/0) = 2.6 so a_+ = −1.0, ε(2+/+) = 2.2 so a_2+ = −3.2 (eV).
    private static readonly (int Q, double A, double G)[] Donor = [(0, 1.6, 1), (1, -1.0, 2), (2, -3.2, 1)];

    private static DefectEnsemble Ensemble() => DefectEnsemble.Create(Gap,
        [new DefectSpecies("D", "host", Sites, [.. Donor.Select(s => new SpeciesChargeState(s.Q, s.A, s.G))], new Dictionary<string, int>())]);

    private static CarrierModel Model(CarrierStatistics statistics) => new(ParabolicBands.FromEffectiveStates(Nc300, Nv300), statistics);

    /// <summary>
    /// At the operating temperature, Boltzmann carriers, with y = e^{E_F/k_BT}: n = A y (A = N_c e^{−E_g/k_BT}),
    /// p = B/y (B = N_v), and the donor's states weigh W_q y^{−q} (W_q = g_q e^{−a_q/k_BT}), so with the frozen total
    /// C neutrality p − n + C (W_1/y + 2W_2/y²)/(W_0 + W_1/y + W_2/y²) = 0 becomes, times y³(…) and −1,
    /// A W_0 y⁴ + A W_1 y³ + (A W_2 − B W_0 − C W_1) y² − (B W_1 + 2C W_2) y − B W_2 = 0,
    /// whose coefficients change sign once: one positive root (Descartes), solved by mpmath at 50 digits.
    /// </summary>
    [Fact]
    public void Quench_from_growth_to_operating_temperature_solves_the_hand_quartic()
    {
        var model = Model(CarrierStatistics.Boltzmann);
        var quench = Quenching.Solve(Ensemble(), model, GrowthK, OperatingK);
        Assert.True(quench.IsConverged);
        Assert.Null(quench.Operating.Form);
        double total = quench.Growth.TotalOf("D");
        // The total is frozen: the operating states add up to the growth total.
        Assert.Equal(total, quench.Operating.TotalOf("D"), total * 1e-12);

        double kt = KbEvPerK * OperatingK, scale = Math.Pow(OperatingK / 300, 1.5);
        double a = Nc300 * scale * Math.Exp(-Gap / kt), b = Nv300 * scale;
        double[] w = [.. Donor.Select(s => s.G * Math.Exp(-s.A / kt))];
        double[] coefficients = [a * w[0], a * w[1], a * w[2] - b * w[0] - total * w[1], -(b * w[1] + 2 * total * w[2]), -b * w[2]];

        var reference = new CarriersReference();
        int quartic = reference.QuarticRoots(coefficients);
        int growth = reference.Neutrality(Ensemble(), Nc300, Nv300, GrowthK, CarrierStatistics.Boltzmann);
        int operating = reference.Neutrality(Ensemble(), Nc300, Nv300, OperatingK, CarrierStatistics.Boltzmann, frozen: [total]);
        var results = reference.Run();
        double root = Assert.Single(CarriersReference.Values(results[quartic]));
        Assert.Equal(kt * Math.Log(root), quench.Operating.FermiLevelEv, 1e-10);
        Assert.Equal(results[growth]!["fermi"]!.GetValue<double>(), quench.Growth.FermiLevelEv, 1e-9);
        Assert.Equal(results[operating]!["fermi"]!.GetValue<double>(), quench.Operating.FermiLevelEv, 1e-9);

        // The fractions at the operating level: g_q e^{−E_f,q/k_BT} / Σ.
        double ef = quench.Operating.FermiLevelEv;
        double[] weights = [.. Donor.Select(s => s.G * Math.Exp(-(s.A + s.Q * ef) / kt))];
        for (int i = 0; i < Donor.Length; i++)
        {
            double expected = total * weights[i] / weights.Sum();
            var state = quench.Operating.ChargeStates.Single(c => c.Charge == Donor[i].Q);
            Assert.Equal(expected, state.PerCubicCentimetre, expected * 1e-9);
        }
    }

    [Fact]
    public void Fermi_dirac_quench_agrees_with_scipy()
    {
        var quench = Quenching.Solve(Ensemble(), Model(CarrierStatistics.FermiDirac), GrowthK, OperatingK);
        var reference = new CarriersReference();
        int growth = reference.Neutrality(Ensemble(), Nc300, Nv300, GrowthK, CarrierStatistics.FermiDirac);
        int operating = reference.Neutrality(Ensemble(), Nc300, Nv300, OperatingK, CarrierStatistics.FermiDirac, frozen: [quench.Growth.TotalOf("D")]);
        var results = reference.Run();
        Assert.Equal(results[growth]!["fermi"]!.GetValue<double>(), quench.Growth.FermiLevelEv, 1e-9);
        Assert.Equal(results[operating]!["fermi"]!.GetValue<double>(), quench.Operating.FermiLevelEv, 1e-9);
    }

    [Fact]
    public void Operating_at_the_growth_temperature_reproduces_equilibrium()
    {
        foreach (var statistics in new[] { CarrierStatistics.FermiDirac, CarrierStatistics.Boltzmann })
        {
            var quench = Quenching.Solve(Ensemble(), Model(statistics), GrowthK, GrowthK);
            Assert.Equal(quench.Growth.FermiLevelEv, quench.Operating.FermiLevelEv, 1e-10);
            for (int i = 0; i < quench.Growth.ChargeStates.Count; i++)
            {
                double expected = quench.Growth.ChargeStates[i].PerCubicCentimetre;
                Assert.Equal(expected, quench.Operating.ChargeStates[i].PerCubicCentimetre, expected * 1e-8);
            }
        }
    }

    [Fact]
    public void Bad_totals_are_refused()
    {
        var error = Assert.Throws<DefectInputException>(() => ChargeNeutrality.SolveWithFixedTotals(Ensemble(), Model(CarrierStatistics.FermiDirac), 300, [-1.0]));
        Assert.Equal("totals[0]", error.Field);
        Assert.Equal("totals", Assert.Throws<DefectInputException>(() => ChargeNeutrality.SolveWithFixedTotals(Ensemble(), Model(CarrierStatistics.FermiDirac), 300, [])).Field);
    }
}
