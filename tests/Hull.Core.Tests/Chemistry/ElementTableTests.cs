using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public class ElementTableTests
{
    [Fact]
    public void Table_has_every_atomic_number_from_1_to_118_once_with_unique_symbols_and_names()
    {
        Assert.Equal(118, ElementTable.All.Count);
        for (int z = 1; z <= 118; z++)
        {
            Assert.Equal(z, ElementTable.All[z - 1].AtomicNumber);
            Assert.Same(ElementTable.All[z - 1], ElementTable.ByAtomicNumber(z));
            Assert.Same(ElementTable.All[z - 1], ElementTable.BySymbol(ElementTable.All[z - 1].Symbol));
        }

        Assert.Equal(118, ElementTable.All.Select(e => e.Symbol).Distinct(StringComparer.Ordinal).Count());
        Assert.Equal(118, ElementTable.All.Select(e => e.Name).Distinct(StringComparer.OrdinalIgnoreCase).Count());
    }

    [Fact]
    public void Symbols_are_one_capital_and_at_most_one_small_letter()
    {
        // IUPAC nomenclature: permanent symbols have one or two letters, the first capitalised. // common practice
        foreach (Element element in ElementTable.All)
        {
            Assert.Matches("^[A-Z][a-z]?$", element.Symbol);
        }
    }

    [Theory]
    [InlineData("H", 1, "Hydrogen")]
    [InlineData("C", 6, "Carbon")]
    [InlineData("Fe", 26, "Iron")]
    [InlineData("Co", 27, "Cobalt")]
    [InlineData("Sn", 50, "Tin")]
    [InlineData("W", 74, "Tungsten")]
    [InlineData("U", 92, "Uranium")]
    [InlineData("Og", 118, "Oganesson")]
    public void Symbols_map_to_atomic_numbers(string symbol, int atomicNumber, string name)
    {
        // IUPAC Periodic Table of the Elements (2022) — from memory
        Element element = ElementTable.BySymbol(symbol);
        Assert.Equal(atomicNumber, element.AtomicNumber);
        Assert.Equal(name, element.Name);
        Assert.True(ElementTable.TryGetBySymbol(symbol, out Element? found));
        Assert.Same(element, found);
    }

    [Theory]
    [InlineData("H", 1.008)]
    [InlineData("C", 12.011)]
    [InlineData("N", 14.007)]
    [InlineData("O", 15.999)]
    [InlineData("Na", 22.990)]
    [InlineData("Cl", 35.45)]
    [InlineData("Fe", 55.845)]
    [InlineData("Cu", 63.546)]
    [InlineData("Au", 196.97)]
    [InlineData("U", 238.03)]
    public void Standard_atomic_weights_match_the_IUPAC_abridged_table(string symbol, double weight)
    {
        // IUPAC CIAAW Standard Atomic Weights (2021), abridged/conventional values — from memory
        Assert.Equal(weight, ElementTable.BySymbol(symbol).StandardAtomicWeight);
    }

    [Fact]
    public void Exactly_the_elements_without_a_characteristic_terrestrial_isotopic_composition_have_no_weight()
    {
        // IUPAC CIAAW Standard Atomic Weights (2021): no value for Tc, Pm, Po–Ac and Np onward; Th, Pa, U have one
        // — from memory
        var withoutWeight = new HashSet<int> { 43, 61 };
        withoutWeight.UnionWith(Enumerable.Range(84, 6));
        withoutWeight.UnionWith(Enumerable.Range(93, 26));
        foreach (Element element in ElementTable.All)
        {
            Assert.True(
                withoutWeight.Contains(element.AtomicNumber) == element.StandardAtomicWeight is null,
                $"{element.Symbol}: weight {element.StandardAtomicWeight}");
        }
    }

    [Fact]
    public void Standard_atomic_weights_grow_with_atomic_number_except_the_known_inversions()
    {
        // Ar > K, Co > Ni, Te > I and Th > Pa are the inversions of the periodic table. // common practice
        var inversions = new HashSet<string>(StringComparer.Ordinal) { "Ar", "Co", "Te", "Th" };
        Element[] weighed = [.. ElementTable.All.Where(e => e.StandardAtomicWeight is not null)];
        for (int i = 0; i + 1 < weighed.Length; i++)
        {
            bool grows = weighed[i].StandardAtomicWeight < weighed[i + 1].StandardAtomicWeight;
            Assert.True(grows != inversions.Contains(weighed[i].Symbol), $"{weighed[i].Symbol} -> {weighed[i + 1].Symbol}");
        }
    }

    [Theory]
    [InlineData("Xx")]
    [InlineData("fe")]
    [InlineData("FE")]
    [InlineData("")]
    [InlineData("Uue")]
    public void Unknown_symbols_are_refused_with_the_symbol_named(string symbol)
    {
        ArgumentException error = Assert.Throws<ArgumentException>(() => ElementTable.BySymbol(symbol));
        Assert.Contains($"'{symbol}'", error.Message);
        Assert.False(ElementTable.TryGetBySymbol(symbol, out _));
        Assert.False(ElementTable.IsSymbol(symbol));
    }

    [Theory]
    [InlineData(0)]
    [InlineData(119)]
    [InlineData(-1)]
    public void Atomic_numbers_outside_the_table_are_refused(int atomicNumber)
    {
        ArgumentOutOfRangeException error =
            Assert.Throws<ArgumentOutOfRangeException>(() => ElementTable.ByAtomicNumber(atomicNumber));
        Assert.Contains(atomicNumber.ToString(System.Globalization.CultureInfo.InvariantCulture), error.Message);
    }
}
