using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Tests.Thermo.Gases;

/// <summary>
/// Outside check of the Shomate tables: H°(T) − H°(298.15 K) and S°(T) of each gas against NIST-JANAF
/// Thermochemical Tables, 4th ed. (1998), at three or more temperatures, the ends of every range, and the errors
/// outside the tables.
/// </summary>
public sealed class GasTableTests
{
    // The Shomate fits reproduce the JANAF tables to a few J/mol and a few mJ/(mol K); these tolerances allow for
    // that and the table's last digit.
    private const double EnthalpyToleranceKjPerMol = 0.01;
    private const double EntropyToleranceJPerMolK = 0.03;

    // F2 and Cl2 table values away from 298.15 K are recalled to about one decimal only; held to that looser size.
    private const double LooseEnthalpyToleranceKjPerMol = 0.15;
    private const double LooseEntropyToleranceJPerMolK = 0.3;

    // Where two ranges meet, their fits agree to the table's rounding: well within 0.02 kJ/mol and 0.02 J/(mol K).
    private const double SharedEndEnthalpyToleranceKjPerMol = 0.02;
    private const double SharedEndEntropyToleranceJPerMolK = 0.02;

    public static TheoryData<string, double, double, double> TableRows => new()
    {
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 (ideal gas): T (K), H°(T) − H°(298.15) (kJ/mol), S° (J/(mol K)) — from memory
        { "O2", 100, -5.779, 173.307 },
        { "O2", 298.15, 0.000, 205.147 },
        { "O2", 500, 6.084, 220.693 },
        { "O2", 700, 12.499, 231.466 },
        { "O2", 1000, 22.703, 243.578 },
        { "O2", 1500, 40.599, 258.068 },
        { "O2", 2000, 59.175, 268.748 },
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), N2 (ideal gas) — from memory
        { "N2", 100, -5.768, 159.811 },
        { "N2", 298.15, 0.000, 191.609 },
        { "N2", 500, 5.912, 206.739 },
        { "N2", 1000, 21.463, 228.170 },
        { "N2", 1500, 38.405, 241.880 },
        { "N2", 2000, 56.137, 252.074 },
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), H2 (ideal gas) — from memory
        { "H2", 298.15, 0.000, 130.680 },
        { "H2", 500, 5.882, 145.737 },
        { "H2", 1000, 20.680, 166.216 },
        { "H2", 1500, 36.290, 178.846 },
        { "H2", 2000, 52.951, 188.418 },
    };

    public static TheoryData<string, double, double, double> LooselyRecalledRows => new()
    {
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), F2 (ideal gas) — from memory, to about one decimal
        { "F2", 298.15, 0.0, 202.79 },
        { "F2", 500, 6.65, 219.8 },
        { "F2", 1000, 24.6, 244.5 },
        { "F2", 2000, 62.9, 271.0 },
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), Cl2 (ideal gas) — from memory, to about one decimal
        { "Cl2", 298.15, 0.0, 223.08 },
        { "Cl2", 500, 7.1, 241.2 },
        { "Cl2", 1000, 25.6, 266.8 },
        { "Cl2", 2000, 63.5, 293.0 },
    };

    [Theory]
    [MemberData(nameof(TableRows))]
    public void Enthalpy_and_entropy_match_the_table(string formula, double temperatureK, double enthalpyKjPerMol, double entropyJPerMolK)
    {
        GasSpecies gas = GasTables.Get(formula);
        Assert.Equal(enthalpyKjPerMol, gas.EnthalpyAboveStandardKjPerMol(temperatureK), EnthalpyToleranceKjPerMol);
        Assert.Equal(entropyJPerMolK, gas.EntropyJPerMolK(temperatureK), EntropyToleranceJPerMolK);
    }

    [Theory]
    [MemberData(nameof(LooselyRecalledRows))]
    public void Enthalpy_and_entropy_match_the_loosely_recalled_table(string formula, double temperatureK, double enthalpyKjPerMol, double entropyJPerMolK)
    {
        GasSpecies gas = GasTables.Get(formula);
        Assert.Equal(enthalpyKjPerMol, gas.EnthalpyAboveStandardKjPerMol(temperatureK), LooseEnthalpyToleranceKjPerMol);
        Assert.Equal(entropyJPerMolK, gas.EntropyJPerMolK(temperatureK), LooseEntropyToleranceJPerMolK);
    }

    [Fact]
    public void Every_range_end_is_evaluated_and_neighbouring_fits_agree_where_they_meet()
    {
        foreach (GasSpecies gas in GasTables.All)
        {
            IReadOnlyList<ShomateRange> ranges = gas.Table.Ranges;
            foreach (ShomateRange range in ranges)
            {
                // Both ends of each range are inside the table: finite values, entropy positive and rising with T.
                double low = range.EntropyJPerMolK(range.MinimumTemperatureK);
                double high = range.EntropyJPerMolK(range.MaximumTemperatureK);
                Assert.True(low > 0 && high > low, $"{gas.Formula} entropy over {range.MinimumTemperatureK}–{range.MaximumTemperatureK} K");
                Assert.True(range.EnthalpyAboveStandardKjPerMol(range.MaximumTemperatureK) > range.EnthalpyAboveStandardKjPerMol(range.MinimumTemperatureK));
                Assert.True(range.HeatCapacityJPerMolK(range.MinimumTemperatureK) > 0 && range.HeatCapacityJPerMolK(range.MaximumTemperatureK) > 0);
                Assert.Equal(range.EntropyJPerMolK(range.MaximumTemperatureK), gas.EntropyJPerMolK(range.MaximumTemperatureK), 1e-12);
            }

            for (int i = 1; i < ranges.Count; i++)
            {
                double sharedK = ranges[i].MinimumTemperatureK;
                Assert.Equal(ranges[i - 1].EnthalpyAboveStandardKjPerMol(sharedK), ranges[i].EnthalpyAboveStandardKjPerMol(sharedK), SharedEndEnthalpyToleranceKjPerMol);
                Assert.Equal(ranges[i - 1].EntropyJPerMolK(sharedK), ranges[i].EntropyJPerMolK(sharedK), SharedEndEntropyToleranceJPerMolK);
            }
        }
    }

    [Theory]
    // NIST-JANAF Thermochemical Tables, 4th ed. (1998), the shared range ends that lie on a table row — from memory
    [InlineData("O2", 700, 12.499, 231.466)]
    [InlineData("O2", 2000, 59.175, 268.748)]
    [InlineData("N2", 500, 5.912, 206.739)]
    [InlineData("N2", 2000, 56.137, 252.074)]
    [InlineData("H2", 1000, 20.680, 166.216)]
    public void Both_fits_at_a_shared_end_match_the_table(string formula, double sharedK, double enthalpyKjPerMol, double entropyJPerMolK)
    {
        ShomateTable table = GasTables.Get(formula).Table;
        ShomateRange below = table.Ranges.Single(r => r.MaximumTemperatureK == sharedK);
        ShomateRange above = table.Ranges.Single(r => r.MinimumTemperatureK == sharedK);
        foreach (ShomateRange range in new[] { below, above })
        {
            Assert.Equal(enthalpyKjPerMol, range.EnthalpyAboveStandardKjPerMol(sharedK), EnthalpyToleranceKjPerMol);
            Assert.Equal(entropyJPerMolK, range.EntropyJPerMolK(sharedK), EntropyToleranceJPerMolK);
        }
    }

    [Theory]
    // The NIST Chemistry WebBook fits' ranges: O2 and N2 from 100 K, H2, F2 and Cl2 from 298 K, all to 6000 K.
    [InlineData("O2", 100, 6000)]
    [InlineData("N2", 100, 6000)]
    [InlineData("H2", 298, 6000)]
    [InlineData("F2", 298, 6000)]
    [InlineData("Cl2", 298, 6000)]
    public void Outside_the_table_is_a_clear_error(string formula, double minimumK, double maximumK)
    {
        GasSpecies gas = GasTables.Get(formula);
        Assert.Equal(minimumK, gas.Table.MinimumTemperatureK);
        Assert.Equal(maximumK, gas.Table.MaximumTemperatureK);
        _ = gas.EntropyJPerMolK(minimumK);
        _ = gas.EntropyJPerMolK(maximumK);
        foreach (double outside in new[] { minimumK - 0.5, maximumK + 0.5, double.NaN, double.PositiveInfinity })
        {
            var error = Assert.Throws<ThermoInputException>(() => gas.EnthalpyAboveStandardKjPerMol(outside));
            Assert.Contains("outside the " + formula + " table", error.Message);
            Assert.Throws<ThermoInputException>(() => gas.EntropyJPerMolK(outside));
        }
    }

    [Theory]
    [InlineData("Ar")]
    [InlineData("o2")]
    [InlineData("")]
    [InlineData(null)]
    public void A_gas_the_tables_lack_is_a_clear_error(string? formula)
    {
        var error = Assert.Throws<ThermoInputException>(() => GasTables.Get(formula));
        Assert.Contains("No gas table", error.Message);
        Assert.Contains("O2, N2, H2, F2, Cl2", error.Message);
        Assert.False(GasTables.TryGet(formula, out _));
    }

    [Fact]
    public void Each_gas_carries_its_sources_and_its_thermal_enthalpy_from_zero()
    {
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), H°(298.15 K) − H°(0) in kJ/mol — from memory
        var expected = new Dictionary<string, double> { ["O2"] = 8.683, ["N2"] = 8.670, ["H2"] = 8.467, ["F2"] = 8.825, ["Cl2"] = 9.181 };
        foreach (GasSpecies gas in GasTables.All)
        {
            Assert.Equal(expected[gas.Formula], gas.EnthalpyStandardAboveZeroKjPerMol, 1e-9);
            Assert.Contains("NIST-JANAF", gas.EnthalpyStandardAboveZeroSource);
            Assert.Contains("Shomate", gas.Table.Source);
            Assert.Equal(2, gas.AtomsPerMolecule);
        }
    }
}
