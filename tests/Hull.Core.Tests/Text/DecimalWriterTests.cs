using System.Globalization;
using Hull.Core.Text;

namespace Hull.Core.Tests.Text;

/// <summary>The round-trip writer against the .NET runtime's "R" text (the shortest text that reads back): the same string.</summary>
public class DecimalWriterTests
{
    private static void AssertSameAsRuntime(double x)
    {
        string expected = x.ToString("R", CultureInfo.InvariantCulture);
        Assert.Equal(expected, DecimalWriter.ToText(x));
    }

    [Theory]
    [InlineData(0.0)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    [InlineData(double.MaxValue)]
    [InlineData(double.MinValue)]
    [InlineData(double.Epsilon)]
    [InlineData(2.2250738585072014e-308)]
    [InlineData(0.1)]
    [InlineData(0.30000000000000004)]
    [InlineData(1.0 / 3)]
    [InlineData(-2.8943589743589726)]
    [InlineData(1.0)]
    [InlineData(0.5)]
    [InlineData(0.125)]
    [InlineData(1e-4)]
    [InlineData(9.99999999999999e-5)]
    [InlineData(1e-5)]
    [InlineData(1.5e-5)]
    [InlineData(1e14)]
    [InlineData(999999999999999.9)]
    [InlineData(1e15)]
    [InlineData(123456789012345.67)]
    [InlineData(9007199254740993.0)]
    [InlineData(0.000123456789012345678)]
    public void Edge_cases_write_as_the_runtime_writes_them(double x) => AssertSameAsRuntime(x);

    [Fact]
    public void Two_million_random_doubles_write_as_the_runtime_writes_them_and_read_back()
    {
        var random = new Random(20261205);
        Span<byte> bytes = stackalloc byte[8];
        for (int i = 0; i < 2_000_000; i++)
        {
            double x;
            switch (i % 4)
            {
                case 0:
                    random.NextBytes(bytes);
                    x = BitConverter.ToDouble(bytes);
                    break;
                case 1:
                    // Every exponent of the fixed-point range and a little beyond it.
                    x = (random.NextDouble() * 2 - 1) * Math.Pow(10, random.Next(-6, 17));
                    break;
                case 2:
                    // Short decimals (their doubles have short round-trip text) and their neighbours.
                    x = Math.Round(random.NextDouble() * 100 - 50, random.Next(0, 8));
                    if (random.Next(2) == 0) x = random.Next(2) == 0 ? Math.BitIncrement(x) : Math.BitDecrement(x);
                    break;
                default:
                    // The window program's own output: potentials of a few eV from sums of products.
                    x = -3 * random.NextDouble() * (1 + random.NextDouble() / 7);
                    break;
            }

            string text = DecimalWriter.ToText(x);
            Assert.Equal(x.ToString("R", CultureInfo.InvariantCulture), text);
            if (!double.IsNaN(x)) Assert.Equal(BitConverter.DoubleToInt64Bits(x), BitConverter.DoubleToInt64Bits(double.Parse(text, CultureInfo.InvariantCulture)));
        }
    }

    [Fact]
    public void Negative_zero_keeps_its_sign() => Assert.Equal("-0", DecimalWriter.ToText(-0.0));

    [Fact]
    public void Too_little_room_is_refused_naming_what_is_needed()
    {
        var e = Assert.Throws<ArgumentException>(() => DecimalWriter.Write(1.5, new char[8]));
        Assert.Contains("32 characters", e.Message);
    }
}
