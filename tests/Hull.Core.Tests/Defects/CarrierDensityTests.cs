using Hull.Core.Defects;

namespace Hull.Core.Tests.Defects;

/// <summary>Free carriers of a host without defects: silicon's intrinsic density, the band models and their limits.</summary>
public sealed class CarrierDensityTests
{
    // S. M. Sze, Physics of Semiconductor Devices, 2nd ed. (Wiley 1981), Appendix G, Si at 300 K:
    // N_c = 2.8e19 cm^-3, N_v = 1.04e19 cm^-3, E_g = 1.12 eV (from memory; the same values as the check).
    private const double SiliconNc = 2.8e19, SiliconNv = 1.04e19, SiliconGap = 1.12;

    // k_B, CODATA 2018 (exact since the 2019 SI).
    private const double KbEvPerK = 1.380649e-23 / 1.602176634e-19;

    private static readonly DefectEnsemble Silicon = DefectEnsemble.Create(SiliconGap, []);

    [Fact]
    public void Silicon_intrinsic_density_and_fermi_level_at_300_k_follow_the_textbook_formula()
    {
        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(SiliconNc, SiliconNv), CarrierStatistics.Boltzmann);
        var solution = ChargeNeutrality.Solve(Silicon, model, 300);
        double kt = KbEvPerK * 300;
        // n_i = √(N_c N_v) e^{−E_g/2k_BT} and E_F = E_g/2 + (k_BT/2) ln(N_v/N_c) (common practice).
        double ni = Math.Sqrt(SiliconNc * SiliconNv) * Math.Exp(-SiliconGap / (2 * kt));
        Assert.Equal(FermiSolveStatus.Converged, solution.Status);
        Assert.Equal(6.68e9, ni, 0.01e9);
        Assert.Equal(1, solution.ElectronsPerCubicCentimetre / ni, 1e-10);
        Assert.Equal(1, solution.HolesPerCubicCentimetre / ni, 1e-10);
        Assert.Equal(SiliconGap / 2 + kt / 2 * Math.Log(SiliconNv / SiliconNc), solution.FermiLevelEv, 1e-11);
        Assert.True(solution.RelativeChargeImbalance < 1e-10);

        // Fermi–Dirac carriers 0.55 eV from either edge differ from Boltzmann by ~e^{-21}: the same to 1e-8.
        var fd = ChargeNeutrality.Solve(Silicon, model with { Statistics = CarrierStatistics.FermiDirac }, 300);
        Assert.Equal(1, fd.ElectronsPerCubicCentimetre / ni, 1e-8);
        Assert.Equal(solution.FermiLevelEv, fd.FermiLevelEv, 1e-9);
    }

    [Fact]
    public void Intrinsic_level_stays_exact_at_5_k_where_the_densities_underflow()
    {
        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(SiliconNc, SiliconNv), CarrierStatistics.FermiDirac);
        var solution = ChargeNeutrality.Solve(Silicon, model, 5);
        double kt = KbEvPerK * 5;
        Assert.Equal(FermiSolveStatus.Converged, solution.Status);
        // n_i ≈ e^{−1300} cm^-3: zero in doubles, yet the level is the closed form's (N scale as T^{3/2} on both sides).
        Assert.Equal(0.0, solution.ElectronsPerCubicCentimetre);
        Assert.Equal(SiliconGap / 2 + kt / 2 * Math.Log(SiliconNv / SiliconNc), solution.FermiLevelEv, 1e-11);
    }

    [Fact]
    public void Effective_states_follow_the_mass_and_t_to_the_three_halves()
    {
        // N = 2(2π m_e k_B T/h²)^{3/2} = 2.509e19 cm^-3 for m = m_e at 300 K (from memory: "2.51e19 (m*/m)^{3/2}").
        var bands = ParabolicBands.FromEffectiveMasses(1.0, 0.81);
        Assert.Equal(2.509e19, bands.ConductionStates300KPerCubicCentimetre, 0.001e19);
        Assert.Equal(Math.Pow(0.81, 1.5), bands.ValenceStates300KPerCubicCentimetre / bands.ConductionStates300KPerCubicCentimetre, 13);
        Assert.Equal(Math.Pow(2, 1.5), bands.ConductionStatesPerCubicCentimetre(600) / bands.ConductionStates300KPerCubicCentimetre, 13);
        var error = Assert.Throws<DefectInputException>(() => ParabolicBands.FromEffectiveMasses(-1, 1));
        Assert.Equal("carriers.electron_mass_ratio", error.Field);
    }

    [Fact]
    public void Sampled_parabolic_density_of_states_reproduces_nc_f_half()
    {
        // g_c(E) = N_c(T) (2/√π) √(E − E_C)/(k_BT)^{3/2}, T-independent since N_c ∝ T^{3/2} (common practice), sampled
        // every 0.25 meV to 3 eV into each band (linear interpolation of √ then errs by ~(h/k_BT)^{3/2}/5 ≈ 2e-4 at
        // 300 K); the valence band mirrors it with N_v.
        const double gap = 1.5, nc = 3e18, nv = 1.2e19;
        var energies = new List<double>();
        var states = new List<double>();
        double kt300 = KbEvPerK * 300, unit = 2 / Math.Sqrt(Math.PI) / Math.Pow(kt300, 1.5);
        const double step = 0.00025;
        for (int i = 12000; i >= 0; i--) { energies.Add(-step * i); states.Add(nv * unit * Math.Sqrt(step * i)); }
        for (int i = 0; i <= 12000; i++) { energies.Add(gap + step * i); states.Add(nc * unit * Math.Sqrt(step * i)); }
        var table = TabulatedBands.Create(energies, states);
        var parabolic = ParabolicBands.FromEffectiveStates(nc, nv);
        foreach (double t in new[] { 300.0, 1000.0 })
        {
            foreach (double fermi in new[] { -0.2, 0.05, 0.75, 1.45, 1.6, 1.9 })
            {
                var edges = new BandEdges(0, gap);
                foreach (var statistics in new[] { CarrierStatistics.FermiDirac, CarrierStatistics.Boltzmann })
                {
                    double n = Math.Exp(table.LogElectrons(fermi, t, edges, statistics)), nRef = Math.Exp(parabolic.LogElectrons(fermi, t, edges, statistics));
                    double p = Math.Exp(table.LogHoles(fermi, t, edges, statistics)), pRef = Math.Exp(parabolic.LogHoles(fermi, t, edges, statistics));
                    Assert.True(Math.Abs(n / nRef - 1) < 1e-3, $"T {t}, E_F {fermi}, {statistics}: n {n:G6} against {nRef:G6}");
                    Assert.True(Math.Abs(p / pRef - 1) < 1e-3, $"T {t}, E_F {fermi}, {statistics}: p {p:G6} against {pRef:G6}");
                }
            }
        }
    }

    [Fact]
    public void A_moving_gap_shifts_the_edges_by_the_varshni_form()
    {
        // Varshni form E_g(T) = E_g(0) − αT²/(T+β) (common practice); the study's gap here is the 0 K gap, and 30 %
        // of the change goes to the VBM.
        var dependence = new GapTemperatureDependence(4.73e-4, 636, 0, 0.3);
        var model = new CarrierModel(ParabolicBands.FromEffectiveStates(SiliconNc, SiliconNv), CarrierStatistics.Boltzmann, GapTemperature: dependence);
        double change = -4.73e-4 * 900.0 * 900.0 / (900 + 636);
        var solution = ChargeNeutrality.Solve(DefectEnsemble.Create(1.17, []), model, 900);
        Assert.Equal(-0.3 * change, solution.Edges.ValenceEv, 14);
        Assert.Equal(1.17 + 0.7 * change, solution.Edges.ConductionEv, 14);
        double kt = KbEvPerK * 900;
        Assert.Equal((solution.Edges.ValenceEv + solution.Edges.ConductionEv) / 2 + kt / 2 * Math.Log(SiliconNv / SiliconNc), solution.FermiLevelEv, 1e-11);

        var closes = Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(DefectEnsemble.Create(0.1, []), model, 900));
        Assert.Contains("gap closes", closes.Message);
    }

    [Fact]
    public void Bad_carrier_input_is_refused_naming_the_field()
    {
        var good = new CarrierModel(ParabolicBands.FromEffectiveStates(SiliconNc, SiliconNv));
        Assert.Equal("temperature_k", Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(Silicon, good, 0)).Field);
        Assert.Equal("temperature_k", Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(Silicon, good, double.NaN)).Field);
        Assert.Equal("carriers.extra_donors_per_cm3", Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(Silicon, good with { ExtraDonorsPerCubicCentimetre = -1 }, 300)).Field);
        Assert.Equal("carriers.conduction_states_300k_per_cm3",
            Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(Silicon, new CarrierModel(ParabolicBands.FromEffectiveStates(0, 1e19)), 300)).Field);
        var inGap = TabulatedBands.Create([-1, 0, 0.5, 1.12, 2], [1e21, 1e21, 1e20, 1e21, 1e21]);
        var error = Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(Silicon, new CarrierModel(inGap), 300));
        Assert.Equal("carriers.density_of_states[2]", error.Field);
        Assert.Contains("inside the 1.12 eV gap", error.Message);
        Assert.Equal("carriers.density_of_states[2].energy_ev", Assert.Throws<DefectInputException>(() => TabulatedBands.Create([-1, 0, 0, 2], [1, 1, 1, 1])).Field);
        var tableWithGapShift = new CarrierModel(TabulatedBands.Create([-1, 0, 1.12, 2], [1e21, 1e21, 1e21, 1e21]), GapTemperature: new(1e-4, 100, 0, 0.5));
        Assert.Equal("carriers.gap_temperature", Assert.Throws<DefectInputException>(() => ChargeNeutrality.Solve(Silicon, tableWithGapShift, 300)).Field);
    }
}
