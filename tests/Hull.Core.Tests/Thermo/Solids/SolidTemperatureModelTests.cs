using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;

namespace Hull.Core.Tests.Thermo.Solids;

/// <summary>The two temperature models of a solid entry: what they accept, what they refuse and how they say so.</summary>
public sealed class SolidTemperatureModelTests
{
    // NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982), S°(298.15 K) — from memory:
    // Ag2O(s) 121.3 J/(mol K), Ag(s) 42.55 J/(mol K).
    private const double SilverOxideEntropy = 121.3;
    private const double SilverEntropy = 42.55;

    // J/mol per eV per formula unit: e N_A (CODATA 2018, exact) — the Faraday constant.
    private const double JoulePerMolPerEv = 1.602176634e-19 * 6.02214076e23;

    /// <summary>G(T) − H°(298.15 K) = −T S° of Ag2O in the Ellingham approximation (constant H and S), eV per formula unit.</summary>
    internal static FreeEnergyPoint SilverOxideEllinghamPoint(double temperatureK) =>
        new(temperatureK, -temperatureK * SilverOxideEntropy / JoulePerMolPerEv);

    [Fact]
    public void A_standard_entropy_keeps_its_value_and_its_optional_formula()
    {
        var model = new StandardEntropyModel(SilverOxideEntropy, "Ag2O");
        Assert.Equal(SilverOxideEntropy, model.EntropyJPerMolK);
        Assert.Equal(Composition.Parse("Ag2O"), model.FormulaUnit);
        Assert.Null(new StandardEntropyModel(SilverEntropy).FormulaUnit);
        Assert.Null(new StandardEntropyModel(SilverEntropy, "  ").FormulaUnit);
        // S° = 0 is the third law's value at 0 K; allowed, like the handbook's own data type.
        Assert.Equal(0.0, new StandardEntropyModel(0.0).EntropyJPerMolK);
        Assert.Equal(new StandardEntropyModel(SilverOxideEntropy, "Ag2O"), new StandardEntropyModel(SilverOxideEntropy, "Ag2O"));
    }

    [Theory]
    [InlineData(-0.5)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void A_negative_or_non_finite_entropy_is_refused(double entropy)
    {
        var e = Assert.Throws<ThermoInputException>(() => new StandardEntropyModel(entropy));
        Assert.Contains("Standard entropy must be a finite number of J/(mol K), not negative", e.Message);
    }

    [Fact]
    public void A_model_formula_that_does_not_parse_is_refused()
    {
        var e = Assert.Throws<ThermoInputException>(() => new StandardEntropyModel(SilverOxideEntropy, "Ag2Q"));
        Assert.Contains("formula 'Ag2Q' does not parse", e.Message);
    }

    [Fact]
    public void A_table_keeps_its_anchor_and_points_and_compares_by_content()
    {
        FreeEnergyPoint[] points = [SilverOxideEllinghamPoint(300), SilverOxideEllinghamPoint(400), SilverOxideEllinghamPoint(500)];
        var table = new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K, points, "Ag2O");
        Assert.Equal(points, table.Points);
        Assert.Equal(300, table.MinimumTemperatureK);
        Assert.Equal(500, table.MaximumTemperatureK);
        // −300 K × 121.3 J/(mol K) / 96485.33212 C/mol = −0.377156 eV, by hand
        Assert.Equal(-0.377156, table.Points[0].ThermalFreeEnergyEvPerFormulaUnit, 6);

        var same = new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K, points.ToList(), "Ag2O");
        Assert.Equal(table, same);
        Assert.Equal(table.GetHashCode(), same.GetHashCode());
        Assert.NotEqual(table, new FreeEnergyTableModel(FreeEnergyAnchor.Computed0K, points, "Ag2O"));
        Assert.NotEqual(table, new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K, points[..2], "Ag2O"));
    }

    [Fact]
    public void A_table_with_fewer_than_two_points_is_refused()
    {
        var e = Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K, [SilverOxideEllinghamPoint(300)]));
        Assert.Equal("Free-energy table has 1 point; it needs at least 2 temperatures.", e.Message);
        Assert.Contains("has 0 points", Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K, [])).Message);
    }

    [Fact]
    public void Unsorted_and_repeated_temperatures_are_refused_naming_the_point()
    {
        var unsorted = Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K,
            [SilverOxideEllinghamPoint(300), SilverOxideEllinghamPoint(500), SilverOxideEllinghamPoint(400)]));
        Assert.Equal("Free-energy table point 3 (T = 400 K) is below point 2 (T = 500 K); temperatures must strictly increase.", unsorted.Message);

        var repeated = Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel(FreeEnergyAnchor.Computed0K,
            [SilverOxideEllinghamPoint(300), SilverOxideEllinghamPoint(300)]));
        Assert.Equal("Free-energy table point 2 (T = 300 K) repeats point 1 (T = 300 K); temperatures must strictly increase.", repeated.Message);
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(-10.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void A_temperature_not_above_zero_kelvin_or_not_finite_is_refused(double temperatureK)
    {
        var e = Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K,
            [new FreeEnergyPoint(temperatureK, 0.0), SilverOxideEllinghamPoint(500)]));
        Assert.Contains("Free-energy table point 1", e.Message);
        Assert.Contains("temperatures must be finite and above 0 K", e.Message);
    }

    [Fact]
    public void A_non_finite_free_energy_is_refused()
    {
        var e = Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K,
            [SilverOxideEllinghamPoint(300), new FreeEnergyPoint(400, double.NaN)]));
        Assert.Equal("Free-energy table point 2 (T = 400 K): the free energy is NaN; it must be a finite number of eV.", e.Message);
    }

    [Fact]
    public void An_undefined_anchor_is_refused()
    {
        var e = Assert.Throws<ThermoInputException>(() => new FreeEnergyTableModel((FreeEnergyAnchor)7,
            [SilverOxideEllinghamPoint(300), SilverOxideEllinghamPoint(400)]));
        Assert.Contains("anchor 7 is not one of computed_0k, fitted_298k", e.Message);
    }

    [Fact]
    public void The_model_formula_must_be_the_entry_formula_unit()
    {
        Composition silverOxide = Composition.Parse("Ag2O");
        new StandardEntropyModel(SilverOxideEntropy, "Ag2O").CheckFormulaOf("ag2o", silverOxide);
        new StandardEntropyModel(SilverOxideEntropy, "OAg2").CheckFormulaOf("ag2o", silverOxide);
        new StandardEntropyModel(SilverOxideEntropy).CheckFormulaOf("ag2o", silverOxide);

        var doubled = Assert.Throws<ThermoInputException>(() =>
            new StandardEntropyModel(2 * SilverOxideEntropy, "Ag4O2").CheckFormulaOf("ag2o", silverOxide));
        Assert.Equal("ag2o", doubled.EntryId);
        Assert.Contains("Entry 'ag2o': the temperature model is for Ag4O2, not the entry's Ag2O", doubled.Message);
        Assert.Contains("6 atoms per formula unit instead of 3", doubled.Message);

        var other = Assert.Throws<ThermoInputException>(() =>
            new FreeEnergyTableModel(FreeEnergyAnchor.Fitted298K, [SilverOxideEllinghamPoint(300), SilverOxideEllinghamPoint(400)], "AgO")
                .CheckFormulaOf("ag2o", silverOxide));
        Assert.Contains("is for AgO, not the entry's Ag2O: it is another composition", other.Message);
    }

    [Fact]
    public void Each_anchor_pairs_with_the_gas_mode_of_the_same_zero()
    {
        Assert.Equal(0.0, FreeEnergyAnchor.Computed0K.AnchorTemperatureK());
        Assert.Equal(GasReferenceMode.ComputedMoleculeEnergy, FreeEnergyAnchor.Computed0K.PairedGasMode());
        Assert.Equal(298.15, FreeEnergyAnchor.Fitted298K.AnchorTemperatureK()); // common practice: standard temperature
        Assert.Equal(GasReferenceMode.FittedElementalReference, FreeEnergyAnchor.Fitted298K.PairedGasMode());
        foreach (FreeEnergyAnchor anchor in FreeEnergyAnchorTokens.All)
        {
            Assert.Equal(anchor.PairedGasMode() == GasReferenceMode.ComputedMoleculeEnergy ? 0.0 : PhysicalConstants.StandardTemperatureK,
                anchor.AnchorTemperatureK());
            Assert.True(FreeEnergyAnchorTokens.TryParse(FreeEnergyAnchorTokens.ToToken(anchor), out FreeEnergyAnchor back));
            Assert.Equal(anchor, back);
        }

        Assert.Equal(Enum.GetValues<FreeEnergyAnchor>(), FreeEnergyAnchorTokens.All);
        Assert.False(FreeEnergyAnchorTokens.TryParse("Fitted_298k", out _));
    }
}
