using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;
using Hull.Core.Thermo.Temperature;
using static Hull.Core.Tests.Thermo.Temperature.HandbookOxides;

namespace Hull.Core.Tests.Thermo.Temperature;

/// <summary>
/// The tabulated-gas treatment: O2's μ(T, p) from its tabulated H°(T) − H°(298.15 K) and S°(T), the solids from their
/// models, checked by hand against NIST-JANAF Thermochemical Tables, 4th ed. (1998) O2 rows and the NBS Tables (1982)
/// solid data.
/// </summary>
public sealed class TabulatedGasTreatmentTests
{
    // The Shomate fit reproduces the JANAF rows to about 1 J/mol and 1 mJ/(mol K): under 1e-5 eV at 500 K.
    private const double TableToleranceEv = 1e-4;

    private static ThermoSystem Tabulated((SystemHull Hull, TemperatureModelSet Models) data, double pressureBar) =>
        ThermoSystem.Prepare(data.Hull, data.Models, FreeEnergyTreatment.TabulatedGas,
            new ThermoGas(GasTables.Oxygen, pressureBar, GasReferenceMode.FittedElementalReference));

    // d(T) of Ag2O per Ag atom, by hand: ½ [ΔfH − T (S_Ag2O − 2 S_Ag) − ½ (H(T) − H(298.15) − T S_O2(T)) − ½ R T ln p] / (e N_A)
    private static double HandSignedEv(double t, double enthalpyAbove, double entropy, double pressureBar) =>
        Ev((-31.05 - (t * (121.3 - (2 * 42.55)) / 1000) - (0.5 * (enthalpyAbove - (t * entropy / 1000)))
            - (0.5 * PhysicalConstants.GasConstantJPerMolK * t * Math.Log(pressureBar) / 1000)) / 2);

    [Theory]
    // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2: H°(T) − H°(298.15) kJ/mol, S° J/(mol K) — from memory
    [InlineData(400, 3.025, 213.871, 1.0)]
    [InlineData(500, 6.084, 220.693, 1.0)]
    [InlineData(500, 6.084, 220.693, 0.21)]
    [InlineData(1000, 22.703, 243.578, 1e-10)]
    public void The_signed_energy_uses_the_tabulated_oxygen(double t, double enthalpyAbove, double entropy, double pressureBar)
    {
        (double d, _) = Tabulated(Silver(), pressureBar).SignedDecompositionEnergyAt("Ag2O", t);
        Assert.Equal(HandSignedEv(t, enthalpyAbove, entropy, pressureBar), d, TableToleranceEv);
    }

    [Fact]
    public void Brent_in_the_scan_bracket_finds_the_crossing_the_table_rows_bracket()
    {
        // The JANAF rows at 400 and 500 K bracket the sign change; d is nearly straight there (its curvature, −Cp/2T
        // of ½ O2, moves a linear interpolation by well under 1 K over 100 K).
        double at400 = HandSignedEv(400, 3.025, 213.871, 1.0), at500 = HandSignedEv(500, 6.084, 220.693, 1.0);
        Assert.True(at400 < 0 && at500 > 0);
        double interpolated = 400 - (at400 * 100 / (at500 - at400));

        DecompositionTemperatureResult result = DecompositionTemperatures.Find(Tabulated(Silver(), 1.0), "Ag2O", 300, 900);
        DecompositionCrossing crossing = Assert.Single(result.Crossings);
        Assert.Equal(CrossingMethod.BrentInScanBracket, crossing.Method);
        Assert.True(crossing.Converged);
        Assert.Equal(interpolated, crossing.TemperatureK, 1.0);
        Assert.True(crossing.BracketLowK <= crossing.TemperatureK && crossing.TemperatureK <= crossing.BracketHighK);
        Assert.Equal(ThermoTolerances.DefaultScanIntervals, result.ScanIntervals);
    }

    [Fact]
    public void A_tabulated_solid_free_energy_is_interpolated_and_gives_the_same_answer_as_its_straight_line()
    {
        // G − H of Ag2O tabulated as −T S° at three rows: linear interpolation reproduces the entropy model exactly.
        Composition ag2o = Composition.Parse("Ag2O");
        FreeEnergyPoint Row(double t) => new(t, -t * 121.3 / 1000 / PhysicalConstants.KilojoulesPerMolPerEv);
        var tabulated = new TabulatedFreeEnergyModel(ag2o, [Row(200), Row(700), Row(1200)]);
        (SystemHull hull, _) = Silver();
        var models = new TemperatureModelSet([Entropy("Ag", "Ag", 42.55), KeyValuePair.Create("Ag2O", (SolidTemperatureModel)tabulated)], []);
        var withTable = ThermoSystem.Prepare(hull, models, FreeEnergyTreatment.TabulatedGas, new ThermoGas(GasTables.Oxygen, 0.21));
        var withEntropy = Tabulated(Silver(), 0.21);
        foreach (double t in new[] { 250.0, 466.0, 1100.0 })
        {
            Assert.Equal(withEntropy.SignedDecompositionEnergyAt("Ag2O", t).EnergyEvPerClosedAtom,
                withTable.SignedDecompositionEnergyAt("Ag2O", t).EnergyEvPerClosedAtom, 1e-12);
        }

        var error = Assert.Throws<ThermoInputException>(() => withTable.SignedDecompositionEnergyAt("Ag2O", 1300));
        Assert.Contains("outside the tabulated free energy of entry 'Ag2O'", error.Message);
        Assert.Equal("Ag2O", error.EntryId);
    }

    [Fact]
    public void Outside_the_gas_table_is_a_clear_error()
    {
        var error = Assert.Throws<ThermoInputException>(() => DecompositionTemperatures.Find(Tabulated(Silver(), 1.0), "Ag2O", 50, 900));
        Assert.Contains("outside the O2 table", error.Message);
        Assert.Throws<ThermoInputException>(() => Tabulated(Silver(), 1.0).HullAt(6500));
    }
}
