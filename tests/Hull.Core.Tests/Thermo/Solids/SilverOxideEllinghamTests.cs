using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Solids;

namespace Hull.Core.Tests.Thermo.Solids;

/// <summary>
/// Outside check of the Ellingham approximation: Ag2O → 2 Ag + ½ O2 from handbook ΔfH°(298.15 K) and S°(298.15 K),
/// at 1 bar O2 and in air. Oxygen released by a hot oxide is a fire hazard; this is a thermodynamic estimate, not
/// safety advice: real work with heated oxides follows local rules and licensed practice.
/// </summary>
public sealed class SilverOxideEllinghamTests
{
    // The expected temperatures below are worked by hand to 0.01 K from the same table values.
    private const double HandCalculationToleranceK = 0.01;

    // The NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982) — from memory:
    // Ag2O(s) ΔfH° = −31.05 kJ/mol, S° = 121.3 J/(mol K); Ag(s) S° = 42.55 J/(mol K); O2(g) S° = 205.138 J/(mol K).
    private static readonly StandardStateData SilverOxide = new("Ag2O", -31.05, 121.3);
    private static readonly StandardStateData Silver = new("Ag", 0.0, 42.55);
    private static readonly StandardStateData Oxygen = new("O2", 0.0, 205.138);

    private static EllinghamReaction Decomposition() => new(
        [new ReactionTerm(Rational.One, SilverOxide)],
        [new ReactionTerm(2, Silver)],
        new ReactionTerm(new Rational(1, 2), Oxygen));

    [Fact]
    public void The_reaction_carries_the_handbook_enthalpy_and_entropy_changes()
    {
        EllinghamReaction reaction = Decomposition();
        // ΔH = +31.05 kJ/mol; ΔS = 2 × 42.55 + ½ × 205.138 − 121.3 = 66.369 J/(mol K), by hand
        Assert.Equal(31050.0, reaction.EnthalpyChangeJPerMol, 1e-9);
        Assert.Equal(66.369, reaction.EntropyChangeJPerMolK, 1e-9);
        Assert.Equal(0.5, reaction.GasReleasedMolPerMol);
        Assert.Equal("Ag2O -> 2 Ag + 1/2 O2", reaction.ToString());
    }

    [Theory]
    // T_d = 31050 / 66.369 = 467.84 K at 1 bar; in air 31050 / (66.369 + ½ R × 1.560648) = 426.18 K, by hand
    [InlineData(1.0, 467.84)]
    [InlineData(0.21, 426.18)]
    public void Silver_oxide_decomposes_at_the_hand_worked_temperature(double oxygenPressureBar, double expectedK)
    {
        EllinghamReaction reaction = Decomposition();
        Assert.True(reaction.TryFindDecompositionTemperatureK(oxygenPressureBar, out double temperatureK));
        Assert.Equal(expectedK, temperatureK, HandCalculationToleranceK);

        // ΔG changes sign there: the oxide is stable below (ΔG of decomposition > 0) and gives off oxygen above.
        Assert.Equal(0.0, reaction.GibbsEnergyChangeJPerMol(temperatureK, oxygenPressureBar), 1e-6);
        Assert.True(reaction.GibbsEnergyChangeJPerMol(temperatureK - 1, oxygenPressureBar) > 0);
        Assert.True(reaction.GibbsEnergyChangeJPerMol(temperatureK + 1, oxygenPressureBar) < 0);
    }

    [Fact]
    public void The_closed_form_is_the_same_from_the_bare_changes()
    {
        double t = EllinghamDecomposition.FindTemperatureK(31050.0, 66.369, 0.5, 0.21);
        Assert.Equal(426.18, t, HandCalculationToleranceK);
        // Lower oxygen pressure lowers the decomposition temperature.
        Assert.True(EllinghamDecomposition.FindTemperatureK(31050.0, 66.369, 0.5, 1e-3) < t);
    }

    [Fact]
    public void A_reaction_that_keeps_one_sign_has_no_decomposition_temperature()
    {
        // ΔH > 0 with the effective ΔS negative: ΔG > 0 at every positive temperature.
        Assert.False(EllinghamDecomposition.TryFindTemperatureK(31050.0, -10.0, 0.0, 1.0, out double t));
        Assert.True(double.IsNaN(t));
        var error = Assert.Throws<ThermoInputException>(() => EllinghamDecomposition.FindTemperatureK(31050.0, -10.0, 0.0, 1.0));
        Assert.Contains("keeps one sign", error.Message);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-1.0)]
    [InlineData(double.NaN)]
    public void Zero_or_negative_oxygen_pressure_is_a_clear_error(double pressureBar)
    {
        var error = Assert.Throws<ThermoInputException>(() => Decomposition().TryFindDecompositionTemperatureK(pressureBar, out _));
        Assert.Contains("must be positive and finite", error.Message);
    }

    [Fact]
    public void An_unbalanced_reaction_or_bad_data_is_a_clear_error()
    {
        var error = Assert.Throws<ThermoInputException>(() => new EllinghamReaction(
            [new ReactionTerm(Rational.One, SilverOxide)], [new ReactionTerm(1, Silver)], new ReactionTerm(new Rational(1, 2), Oxygen)));
        Assert.Contains("does not balance", error.Message);
        Assert.Equal("Ag", error.Element);

        Assert.Throws<ThermoInputException>(() => new StandardStateData("Ag2O", -31.05, -1.0));
        Assert.Throws<ThermoInputException>(() => new StandardStateData("Xq2O", -31.05, 121.3));
        Assert.Throws<ThermoInputException>(() => new ReactionTerm(Rational.Zero, Silver));
        Assert.Throws<ThermoInputException>(() => Decomposition().GibbsEnergyChangeJPerMol(0.0, 1.0));
    }
}
