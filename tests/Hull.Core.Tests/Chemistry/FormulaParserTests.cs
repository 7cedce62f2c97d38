using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public class FormulaParserTests
{
    private static readonly Rational Third = new(1, 3);
    private static readonly Rational Half = new(1, 2);

    public static TheoryData<string, (string Symbol, Rational Amount)[]> Examples => new()
    {
        // Amounts counted by hand from the formulas as written. // common practice
        { "Li2CO3", [("Li", 2), ("C", 1), ("O", 3)] },
        { "Ca(OH)2", [("Ca", 1), ("O", 2), ("H", 2)] },
        { "Mg3(Si2O5)2(OH)2", [("Mg", 3), ("Si", 4), ("O", 12), ("H", 2)] },
        { "K4[Fe(CN)6]", [("K", 4), ("Fe", 1), ("C", 6), ("N", 6)] },
        { "[Co(NH3)6]Cl3", [("Co", 1), ("N", 6), ("H", 18), ("Cl", 3)] },
        { "Li0.5CoO2", [("Li", Half), ("Co", 1), ("O", 2)] },
        { "LiNi1/3Mn1/3Co1/3O2", [("Li", 1), ("Ni", Third), ("Mn", Third), ("Co", Third), ("O", 2)] },
        { "Fe0.95O", [("Fe", new Rational(19, 20)), ("O", 1)] },
        { "Li0.333", [("Li", new Rational(333, 1000))] },
        { "CuSO4·5H2O", [("Cu", 1), ("S", 1), ("O", 9), ("H", 10)] },
        { "CuSO4•5H2O", [("Cu", 1), ("S", 1), ("O", 9), ("H", 10)] },
        { "CuSO4*5H2O", [("Cu", 1), ("S", 1), ("O", 9), ("H", 10)] },
        { "CaSO4*0.5H2O", [("Ca", 1), ("S", 1), ("O", new Rational(9, 2)), ("H", 1)] },
        { "Na2SO4·10H2O", [("Na", 2), ("S", 1), ("O", 14), ("H", 20)] },
        { "Na2CO3·H2O", [("Na", 2), ("C", 1), ("O", 4), ("H", 2)] },
        { "MgSO4·1/2H2O", [("Mg", 1), ("S", 1), ("O", new Rational(9, 2)), ("H", 1)] },
        { "Al2(SO4)3·K2SO4·24H2O", [("Al", 2), ("S", 4), ("O", 40), ("K", 2), ("H", 48)] },
        { " Ca ( O H ) 2 ", [("Ca", 1), ("O", 2), ("H", 2)] },
        { "CuSO4 · 5 H2O", [("Cu", 1), ("S", 1), ("O", 9), ("H", 10)] },
        { "Li\t2 C O\n3", [("Li", 2), ("C", 1), ("O", 3)] },
        { "HOH", [("H", 2), ("O", 1)] },
        { "CO", [("C", 1), ("O", 1)] },
        { "Co", [("Co", 1)] },
        { "O2", [("O", 2)] },
        { "((H)2)3", [("H", 6)] },
        { "(H2O)0.5", [("H", 1), ("O", Half)] },
        { "Fe2O3", [("Fe", 2), ("O", 3)] },
        { "H1.000", [("H", 1)] },
    };

    [Theory]
    [MemberData(nameof(Examples))]
    public void Parses_examples_to_exact_amounts(string formula, (string Symbol, Rational Amount)[] expected)
    {
        Composition parsed = FormulaParser.Parse(formula);
        Assert.Equal(expected.Length, parsed.Elements.Count);
        foreach ((string symbol, Rational amount) in expected)
        {
            Assert.Equal(amount, parsed.AmountOf(symbol));
        }

        Assert.Equal(Composition.FromAmounts(expected), parsed);
        Assert.Equal(parsed, Composition.Parse(formula));
    }

    [Fact]
    public void TryParse_returns_the_composition_or_the_error()
    {
        Assert.True(Composition.TryParse("H2O", out Composition? water, out FormulaParseException? none));
        Assert.Equal(Composition.FromAmounts(("H", 2), ("O", 1)), water);
        Assert.Null(none);

        Assert.False(Composition.TryParse("H2Xx", out Composition? bad, out FormulaParseException? error));
        Assert.Null(bad);
        Assert.Equal(2, error.Position);

        Assert.False(Composition.TryParse(null, out _));
        Assert.True(Composition.TryParse("NaCl", out _));
    }

    [Fact]
    public void Null_text_is_an_argument_error()
    {
        Assert.Throws<ArgumentNullException>(() => FormulaParser.Parse(null!));
    }

    /// <summary>
    /// Random formulas built as trees of elements, bracket groups and adduct parts, written with random spacing,
    /// bracket kinds and amount notations; the amounts are counted from the tree independently of the parser.
    /// </summary>
    [Fact]
    public void Random_formula_texts_parse_to_the_amounts_they_were_built_from()
    {
        var random = new Random(7741);
        string[] symbols = [.. ElementTable.All.Select(e => e.Symbol)];
        for (int i = 0; i < 3000; i++)
        {
            var expected = new Dictionary<string, Rational>(StringComparer.Ordinal);
            var text = new System.Text.StringBuilder();
            int parts = random.Next(1, 4);
            for (int p = 0; p < parts; p++)
            {
                Rational multiplier = Rational.One;
                if (p > 0)
                {
                    text.Append(Space(random)).Append("·•*"[random.Next(3)]).Append(Space(random));
                    if (random.Next(2) == 0)
                    {
                        multiplier = RandomAmount(random, out string written);
                        text.Append(written).Append(Space(random));
                    }
                }

                WriteSequence(random, symbols, text, expected, multiplier, depth: 0);
            }

            string formula = text.ToString();
            Composition parsed = FormulaParser.Parse(formula);
            Assert.True(Composition.FromAmounts(expected) == parsed, formula);
        }
    }

    private static void WriteSequence(
        Random random,
        string[] symbols,
        System.Text.StringBuilder text,
        Dictionary<string, Rational> expected,
        Rational multiplier,
        int depth)
    {
        int items = random.Next(1, 4);
        for (int i = 0; i < items; i++)
        {
            Rational amount = Rational.One;
            string written = string.Empty;
            if (random.Next(3) > 0)
            {
                amount = RandomAmount(random, out written);
            }

            if (depth < 3 && random.Next(4) == 0)
            {
                (char open, char close) = random.Next(2) == 0 ? ('(', ')') : ('[', ']');
                text.Append(open).Append(Space(random));
                WriteSequence(random, symbols, text, expected, multiplier * amount, depth + 1);
                text.Append(close).Append(Space(random)).Append(written).Append(Space(random));
            }
            else
            {
                string symbol = symbols[random.Next(symbols.Length)];
                text.Append(symbol).Append(Space(random)).Append(written).Append(Space(random));
                Rational added = multiplier * amount;
                expected[symbol] = expected.TryGetValue(symbol, out Rational existing) ? existing + added : added;
            }
        }
    }

    private static string Space(Random random) => random.Next(5) switch
    {
        0 => " ",
        1 => "\t",
        _ => string.Empty,
    };

    private static Rational RandomAmount(Random random, out string written)
    {
        switch (random.Next(3))
        {
            case 0:
                long whole = random.Next(1, 30);
                written = whole.ToString(System.Globalization.CultureInfo.InvariantCulture);
                return whole;
            case 1:
                int places = random.Next(1, 4);
                long scaled = random.Next(1, 3000);
                long power = (long)Math.Pow(10, places);
                written = string.Create(
                    System.Globalization.CultureInfo.InvariantCulture,
                    $"{scaled / power}.{(scaled % power).ToString(System.Globalization.CultureInfo.InvariantCulture).PadLeft(places, '0')}");
                return new Rational(scaled, power);
            default:
                long numerator = random.Next(1, 20);
                long denominator = random.Next(1, 13);
                written = string.Create(System.Globalization.CultureInfo.InvariantCulture, $"{numerator}/{denominator}");
                return new Rational(numerator, denominator);
        }
    }
}
