using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Temperature;
using static Hull.Core.Tests.Thermo.Temperature.HandbookOxides;

namespace Hull.Core.Tests.Thermo.Temperature;

/// <summary>
/// The lowest free-energy elemental reference changes with temperature: grey and white tin, from the NBS Tables of
/// Chemical Thermodynamic Properties (1982) — from memory: Sn(white) ΔfH° = 0, S° = 51.55 J/(mol K); Sn(grey)
/// ΔfH° = −2.09 kJ/mol, S° = 44.14 J/(mol K); SnO2(s) ΔfH° = −580.7 kJ/mol, S° = 52.3 J/(mol K).
/// </summary>
public sealed class ElementReferenceChangeTests
{
    private static ThermoSystem Tin() => ThermoSystem.Prepare(
        SystemHull.OverElements([Formation("Sn-white", "Sn", 0.0), Formation("Sn-grey", "Sn", -2.09), Formation("SnO2", "SnO2", -580.7)]),
        new([Entropy("Sn-white", "Sn", 51.55), Entropy("Sn-grey", "Sn", 44.14), Entropy("SnO2", "SnO2", 52.3)], []),
        FreeEnergyTreatment.Ellingham, Oxygen(0.21));

    [Fact]
    public void Grey_tin_is_the_reference_below_the_transition_and_white_tin_above()
    {
        ThermoSystem tin = Tin();
        ReferenceAtTemperature cold = Assert.Single(tin.ReferencesAt(250));
        ReferenceAtTemperature warm = Assert.Single(tin.ReferencesAt(300));
        Assert.Equal("Sn-grey", cold.EntryId);
        Assert.False(cold.ChangedFromAnchor);
        Assert.Equal("Sn-white", warm.EntryId);
        Assert.True(warm.ChangedFromAnchor);
        Assert.Equal("Sn-grey", warm.AnchorEntryId);

        // α → β at T = 2090 / (51.55 − 44.14) = 282.05 K, by hand
        ReferenceChange change = Assert.Single(DecompositionTemperatures.ReferenceChanges(tin, 200, 400, 16));
        Assert.Equal(2090 / (51.55 - 44.14), change.TemperatureK, 1e-6);
        Assert.Equal("Sn-grey", change.FromEntryId);
        Assert.Equal("Sn-white", change.ToEntryId);

        // The hull at 300 K is measured from white tin: it sits at 0 and grey tin above it (both above the oxide,
        // which holds the Sn corner in air).
        ThermoHull hull = tin.HullAt(300);
        Assert.Equal(0.0, hull.Hull.GetEntry("Sn-white").AxisEnergyEvPerAtom, 1e-15);
        Assert.Equal(Ev(-2.09 + (300 * (51.55 - 44.14) / 1000)), hull.Hull.GetEntry("Sn-grey").AxisEnergyEvPerAtom, 1e-12);
        Assert.True(hull.Hull.GetEntry("SnO2").IsHullVertex);
    }

    [Theory]
    [InlineData(250.0)]
    [InlineData(300.0)]
    public void The_oxide_is_measured_against_the_tin_of_lowest_free_energy(double t)
    {
        // d per Sn atom = ΔfH − T S_SnO2 − 2 Δμ_O − G_Sn(T), Δμ_O = ½ (−T S°_O2 + R T ln p), by hand
        double deltaMu = 0.5 * ((-t * OxygenEntropyJPerMolK) + (PhysicalConstants.GasConstantJPerMolK * t * Math.Log(0.21))) / 1000;
        double tin = Math.Min(-t * 51.55 / 1000, -2.09 - (t * 44.14 / 1000));
        double expected = Ev(-580.7 - (t * 52.3 / 1000) - (2 * deltaMu) - tin);
        (double d, Decomposition competitors) = Tin().SignedDecompositionEnergyAt("SnO2", t);
        Assert.Equal(expected, d, 1e-12);
        Assert.Equal(t < 282 ? "Sn-grey" : "Sn-white", Assert.Single(competitors.Products).Phase.Id);
        DecompositionTemperatureResult result = DecompositionTemperatures.Find(Tin(), "SnO2", 200, 400);
        Assert.Single(result.ReferenceChanges);
        Assert.Empty(result.Crossings);
        SignedEnergyBreakpoint breakpoint = Assert.Single(result.Breakpoints);
        Assert.Equal(2090 / (51.55 - 44.14), breakpoint.TemperatureK, 1e-6);
    }
}
