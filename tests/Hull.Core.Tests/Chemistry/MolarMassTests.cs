using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public class MolarMassTests
{
    /// <summary>
    /// The handbook values below are quoted to 0.01 g/mol; half a unit in that last place is the most a correct
    /// table can differ from them.
    /// </summary>
    private const double QuotedPrecisionGramsPerMole = 0.005 + 1e-9;

    [Theory]
    // CRC Handbook of Chemistry and Physics, physical constants of inorganic compounds, molar masses — from memory
    [InlineData("H2O", 18.015)]
    [InlineData("NaCl", 58.44)]
    [InlineData("CO2", 44.01)]
    [InlineData("CaCO3", 100.09)]
    [InlineData("Fe2O3", 159.69)]
    [InlineData("CuSO4·5H2O", 249.68)]
    public void Molar_masses_from_the_table_match_handbook_values(string formula, double gramsPerMole)
    {
        Assert.Equal(gramsPerMole, Composition.Parse(formula).MolarMassGramsPerMole, QuotedPrecisionGramsPerMole);
    }

    [Fact]
    public void Molar_mass_scales_with_the_formula_unit()
    {
        Composition water = Composition.Parse("H2O");
        Assert.Equal(2 * water.MolarMassGramsPerMole, Composition.Parse("H4O2").MolarMassGramsPerMole, 12);
        Assert.Equal(water.MolarMassGramsPerMole / 2, Composition.Parse("HO0.5").MolarMassGramsPerMole, 12);
    }

    [Fact]
    public void Elements_without_a_standard_atomic_weight_have_no_molar_mass()
    {
        InvalidOperationException error =
            Assert.Throws<InvalidOperationException>(() => Composition.Parse("Tc2O7").MolarMassGramsPerMole);
        Assert.Contains("Technetium (Tc)", error.Message);
        Assert.Contains("Tc2O7", error.Message);
    }
}
