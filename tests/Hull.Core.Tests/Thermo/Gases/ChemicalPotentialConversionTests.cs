using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Tests.Thermo.Gases;

/// <summary>Δμ ↔ (T, p): the pressure at a chosen temperature, the temperature at a chosen pressure, and back.</summary>
public sealed class ChemicalPotentialConversionTests
{
    // The temperature solve narrows its bracket to 1e-9 K; over that width Δμ moves by about S/(2 N_A) · 1e-9 K,
    // some 1e-12 eV, so 1e-9 eV/atom and 1e-6 K leave room for rounding in the sums.
    private const double RoundTripToleranceEvPerAtom = 1e-9;
    private const double RoundTripToleranceK = 1e-6;
    private const double RelativePressureTolerance = 1e-9;

    // Round trips stay off the ends where two Shomate ranges meet: the fits differ there by up to about 0.01 kJ/mol,
    // a step of a few µeV in Δμ, so a temperature solved across such an end is fixed only to a few mK.

    private const double DatasetReferenceEvPerAtom = -4.93;

    private static GasReservoir Reservoir(GasSpecies gas, GasReferenceMode mode) => mode == GasReferenceMode.FittedElementalReference
        ? new GasReservoir(gas, GasReference.FittedElementalReference(-4.95, gas))
        : new GasReservoir(gas, GasReference.ComputedMolecule(-9.86, 0.098));

    [Theory]
    [InlineData("O2", GasReferenceMode.FittedElementalReference, -1.0, 800.0)]
    [InlineData("O2", GasReferenceMode.ComputedMoleculeEnergy, -2.5, 1500.0)]
    [InlineData("O2", GasReferenceMode.FittedElementalReference, -0.3, 298.15)]
    [InlineData("N2", GasReferenceMode.FittedElementalReference, -1.2, 1200.0)]
    [InlineData("H2", GasReferenceMode.ComputedMoleculeEnergy, -0.8, 700.0)]
    [InlineData("Cl2", GasReferenceMode.FittedElementalReference, -0.9, 1100.0)]
    [InlineData("F2", GasReferenceMode.FittedElementalReference, -0.9, 1000.0)]
    public void Delta_mu_to_pressure_to_temperature_to_delta_mu_round_trips(string formula, GasReferenceMode mode, double deltaMuEvPerAtom, double temperatureK)
    {
        GasReservoir reservoir = Reservoir(GasTables.Get(formula), mode);

        PressureForShift pressure = reservoir.PressureAt(deltaMuEvPerAtom, temperatureK, DatasetReferenceEvPerAtom);
        Assert.True(double.IsFinite(pressure.PressureBar) && pressure.PressureBar > 0, $"p = {pressure.PressureBar} bar");
        ChemicalPotentialShift atPressure = reservoir.Shift(temperatureK, pressure.PressureBar, DatasetReferenceEvPerAtom);
        Assert.Equal(deltaMuEvPerAtom, atPressure.DeltaMuEvPerAtom, RoundTripToleranceEvPerAtom);

        TemperatureSolveResult solved = reservoir.TemperatureAt(deltaMuEvPerAtom, pressure.PressureBar, DatasetReferenceEvPerAtom);
        Assert.Equal(TemperatureSolveStatus.Converged, solved.Status);
        Assert.Equal(1, solved.SignChangesFound);
        Assert.Equal(temperatureK, solved.TemperatureK, RoundTripToleranceK);
        Assert.True(solved.BracketHighK - solved.BracketLowK <= GasTolerances.TemperatureBracketK);

        ChemicalPotentialShift back = reservoir.Shift(solved.TemperatureK, pressure.PressureBar, DatasetReferenceEvPerAtom);
        Assert.Equal(deltaMuEvPerAtom, back.DeltaMuEvPerAtom, RoundTripToleranceEvPerAtom);
    }

    [Fact]
    public void The_pressure_at_a_delta_mu_is_the_ideal_gas_law_inverted()
    {
        GasReservoir reservoir = Reservoir(GasTables.Oxygen, GasReferenceMode.FittedElementalReference);
        double standard = reservoir.Shift(1000, 1.0, DatasetReferenceEvPerAtom).DeltaMuEvPerAtom;
        // Lowering Δμ_O by (k_B T / 2) ln 10 lowers p(O2) tenfold — ideal-gas law, common practice
        double oneTenth = standard + 8.617333262e-5 * 1000 * Math.Log(0.1) / 2;
        PressureForShift p = reservoir.PressureAt(oneTenth, 1000, DatasetReferenceEvPerAtom);
        Assert.Equal(-1.0, p.Log10PressureBar, 1e-9);
        Assert.Equal(0.1, p.PressureBar, 0.1 * RelativePressureTolerance);
    }

    [Fact]
    public void A_pressure_beyond_a_double_still_has_a_finite_logarithm()
    {
        GasReservoir reservoir = Reservoir(GasTables.Oxygen, GasReferenceMode.FittedElementalReference);
        PressureForShift p = reservoir.PressureAt(-12.0, 300, DatasetReferenceEvPerAtom);
        Assert.Equal(0.0, p.PressureBar);
        Assert.True(double.IsFinite(p.Log10PressureBar) && p.Log10PressureBar < -330);
    }

    [Fact]
    public void A_delta_mu_no_temperature_reaches_is_reported_not_thrown()
    {
        GasReservoir reservoir = Reservoir(GasTables.Oxygen, GasReferenceMode.FittedElementalReference);
        // Δμ rises above the anchor's value at no temperature at 1 bar: μ falls with T at any ordinary pressure.
        TemperatureSolveResult result = reservoir.TemperatureAt(+1.0, 1.0, DatasetReferenceEvPerAtom);
        Assert.Equal(TemperatureSolveStatus.NoSignChangeInRange, result.Status);
        Assert.False(result.IsConverged);
        Assert.True(double.IsNaN(result.TemperatureK));
        Assert.Equal(100, result.SearchedFromK);
        Assert.Equal(6000, result.SearchedToK);
    }

    [Fact]
    public void A_search_range_outside_the_table_is_a_clear_error()
    {
        GasReservoir reservoir = Reservoir(GasTables.Hydrogen, GasReferenceMode.FittedElementalReference);
        var error = Assert.Throws<ThermoInputException>(() => reservoir.TemperatureAt(-1.0, 1.0, DatasetReferenceEvPerAtom, 200, 1000));
        Assert.Contains("not a range within the H2 table", error.Message);
        Assert.Throws<ThermoInputException>(() => reservoir.TemperatureAt(-1.0, 1.0, DatasetReferenceEvPerAtom, 1000, 900));
        Assert.Throws<ThermoInputException>(() => reservoir.PressureAt(-1.0, 7000, DatasetReferenceEvPerAtom));
        Assert.Throws<ThermoInputException>(() => reservoir.PressureAt(double.NaN, 1000, DatasetReferenceEvPerAtom));
    }

    [Fact]
    public void Bisection_converges_on_a_jump_and_stops_at_a_non_finite_value()
    {
        // Bisection needs only a sign change, so a jump is found; a value that is not a number stops the solve
        // with a status that says so, instead of an exception.
        TemperatureSolveResult jump = TemperatureBisection.Solve(t => t < 1234.5 ? -1 : 1, 100, 6000);
        Assert.Equal(TemperatureSolveStatus.Converged, jump.Status);
        Assert.Equal(1234.5, jump.TemperatureK, 1e-6);

        TemperatureSolveResult stuck = TemperatureBisection.Solve(t => t == 100 ? -1 : t == 6000 ? 1 : double.NaN, 100, 6000);
        Assert.Equal(TemperatureSolveStatus.NonFiniteValue, stuck.Status);
        Assert.False(stuck.IsConverged);
    }
}
