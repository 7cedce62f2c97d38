using System.Numerics;
using Hull.Core.Chemistry;

namespace Hull.Core.Tests.Chemistry;

public class RationalTests
{
    [Fact]
    public void Construction_reduces_and_keeps_the_denominator_positive()
    {
        var r = new Rational(6, -4);
        Assert.Equal(-3, r.Numerator);
        Assert.Equal(2, r.Denominator);
        Assert.Equal(new Rational(0, 1), new Rational(0, -7));
        Assert.Equal(1, new Rational(0, -7).Denominator);
    }

    [Fact]
    public void Default_value_is_zero_with_denominator_one()
    {
        Rational zero = default;
        Assert.True(zero.IsZero);
        Assert.Equal(1, zero.Denominator);
        Assert.Equal(Rational.Zero, zero);
        Assert.Equal("0", zero.ToString());
        Assert.Equal(0, zero.Sign);
    }

    [Fact]
    public void Zero_denominator_is_refused()
    {
        Assert.Throws<DivideByZeroException>(() => new Rational(1, 0));
        Assert.Throws<DivideByZeroException>(() => Rational.One / Rational.Zero);
        Assert.Throws<DivideByZeroException>(() => Rational.Zero.Reciprocal());
    }

    [Fact]
    public void Arithmetic_is_exact()
    {
        Assert.Equal(new Rational(1, 2), new Rational(1, 3) + new Rational(1, 6));
        Assert.Equal(new Rational(-1, 4), new Rational(1, 2) - new Rational(3, 4));
        Assert.Equal(new Rational(3, 2), new Rational(2, 3) * new Rational(9, 4));
        Assert.Equal(Rational.FromInteger(2), new Rational(1, 2) / new Rational(1, 4));
        Assert.Equal(new Rational(-5, 7), -new Rational(5, 7));
        Assert.Equal(new Rational(-7, 5), new Rational(-5, 7).Reciprocal());
        Assert.Equal(new Rational(5, 7), new Rational(-5, 7).Abs());
    }

    [Fact]
    public void Intermediate_products_beyond_64_bits_do_not_overflow_when_the_result_fits()
    {
        var big = Rational.FromInteger(long.MaxValue);
        var tiny = new Rational(1, long.MaxValue);
        Assert.Equal(Rational.One, big * tiny);
        Assert.Equal(Rational.One, tiny / tiny);
        Assert.Equal(new Rational(2, long.MaxValue), tiny + tiny);
    }

    [Fact]
    public void Overflow_throws_with_a_clear_message()
    {
        var big = Rational.FromInteger(long.MaxValue);
        OverflowException sum = Assert.Throws<OverflowException>(() => big + Rational.One);
        Assert.Contains("overflow", sum.Message, StringComparison.OrdinalIgnoreCase);
        Assert.Contains(long.MaxValue.ToString(System.Globalization.CultureInfo.InvariantCulture), sum.Message);

        var tiny = new Rational(1, long.MaxValue);
        Assert.Throws<OverflowException>(() => tiny * new Rational(1, 2));
        Assert.Throws<OverflowException>(() => big * 2);
        Assert.Throws<OverflowException>(() => -big - Rational.One - Rational.One);
        Assert.Throws<OverflowException>(() => Rational.FromInteger(long.MinValue));
        Assert.Throws<OverflowException>(() => new Rational(long.MinValue, 1));
    }

    [Fact]
    public void Comparison_orders_by_value()
    {
        Assert.True(new Rational(1, 3) < new Rational(1, 2));
        Assert.True(new Rational(-1, 2) < new Rational(1, 3));
        Assert.True(new Rational(long.MaxValue - 1, long.MaxValue) < Rational.One);
        Assert.True(new Rational(2, 4) <= new Rational(1, 2));
        Assert.True(new Rational(2, 4) >= new Rational(1, 2));
        Assert.Equal(0, new Rational(2, 4).CompareTo(new Rational(1, 2)));
        Assert.Equal(new Rational(1, 3), Rational.Min(new Rational(1, 3), new Rational(1, 2)));
        Assert.Equal(new Rational(1, 2), Rational.Max(new Rational(1, 3), new Rational(1, 2)));
        Assert.Equal(-1, new Rational(-3, 4).Sign);
    }

    [Theory]
    [InlineData("3", 3, 1)]
    [InlineData("-3", -3, 1)]
    [InlineData("0.25", 1, 4)]
    [InlineData("1/3", 1, 3)]
    [InlineData("-1/3", -1, 3)]
    [InlineData("4/6", 2, 3)]
    [InlineData("0.333", 333, 1000)]
    [InlineData("1.50", 3, 2)]
    [InlineData("-0.5", -1, 2)]
    [InlineData(" 2 ", 2, 1)]
    [InlineData("007", 7, 1)]
    [InlineData("0.1000000000000000000000000", 1, 10)]
    public void Parse_reads_integers_decimals_and_fractions_exactly(string text, long numerator, long denominator)
    {
        Rational value = Rational.Parse(text);
        Assert.Equal(numerator, value.Numerator);
        Assert.Equal(denominator, value.Denominator);
        Assert.True(Rational.TryParse(text, out Rational again));
        Assert.Equal(value, again);
    }

    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    [InlineData("1/")]
    [InlineData("/3")]
    [InlineData("1.2.3")]
    [InlineData("1.")]
    [InlineData(".5")]
    [InlineData("abc")]
    [InlineData("1e3")]
    [InlineData("+1")]
    [InlineData("1/-3")]
    [InlineData("0.5/2")]
    [InlineData("1/0")]
    [InlineData("1 / 3")]
    public void Parse_refuses_malformed_text(string text)
    {
        FormatException error = Assert.Throws<FormatException>(() => Rational.Parse(text));
        Assert.Contains($"'{text}'", error.Message);
        Assert.False(Rational.TryParse(text, out _));
    }

    [Fact]
    public void Parse_reports_values_beyond_64_bits_as_overflow()
    {
        Assert.Throws<OverflowException>(() => Rational.Parse("99999999999999999999"));
        Assert.Throws<OverflowException>(() => Rational.FromDecimalString("0.0000000000000000000001"));
        Assert.False(Rational.TryParse("99999999999999999999", out _));
        Assert.False(Rational.TryParse(null, out _));
    }

    [Fact]
    public void FromDecimalString_is_exact_and_refuses_fractions()
    {
        Assert.Equal(new Rational(333, 1000), Rational.FromDecimalString("0.333"));
        Assert.Equal(new Rational(1, 1024), Rational.FromDecimalString("0.0009765625"));
        Assert.Equal(Rational.FromInteger(12), Rational.FromDecimalString("12"));
        Assert.Throws<FormatException>(() => Rational.FromDecimalString("1/3"));
    }

    [Fact]
    public void ToString_writes_integers_and_reduced_fractions()
    {
        Assert.Equal("3", Rational.FromInteger(3).ToString());
        Assert.Equal("1/4", new Rational(2, 8).ToString());
        Assert.Equal("-1/4", new Rational(1, -4).ToString());
    }

    [Fact]
    public void Exact_decimal_form_exists_only_for_terminating_expansions()
    {
        Assert.True(new Rational(1, 4).TryFormatExactDecimal(6, out string? quarter));
        Assert.Equal("0.25", quarter);
        Assert.True(new Rational(-3, 2).TryFormatExactDecimal(6, out string? minusOneAndHalf));
        Assert.Equal("-1.5", minusOneAndHalf);
        Assert.True(new Rational(1, 1024).TryFormatExactDecimal(10, out string? small));
        Assert.Equal("0.0009765625", small);
        Assert.True(new Rational(7, 1).TryFormatExactDecimal(0, out string? seven));
        Assert.Equal("7", seven);
        Assert.False(new Rational(1, 1024).TryFormatExactDecimal(6, out _));
        Assert.False(new Rational(1, 3).TryFormatExactDecimal(30, out _));
    }

    [Fact]
    public void Equal_values_hash_equally()
    {
        Assert.Equal(new Rational(2, 4).GetHashCode(), new Rational(1, 2).GetHashCode());
        Assert.True(new Rational(2, 4) == new Rational(1, 2));
        Assert.True(new Rational(1, 3) != new Rational(1, 2));
        Assert.False(new Rational(1, 2).Equals((object)0.5));
    }

    /// <summary>
    /// Random operands checked against fraction arithmetic done independently with arbitrary-precision integers
    /// (System.Numerics.BigInteger): (a/b) op (c/d) compared by cross-multiplication, no reduction involved.
    /// </summary>
    [Fact]
    public void Random_arithmetic_agrees_with_arbitrary_precision_cross_multiplication()
    {
        var random = new Random(20240611);
        for (int i = 0; i < 5000; i++)
        {
            Rational a = RandomRational(random);
            Rational b = RandomRational(random);
            AssertSame(a + b, (BigInteger)a.Numerator * b.Denominator + (BigInteger)b.Numerator * a.Denominator, (BigInteger)a.Denominator * b.Denominator);
            AssertSame(a - b, (BigInteger)a.Numerator * b.Denominator - (BigInteger)b.Numerator * a.Denominator, (BigInteger)a.Denominator * b.Denominator);
            AssertSame(a * b, (BigInteger)a.Numerator * b.Numerator, (BigInteger)a.Denominator * b.Denominator);
            if (!b.IsZero)
            {
                AssertSame(a / b, (BigInteger)a.Numerator * b.Denominator, (BigInteger)a.Denominator * b.Numerator);
            }

            int expectedOrder = ((BigInteger)a.Numerator * b.Denominator).CompareTo((BigInteger)b.Numerator * a.Denominator);
            Assert.Equal(Math.Sign(expectedOrder), Math.Sign(a.CompareTo(b)));
            Assert.Equal(a, Rational.Parse(a.ToString()));
            Assert.Equal(1, Rational.Gcd(a.Numerator, a.Denominator));
        }
    }

    private static Rational RandomRational(Random random) =>
        new(random.NextInt64(-1_000_000, 1_000_001), random.NextInt64(1, 1_000_001));

    private static void AssertSame(Rational actual, BigInteger numerator, BigInteger denominator)
    {
        Assert.True(actual.Denominator > 0);
        Assert.Equal(numerator * actual.Denominator, actual.Numerator * denominator);
    }
}
