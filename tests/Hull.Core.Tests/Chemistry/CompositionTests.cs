using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public class CompositionTests
{
    [Theory]
    // Smallest whole-number formulas worked by hand. // common practice
    [InlineData("Li2O2", "LiO", 2, 1)]
    [InlineData("Li0.5CoO2", "LiCo2O4", 1, 2)]
    [InlineData("Fe2O3", "Fe2O3", 1, 1)]
    [InlineData("H4O2", "H2O", 2, 1)]
    [InlineData("O2", "O", 2, 1)]
    [InlineData("LiNi1/3Mn1/3Co1/3O2", "Li3NiMnCoO6", 1, 3)]
    [InlineData("Fe0.95O", "Fe19O20", 1, 20)]
    [InlineData("Li2/3O1/3", "Li2O", 1, 3)]
    [InlineData("Ti6O12", "TiO2", 6, 1)]
    [InlineData("C0.4H0.6", "C2H3", 1, 5)]
    public void Reduced_is_the_smallest_whole_number_formula(
        string formula, string reducedFormula, long factorNumerator, long factorDenominator)
    {
        Composition composition = Composition.Parse(formula);
        Assert.Equal(Composition.Parse(reducedFormula), composition.Reduced);
        Assert.Equal(new Rational(factorNumerator, factorDenominator), composition.ReductionFactor);
        Assert.Equal(composition, composition.Reduced.Scale(composition.ReductionFactor));
        Assert.Same(composition.Reduced, composition.Reduced.Reduced);
        Assert.Equal(Rational.One, composition.Reduced.ReductionFactor);
    }

    [Fact]
    public void An_already_reduced_composition_is_its_own_reduced_form()
    {
        Composition water = Composition.Parse("H2O");
        Assert.Same(water, water.Reduced);
        Assert.Equal(Rational.One, water.ReductionFactor);
        Assert.Equal("H2O", water.ReducedFormula);
    }

    [Theory]
    // Hill order: C, then H, then the rest alphabetically; without C, all alphabetically. // common practice
    // Formula keeps the order the elements were first written in (brackets and adducts flattened).
    [InlineData("H2O", "H2O", "H2O")]
    [InlineData("OH2", "OH2", "H2O")]
    [InlineData("NaCl", "NaCl", "ClNa")]
    [InlineData("CH3CH2OH", "C2H6O", "C2H6O")]
    [InlineData("BrCH3", "BrCH3", "CH3Br")]
    [InlineData("Li2CO3", "Li2CO3", "CLi2O3")]
    [InlineData("NH4Cl", "NH4Cl", "ClH4N")]
    [InlineData("LiCoO2", "LiCoO2", "CoLiO2")]
    [InlineData("Li0.5CoO2", "Li0.5CoO2", "CoLi0.5O2")]
    [InlineData("LiNi1/3Mn1/3Co1/3O2", "LiNi1/3Mn1/3Co1/3O2", "Co1/3LiMn1/3Ni1/3O2")]
    [InlineData("H1/1024O", "H1/1024O", "H1/1024O")]
    [InlineData("H0.000125O", "H0.000125O", "H0.000125O")]
    [InlineData("Fe4/2O3", "Fe2O3", "Fe2O3")]
    [InlineData("Fe2.50O", "Fe2.5O", "Fe2.5O")]
    [InlineData("Ca(OH)2", "CaO2H2", "CaH2O2")]
    [InlineData("CuSO4·5H2O", "CuSO9H10", "CuH10O9S")]
    public void Formula_uses_the_documented_order_and_amount_notation(string input, string formula, string hill)
    {
        Composition composition = Composition.Parse(input);
        Assert.Equal(formula, composition.Formula);
        Assert.Equal(formula, composition.ToString());
        Assert.Equal(hill, composition.HillFormula);
        Assert.Equal(composition, Composition.Parse(composition.Formula));
        Assert.Equal(composition, Composition.Parse(composition.HillFormula));
        // Written order is for display: compositions written in another order are equal, with one Hill formula.
        Composition hillWritten = Composition.Parse(hill);
        Assert.Equal(composition, hillWritten);
        Assert.Equal(composition.GetHashCode(), hillWritten.GetHashCode());
        Assert.Equal(hill, hillWritten.Formula);
    }

    [Fact]
    public void Written_order_survives_reduction_scaling_and_sums_and_amounts_alone_give_hill_order()
    {
        Composition lco = Composition.Parse("Li2Co2O4");
        Assert.Equal("LiCoO2", lco.Reduced.Formula);
        Assert.Equal("Li2Co2O4", lco.Scale(new Rational(1, 1)).Formula);
        Assert.Equal("Li4Co4O8", lco.Scale(new Rational(2, 1)).Formula);
        Assert.Equal("Li2Co2O5", (lco + Composition.Parse("O")).Formula);
        // The left side's order first, then the right side's new elements in their own order.
        Assert.Equal("LiCoO2Ni", (Composition.Parse("LiCoO2") + Composition.FromAmounts(("Ni", Rational.One))).Formula);
        Assert.Equal("CoLiO2", Composition.FromAmounts(("Li", Rational.One), ("Co", Rational.One), ("O", new Rational(2, 1))).Formula);
    }

    [Theory]
    [InlineData("Fe2O3", "Fe-O")]
    [InlineData("Li2CO3", "C-Li-O")]
    [InlineData("LiCoO2", "Co-Li-O")]
    [InlineData("O2", "O")]
    public void Chemical_system_joins_ordinal_sorted_symbols(string formula, string system)
    {
        Composition composition = Composition.Parse(formula);
        Assert.Equal(system, composition.ChemicalSystem);
        Assert.Equal(system.Split('-'), composition.Elements);
    }

    [Fact]
    public void Elements_and_amounts_are_in_ordinal_order()
    {
        Composition composition = Composition.Parse("ZnOCaClCBa");
        string[] expected = ["Ba", "C", "Ca", "Cl", "O", "Zn"];
        Assert.Equal(expected, composition.Elements);
        Assert.Equal(expected, composition.Amounts.Keys);
        Assert.Equal(6, composition.AtomsPerFormulaUnit.Numerator);
    }

    [Fact]
    public void Atomic_fractions_are_amounts_over_atoms_per_formula_unit()
    {
        Composition hematite = Composition.Parse("Fe2O3");
        Assert.Equal(Rational.FromInteger(5), hematite.AtomsPerFormulaUnit);
        Assert.Equal(new Rational(2, 5), hematite.AtomicFractionExact("Fe"));
        Assert.Equal(0.6, hematite.AtomicFraction("O"), 15);
        Assert.Equal(Rational.Zero, hematite.AtomicFractionExact("Li"));
        Assert.Equal(0.0, hematite.AtomicFraction("Li"));

        Composition layered = Composition.Parse("LiNi1/3Mn1/3Co1/3O2");
        Assert.Equal(Rational.FromInteger(4), layered.AtomsPerFormulaUnit);
        Assert.Equal(new Rational(1, 12), layered.AtomicFractionExact("Ni"));
        Assert.Equal(new Rational(1, 2), layered.AtomicFractionExact("O"));

        Rational sum = layered.Elements.Aggregate(Rational.Zero, (total, symbol) => total + layered.AtomicFractionExact(symbol));
        Assert.Equal(Rational.One, sum);

        Composition perAtom = hematite.PerAtom();
        Assert.Equal(Rational.One, perAtom.AtomsPerFormulaUnit);
        Assert.Equal(new Rational(3, 5), perAtom.AmountOf("O"));
    }

    [Fact]
    public void Asking_about_a_non_element_is_an_error_naming_it()
    {
        Composition water = Composition.Parse("H2O");
        Assert.Contains("'Xx'", Assert.Throws<ArgumentException>(() => water.AmountOf("Xx")).Message);
        Assert.Contains("'h'", Assert.Throws<ArgumentException>(() => water.AtomicFraction("h")).Message);
        Assert.Equal(Rational.Zero, water.AmountOf("Fe"));
        Assert.False(water.Contains("Fe"));
        Assert.True(water.Contains("H"));
    }

    [Fact]
    public void Equality_is_by_exact_amounts_not_proportions()
    {
        Composition peroxide = Composition.Parse("Li2O2");
        Composition lio = Composition.Parse("LiO");
        Assert.NotEqual(peroxide, lio);
        Assert.True(peroxide != lio);
        Assert.True(peroxide.HasSameProportions(lio));
        Assert.False(peroxide.HasSameProportions(Composition.Parse("Li2O")));

        Composition a = Composition.FromAmounts(("O", 2), ("Li", 2));
        Composition b = Composition.FromAmounts(new Dictionary<string, Rational> { ["Li"] = 2, ["O"] = 2 });
        Assert.Equal(a, b);
        Assert.True(a == b);
        Assert.Equal(a.GetHashCode(), b.GetHashCode());
        Assert.Equal(peroxide, a);
        Assert.False(a.Equals(null));
        Assert.False(a == null);
        Assert.NotEqual(Composition.Parse("FeO"), Composition.Parse("FeO2"));
        Assert.NotEqual(Composition.Parse("FeO"), Composition.Parse("CoO"));
    }

    [Fact]
    public void Sum_and_scale_combine_amounts_exactly()
    {
        Composition hydrate = Composition.Parse("CuSO4") + Composition.Parse("H2O").Scale(5);
        Assert.Equal(Composition.Parse("CuSO4·5H2O"), hydrate);
        Assert.Equal(Composition.Parse("Fe1/2O3/4"), Composition.Parse("Fe2O3").Scale(new Rational(1, 4)));
        Assert.Throws<ArgumentOutOfRangeException>(() => hydrate.Scale(Rational.Zero));
        Assert.Throws<ArgumentOutOfRangeException>(() => hydrate.Scale(-1));
    }

    [Theory]
    [InlineData("Xx", 1, "'Xx'")]
    [InlineData("fe", 1, "'fe'")]
    [InlineData("Fe", 0, "Fe")]
    [InlineData("Fe", -1, "Fe")]
    public void FromAmounts_refuses_bad_symbols_and_non_positive_amounts(string symbol, long amount, string named)
    {
        ArgumentException error = Assert.Throws<ArgumentException>(() => Composition.FromAmounts((symbol, amount)));
        Assert.Contains(named, error.Message);
    }

    [Fact]
    public void FromAmounts_refuses_repeated_symbols_and_empty_input()
    {
        Assert.Contains("Fe", Assert.Throws<ArgumentException>(() => Composition.FromAmounts(("Fe", 1), ("Fe", 2))).Message);
        Assert.Throws<ArgumentException>(() => Composition.FromAmounts());
        Assert.Throws<ArgumentException>(() => Composition.FromAmounts(Array.Empty<KeyValuePair<string, Rational>>()));
    }

    [Fact]
    public void Single_elements()
    {
        Composition iron = Composition.OfElement("Fe");
        Assert.True(iron.IsSingleElement);
        Assert.Equal("Fe", iron.Formula);
        Assert.False(Composition.Parse("FeO").IsSingleElement);
        Assert.Throws<ArgumentException>(() => Composition.OfElement("Qq"));
    }
}
