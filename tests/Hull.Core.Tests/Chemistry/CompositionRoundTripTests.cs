using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

/// <summary>
/// Properties that must hold for every composition, checked on seeded random ones: random elements from the whole
/// table and random whole, decimal and fractional amounts.
/// </summary>
public class CompositionRoundTripTests
{
    private const int Cases = 4000;

    [Fact]
    public void Formula_and_reduced_formula_parse_back_to_equal_compositions()
    {
        var random = new Random(911);
        for (int i = 0; i < Cases; i++)
        {
            Composition composition = RandomComposition(random);
            Assert.True(Composition.Parse(composition.Formula) == composition, composition.Formula);
            Assert.True(Composition.Parse(composition.ReducedFormula) == composition.Reduced, composition.ReducedFormula);
        }
    }

    [Fact]
    public void Reduced_form_is_whole_coprime_and_scales_back()
    {
        var random = new Random(1213);
        for (int i = 0; i < Cases; i++)
        {
            Composition composition = RandomComposition(random);
            Composition reduced = composition.Reduced;
            long gcd = 0;
            foreach (Rational amount in reduced.Amounts.Values)
            {
                Assert.True(amount.IsInteger, composition.Formula);
                gcd = Rational.Gcd(gcd, amount.Numerator);
            }

            Assert.Equal(1, gcd);
            Assert.Equal(composition, reduced.Scale(composition.ReductionFactor));
            Assert.Equal(composition.Elements, reduced.Elements);
            Assert.Equal(reduced, reduced.Reduced);

            // Any positive multiple has the same reduced form.
            Rational factor = new(random.Next(1, 9), random.Next(1, 9));
            Assert.Equal(reduced, composition.Scale(factor).Reduced);
        }
    }

    [Fact]
    public void Order_and_fractions_are_consistent()
    {
        var random = new Random(1415);
        for (int i = 0; i < Cases; i++)
        {
            Composition composition = RandomComposition(random);
            string[] sorted = [.. composition.Elements];
            Array.Sort(sorted, string.CompareOrdinal);
            Assert.Equal(sorted, composition.Elements);
            Assert.Equal(string.Join('-', sorted), composition.ChemicalSystem);

            Rational total = Rational.Zero;
            foreach (string symbol in composition.Elements)
            {
                total += composition.AtomicFractionExact(symbol);
            }

            Assert.Equal(Rational.One, total);
            Assert.Equal(composition.GetHashCode(), Composition.Parse(composition.Formula).GetHashCode());
        }
    }

    private static Composition RandomComposition(Random random)
    {
        int count = random.Next(1, 7);
        var amounts = new Dictionary<string, Rational>(StringComparer.Ordinal);
        while (amounts.Count < count)
        {
            string symbol = ElementTable.All[random.Next(ElementTable.All.Count)].Symbol;
            amounts[symbol] = RandomAmount(random);
        }

        return Composition.FromAmounts(amounts);
    }

    // Denominators stay small enough that whole-number forms of six-element compositions fit in 64 bits.
    private static Rational RandomAmount(Random random) => random.Next(4) switch
    {
        0 => random.Next(1, 50),
        1 => new Rational(random.Next(1, 100_000), (long)Math.Pow(10, random.Next(1, 5))),
        2 => new Rational(random.Next(1, 60), random.Next(1, 13)),
        _ => new Rational(random.Next(1, 5000), 1L << random.Next(0, 14)),
    };
}
