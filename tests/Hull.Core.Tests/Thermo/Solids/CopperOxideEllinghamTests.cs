using Hull.Core.Chemistry;
using Hull.Core.Thermo.Solids;

namespace Hull.Core.Tests.Thermo.Solids;

/// <summary>
/// A second oxide in the Ellingham approximation, 4 CuO → 2 Cu2O + O2, from the same handbook table as the silver
/// oxide check. Oxygen released by a hot oxide is a fire hazard; this is a thermodynamic estimate, not safety
/// advice: real work with heated oxides follows local rules and licensed practice.
/// </summary>
public sealed class CopperOxideEllinghamTests
{
    // The expected temperatures below are worked by hand to 0.01 K from the same table values.
    private const double HandCalculationToleranceK = 0.01;

    // The NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982) — from memory:
    // CuO(s) ΔfH° = −157.3 kJ/mol, S° = 42.63 J/(mol K); Cu2O(s) ΔfH° = −168.6 kJ/mol, S° = 93.14 J/(mol K);
    // O2(g) S° = 205.138 J/(mol K).
    private static EllinghamReaction Reduction() => new(
        [new ReactionTerm(4, new StandardStateData("CuO", -157.3, 42.63))],
        [new ReactionTerm(2, new StandardStateData("Cu2O", -168.6, 93.14))],
        new ReactionTerm(Rational.One, new StandardStateData("O2", 0.0, 205.138)));

    [Theory]
    // ΔH = 2 × (−168.6) − 4 × (−157.3) = 292.0 kJ/mol; ΔS = 2 × 93.14 + 205.138 − 4 × 42.63 = 220.898 J/(mol K);
    // T_d = 292000 / 220.898 = 1321.88 K at 1 bar, 292000 / (220.898 + R × 1.560648) = 1248.54 K in air, by hand
    [InlineData(1.0, 1321.88)]
    [InlineData(0.21, 1248.54)]
    public void Copper_oxide_gives_off_oxygen_at_the_hand_worked_temperature(double oxygenPressureBar, double expectedK)
    {
        EllinghamReaction reaction = Reduction();
        Assert.Equal(292000.0, reaction.EnthalpyChangeJPerMol, 1e-6);
        Assert.Equal(220.898, reaction.EntropyChangeJPerMolK, 1e-9);
        Assert.True(reaction.TryFindDecompositionTemperatureK(oxygenPressureBar, out double temperatureK));
        Assert.Equal(expectedK, temperatureK, HandCalculationToleranceK);
        Assert.True(reaction.GibbsEnergyChangeJPerMol(temperatureK - 1, oxygenPressureBar) > 0);
        Assert.True(reaction.GibbsEnergyChangeJPerMol(temperatureK + 1, oxygenPressureBar) < 0);
    }
}
