using System.Numerics;
using Hull.Core.Text;

namespace Hull.Core.Tests.Text;

/// <summary>
/// The decimal reader's table of powers of ten, every entry recomputed with exact integer arithmetic: the 128 bits
/// of 10^e from the top set bit down, rounded down.
/// </summary>
public sealed class PowersOfTen128Tests
{
    [Fact]
    public void Every_entry_is_the_power_of_ten_truncated_to_128_bits()
    {
        ReadOnlySpan<ulong> table = PowersOfTen128.Mantissas;
        int count = PowersOfTen128.LargestExponent - PowersOfTen128.SmallestExponent + 1;
        Assert.Equal(2 * count, table.Length);
        for (int e = PowersOfTen128.SmallestExponent; e <= PowersOfTen128.LargestExponent; e++)
        {
            BigInteger expected;
            if (e >= 0)
            {
                BigInteger v = BigInteger.Pow(10, e);
                long bits = (long)v.GetBitLength();
                expected = bits <= 128 ? v << (int)(128 - bits) : v >> (int)(bits - 128);
            }
            else
            {
                // 2^k / 10^-e rounded down, with k the one exponent that leaves exactly 128 bits.
                BigInteger d = BigInteger.Pow(10, -e);
                int k = 127 + (int)d.GetBitLength();
                expected = (BigInteger.One << k) / d;
                while (expected.GetBitLength() > 128) expected = (BigInteger.One << --k) / d;
                while (expected.GetBitLength() < 128) expected = (BigInteger.One << ++k) / d;
            }
            int i = 2 * (e - PowersOfTen128.SmallestExponent);
            BigInteger actual = (new BigInteger(table[i]) << 64) | new BigInteger(table[i + 1]);
            Assert.True(expected == actual, $"10^{e}: table {actual:X} against {expected:X}");
        }
    }
}
