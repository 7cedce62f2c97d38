using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Temperature;
using static Hull.Core.Tests.Thermo.Temperature.HandbookOxides;

namespace Hull.Core.Tests.Thermo.Temperature;

/// <summary>
/// Decomposition temperatures found as sign changes of the signed decomposition energy on the open-oxygen hull at
/// T, in the Ellingham approximation, against the closed form T_d = ΔH / (ΔS − ν R ln(p/p°)) and hand-worked values
/// from the NBS Tables of Chemical Thermodynamic Properties (1982) ΔfH° and S° (see <see cref="HandbookOxides"/>).
/// Released oxygen and hot oxides are a fire hazard: these are thermodynamic estimates, and real work follows local
/// rules and licensed practice.
/// </summary>
public sealed class OxideDecompositionTemperatureTests
{
    // The requirement for the root solve against the closed form.
    private const double ClosedFormToleranceK = 1e-6;

    // The expected values below are worked by hand to 0.01 K from the table values.
    private const double HandToleranceK = 0.01;

    private static double ClosedForm(double enthalpyJPerMol, double entropyJPerMolK, double nu, double pressureBar) =>
        enthalpyJPerMol / (entropyJPerMolK - (nu * PhysicalConstants.GasConstantJPerMolK * Math.Log(pressureBar)));

    [Theory]
    // Ag2O → 2 Ag + ½ O2: ΔH = 31050 J/mol, ΔS = 2 × 42.55 + ½ × 205.138 − 121.3 = 66.369 J/(mol K);
    // T_d = 467.84 K at 1 bar (about 468 K) and 426.18 K in air at 0.21 bar (about 427 K), by hand
    [InlineData(1.0, 467.84)]
    [InlineData(0.21, 426.18)]
    public void Silver_oxide_decomposes_where_the_closed_form_says(double pressureBar, double expectedK)
    {
        ThermoSystem system = Ellingham(Silver(), pressureBar);
        DecompositionTemperatureResult result = DecompositionTemperatures.Find(system, "Ag2O", 300, 900);

        DecompositionCrossing crossing = Assert.Single(result.Crossings);
        Assert.Equal(ClosedForm(31050, 66.369, 0.5, pressureBar), crossing.TemperatureK, ClosedFormToleranceK);
        Assert.Equal(expectedK, crossing.TemperatureK, HandToleranceK);
        Assert.Equal(CrossingDirection.DecomposesAbove, crossing.Direction);
        Assert.Equal(CrossingMethod.ExactLinearPiece, crossing.Method);
        Assert.Equal("Ag", Assert.Single(crossing.Competitors.Products).Phase.Id);
        Assert.Equal(0.5, crossing.GasReleasedMoleculesPerFormulaUnit, 1e-12);
        Assert.True(result.StableAtFrom);
        Assert.False(result.StableAtTo);
        Assert.Empty(result.Breakpoints);

        // The same number from the reaction of the Solids module, built from the same table.
        var reaction = new Hull.Core.Thermo.Solids.EllinghamReaction(
            [new(Hull.Core.Chemistry.Rational.One, new("Ag2O", -31.05, 121.3))], [new(2, new("Ag", 0.0, 42.55))],
            new(new Hull.Core.Chemistry.Rational(1, 2), new("O2", 0.0, OxygenEntropyJPerMolK)));
        Assert.True(reaction.TryFindDecompositionTemperatureK(pressureBar, out double fromReaction));
        Assert.Equal(fromReaction, crossing.TemperatureK, ClosedFormToleranceK);
    }

    [Fact]
    public void The_hull_at_T_has_silver_oxide_on_it_below_and_above_it_beyond_the_decomposition_temperature()
    {
        ThermoSystem system = Ellingham(Silver(), 0.21);
        ThermoHull cool = system.HullAt(400);
        ThermoHull hot = system.HullAt(500);
        Assert.True(cool.Hull.GetEntry("Ag2O").IsHullVertex);
        Assert.False(hot.Hull.GetEntry("Ag2O").IsHullVertex);
        // Above hull per Ag atom at 500 K: ½[−31050 + 500 × (66.369 − ½ R ln 0.21)] J/mol, by hand
        double expected = Ev((-31050 + (500 * (66.369 - (0.5 * PhysicalConstants.GasConstantJPerMolK * Math.Log(0.21))))) / 1000) / 2;
        Assert.Equal(expected, hot.Hull.GetEntry("Ag2O").EnergyAboveHullEvPerAtom, 1e-9);
        Assert.Equal(HullAxisQuantity.GrandPotential, hot.Hull.Axis.Quantity);
        Assert.Equal(500, hot.Hull.Axis.TemperatureK);
        Assert.Equal(["Ag"], hot.Hull.Components);
        Assert.NotNull(hot.GasShift);
        // Δμ_O in the Ellingham approximation at the fitted anchor: ½[−T S° + R T ln p] / (e N_A), by hand
        Assert.Equal(Ev(0.5 * ((-500 * OxygenEntropyJPerMolK) + (500 * PhysicalConstants.GasConstantJPerMolK * Math.Log(0.21))) / 1000),
            hot.GasShift!.DeltaMuEvPerAtom, 1e-12);
    }

    [Theory]
    // 2 CuO → Cu2O + ½ O2: ΔH = 146000 J/mol, ΔS = 93.14 + 102.569 − 85.26 = 110.449 J/(mol K) → 1321.88 K at 1 bar;
    // in air 146000 / (110.449 + ½ R × 1.560648) = 1248.54 K, by hand (the same as 4 CuO → 2 Cu2O + O2)
    [InlineData(1.0, 1321.88)]
    [InlineData(0.21, 1248.54)]
    public void Copper_oxide_gives_off_oxygen_to_cuprous_oxide(double pressureBar, double expectedK)
    {
        DecompositionTemperatureResult result = DecompositionTemperatures.Find(Ellingham(Copper(), pressureBar), "CuO", 300, 1600);
        DecompositionCrossing crossing = Assert.Single(result.Crossings);
        Assert.Equal(ClosedForm(146000, 110.449, 0.5, pressureBar), crossing.TemperatureK, ClosedFormToleranceK);
        Assert.Equal(expectedK, crossing.TemperatureK, HandToleranceK);
        Assert.Equal("Cu2O", Assert.Single(crossing.Competitors.Products).Phase.Id);
        Assert.Equal(0.5, Assert.Single(crossing.Competitors.Products).FormulaUnits, 1e-12);
        Assert.Equal(0.25, crossing.GasReleasedMoleculesPerFormulaUnit, 1e-12);
    }

    [Fact]
    public void Cuprous_oxide_crosses_twice_at_1_bar_with_a_breakpoint_between()
    {
        // Cu2O is above the hull at low T (it takes up oxygen to CuO), stable between the two crossings, and gives
        // off oxygen to the metal above the second.
        //   2 CuO → Cu2O + ½ O2 at 1321.88 K (above);
        //   CuO → Cu + ½ O2: ΔH = 157300, ΔS = 33.15 + 102.569 − 42.63 = 93.089 → 1689.79 K: the competitors of Cu2O
        //   change from CuO to Cu there (a breakpoint);
        //   Cu2O → 2 Cu + ½ O2: ΔH = 168600, ΔS = 66.3 + 102.569 − 93.14 = 75.729 → 2226.36 K, by hand.
        DecompositionTemperatureResult result = DecompositionTemperatures.Find(Ellingham(Copper(), 1.0), "Cu2O", 300, 2500);
        Assert.Equal(2, result.Crossings.Count);
        Assert.False(result.StableAtFrom);
        Assert.False(result.StableAtTo);

        DecompositionCrossing forms = result.Crossings[0], decomposes = result.Crossings[1];
        Assert.Equal(CrossingDirection.FormsAbove, forms.Direction);
        Assert.Equal(ClosedForm(146000, 110.449, 0.5, 1.0), forms.TemperatureK, ClosedFormToleranceK);
        Assert.Equal(1321.88, forms.TemperatureK, HandToleranceK);
        Assert.Equal("CuO", Assert.Single(forms.Competitors.Products).Phase.Id);
        Assert.Equal(-0.5, forms.GasReleasedMoleculesPerFormulaUnit, 1e-12);

        Assert.Equal(CrossingDirection.DecomposesAbove, decomposes.Direction);
        Assert.Equal(ClosedForm(168600, 75.729, 0.5, 1.0), decomposes.TemperatureK, ClosedFormToleranceK);
        Assert.Equal(2226.36, decomposes.TemperatureK, HandToleranceK);
        Assert.Equal("Cu", Assert.Single(decomposes.Competitors.Products).Phase.Id);

        SignedEnergyBreakpoint breakpoint = Assert.Single(result.Breakpoints);
        Assert.Equal(ClosedForm(157300, 93.089, 0.5, 1.0), breakpoint.TemperatureK, ClosedFormToleranceK);
        Assert.Equal(["CuO"], breakpoint.CompetitorIdsBelow);
        Assert.Equal(["Cu"], breakpoint.CompetitorIdsAbove);
    }

    [Fact]
    public void The_scan_with_Brent_finds_the_same_crossings_on_the_same_straight_lines()
    {
        // The bracket-and-solve path on the Ellingham data: the same roots as the exact walk within its tolerance.
        ThermoSystem system = Ellingham(Copper(), 1.0);
        var exact = DecompositionTemperatures.Find(system, "Cu2O", 300, 2500).Crossings;
        foreach (DecompositionCrossing crossing in exact)
        {
            (double below, _) = system.SignedDecompositionEnergyAt("Cu2O", crossing.TemperatureK - 0.01);
            (double above, _) = system.SignedDecompositionEnergyAt("Cu2O", crossing.TemperatureK + 0.01);
            Assert.True(Math.Sign(below) == -Math.Sign(above), $"sign change at {crossing.TemperatureK} K");
            Assert.Equal(0.0, system.SignedDecompositionEnergyAt("Cu2O", crossing.TemperatureK).EnergyEvPerClosedAtom, 1e-12);
        }
    }
}
