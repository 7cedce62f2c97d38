using System.Globalization;
using Hull.Core.Text;

namespace Hull.Core.Tests.Text;

/// <summary>
/// The short decimal reader against the .NET runtime's own reader (double.TryParse with NumberStyles.Float, invariant
/// culture, correctly rounded since .NET Core 3.0): the same success and the same bits on every input.
/// </summary>
public class DecimalReaderTests
{
    private static void AssertSameAsRuntime(string text)
    {
        bool expectedOk = double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double expected);
        bool ok = DecimalReader.TryParse(text, out double actual);
        Assert.True(expectedOk == ok, $"'{text}': runtime {(expectedOk ? "reads" : "refuses")} it, ours {(ok ? "reads" : "refuses")} it");
        if (ok) Assert.True(BitConverter.DoubleToInt64Bits(expected) == BitConverter.DoubleToInt64Bits(actual), $"'{text}': runtime {expected:R}, ours {actual:R}");
    }

    [Theory]
    [InlineData("0")]
    [InlineData("-0")]
    [InlineData("0.0")]
    [InlineData("-0.000")]
    [InlineData(".5")]
    [InlineData("5.")]
    [InlineData(".")]
    [InlineData("-")]
    [InlineData("")]
    [InlineData("+1")]
    [InlineData(" 1")]
    [InlineData("1 ")]
    [InlineData("e5")]
    [InlineData("1e")]
    [InlineData("1e+")]
    [InlineData("1e-")]
    [InlineData("1E+05")]
    [InlineData("1e-05")]
    [InlineData("NaN")]
    [InlineData("Infinity")]
    [InlineData("-Infinity")]
    [InlineData("0x10")]
    [InlineData("1,000")]
    [InlineData("1.2.3")]
    [InlineData("1e308")]
    [InlineData("1.7976931348623157e308")]
    [InlineData("1.7976931348623158e308")]
    [InlineData("1.7976931348623159e308")]
    [InlineData("1e309")]
    [InlineData("4.9e-324")]
    [InlineData("2.4703282292062327e-324")]
    [InlineData("2.2250738585072011e-308")]
    [InlineData("2.2250738585072014e-308")]
    [InlineData("1e-400")]
    [InlineData("1e400")]
    [InlineData("1e99999999999")]
    [InlineData("9007199254740992")]
    [InlineData("9007199254740993")]
    [InlineData("9007199254740995")]
    [InlineData("18446744073709551615")]
    [InlineData("1844674407370955161")]
    [InlineData("1e23")]
    [InlineData("8.5e-5")]
    [InlineData("0.1")]
    [InlineData("0.30000000000000004")]
    [InlineData("-2.8943589743589726")]
    [InlineData("123456789012345678901234567890")]
    [InlineData("0.000000000000000000000000000001234567890123456789")]
    [InlineData("7.2057594037927933e16")]
    [InlineData("1448997445238699")]
    [InlineData("9.5e-5")]
    [InlineData("00000000000000000000000000000001.5")]
    public void Edge_cases_read_as_the_runtime_reads_them(string text) => AssertSameAsRuntime(text);

    [Fact]
    public void Round_trip_text_of_two_million_random_doubles_reads_back_bit_for_bit()
    {
        var random = new Random(20261204);
        Span<byte> bytes = stackalloc byte[8];
        for (int i = 0; i < 2_000_000; i++)
        {
            double x;
            if (i % 2 == 0)
            {
                // Any bit pattern: every exponent, subnormals, NaN and infinities included.
                random.NextBytes(bytes);
                x = BitConverter.ToDouble(bytes);
            }
            else
            {
                // The window files' own range: formation energies and potentials of a few eV, atom fractions.
                x = (random.NextDouble() - 0.8) * Math.Pow(10, random.Next(-3, 3));
            }

            string text = x.ToString("R", CultureInfo.InvariantCulture);
            Assert.True(DecimalReader.TryParse(text, out double back), text);
            if (!double.IsNaN(x)) Assert.True(BitConverter.DoubleToInt64Bits(x) == BitConverter.DoubleToInt64Bits(back), $"'{text}' read as {back:R}");
            if (i % 4 == 1)
            {
                // Other spellings of the same value: 17 and 15 significant digits, exponent notation.
                AssertSameAsRuntime(x.ToString("G17", CultureInfo.InvariantCulture));
                AssertSameAsRuntime(x.ToString("G15", CultureInfo.InvariantCulture));
                AssertSameAsRuntime(x.ToString("E18", CultureInfo.InvariantCulture));
            }
        }
    }

    [Fact]
    public void Random_decimal_strings_read_as_the_runtime_reads_them()
    {
        // Digit strings of 1-24 digits with a point anywhere and exponents across the whole range, halfway and
        // near-halfway cases among them by chance; the long ones go to the runtime's reader.
        var random = new Random(15);
        var text = new System.Text.StringBuilder();
        for (int i = 0; i < 400_000; i++)
        {
            text.Clear();
            if (random.Next(2) == 0) text.Append('-');
            int count = random.Next(1, 25);
            int point = random.Next(-1, count + 1);
            for (int k = 0; k < count; k++)
            {
                if (k == point) text.Append('.');
                text.Append((char)('0' + random.Next(10)));
            }

            if (random.Next(3) > 0) text.Append(random.Next(2) == 0 ? 'e' : 'E').Append(random.Next(-340, 320).ToString(CultureInfo.InvariantCulture));
            AssertSameAsRuntime(text.ToString());
        }
    }
}
