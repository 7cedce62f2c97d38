using System.Buffers.Binary;
using System.Globalization;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Numerics;

namespace Hull.Core.Text;

/// <summary>
/// Reads a decimal number as the nearest double, bit for bit what
/// <c>double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out _)</c> gives, with a short path for
/// plain decimals of up to 19 significant digits (round-trip output is 17): exact when the significand and the power
/// of ten are both exact doubles (one correctly rounded operation), else the Eisel–Lemire method (a 64-bit
/// significand times a 128-bit power of ten, with the tests that prove the rounding). Anything else — more digits,
/// white space, a leading '+', NaN, subnormal or overflowing results, a rounding the method cannot decide — goes to
/// the runtime's reader, so the answer never differs from it.
/// </summary>
public static class DecimalReader
{
    /// <summary>Parses <paramref name="text"/> as the runtime does with <see cref="NumberStyles.Float"/>, invariant culture.</summary>
    public static bool TryParse(ReadOnlySpan<char> text, out double value)
    {
        if (TryParseShort(text, out value)) return true;
        return double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }

    /// <summary>The same for UTF-8 text (a file read as bytes needs no decoding first).</summary>
    public static bool TryParse(ReadOnlySpan<byte> utf8Text, out double value)
    {
        if (TryParseShort(utf8Text, out value)) return true;
        return double.TryParse(utf8Text, NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }

    /// <summary>[-]digits[.digits][(e|E)[+|-]digits] with at most 19 significant digits, else false.</summary>
    private static bool TryParseShort<TChar>(ReadOnlySpan<TChar> s, out double value)
        where TChar : unmanaged, IBinaryInteger<TChar>
    {
        value = 0;
        int i = 0, n = s.Length;
        bool negative = false;
        if (i < n && At(s, i) == '-')
        {
            negative = true;
            i++;
        }

        // Every digit goes into the significand (it wraps past 19 digits, which are then counted and refused).
        ulong significand = 0;
        int start = i;
        for (; i < n; i++)
        {
            uint d = At(s, i) - '0';
            if (d > 9) break;
            significand = significand * 10 + d;
        }

        int digits = i - start, exponent = 0;
        if (i < n && At(s, i) == '.')
        {
            int fraction = ++i;
            while (TryEightDigits(s, i, out uint eight))
            {
                significand = significand * 100_000_000 + eight;
                i += 8;
            }

            for (; i < n; i++)
            {
                uint d = At(s, i) - '0';
                if (d > 9) break;
                significand = significand * 10 + d;
            }

            exponent = fraction - i;
            digits += i - fraction;
        }

        bool anyDigit = digits > 0;
        if (digits > 19)
        {
            // Leading zeros do not count: the significant digits start at the first non-zero one.
            int significant = digits;
            for (int k = start; k < i && (At(s, k) == '0' || At(s, k) == '.'); k++) if (At(s, k) == '0') significant--;
            if (significant > 19) return false;
        }

        if (!anyDigit) return false;
        if (i < n && (At(s, i) | 0x20) == 'e')
        {
            i++;
            bool negativeExponent = false;
            if (i < n && (At(s, i) == '-' || At(s, i) == '+'))
            {
                negativeExponent = At(s, i) == '-';
                i++;
            }

            int first = i, written = 0;
            for (; i < n; i++)
            {
                uint d = At(s, i) - '0';
                if (d > 9) break;
                // Beyond this the result is 0 or infinite anyway; the runtime decides those.
                if (written > 10_000) return false;
                written = written * 10 + (int)d;
            }

            if (i == first) return false;
            exponent += negativeExponent ? -written : written;
        }

        if (i != n) return false;
        if (!TryCompose(significand, exponent, out value)) return false;
        if (negative) value = -value;
        return true;
    }

    /// <summary>
    /// Eight ASCII digits at <paramref name="i"/> of UTF-8 text as their value, tested and converted a word at a time
    /// (a digit is 0x30–0x39: its high nibble 3, and adding 6 leaves it below 0x40); false for UTF-16 text.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool TryEightDigits<TChar>(ReadOnlySpan<TChar> s, int i, out uint value)
        where TChar : unmanaged, IBinaryInteger<TChar>
    {
        value = 0;
        if (typeof(TChar) != typeof(byte) || i + 8 > s.Length) return false;
        ulong word = BinaryPrimitives.ReadUInt64LittleEndian(MemoryMarshal.AsBytes(s.Slice(i, 8)));
        if (((word & 0xF0F0_F0F0_F0F0_F0F0) | (((word + 0x0606_0606_0606_0606) & 0xF0F0_F0F0_F0F0_F0F0) >> 4)) != 0x3333_3333_3333_3333) return false;
        word -= 0x3030_3030_3030_3030;
        // Pairs, then quadruples, then all eight, by multiply-and-shift (the first digit is the lowest byte).
        word = word * 10 + (word >> 8);
        word = ((word & 0x0000_00FF_0000_00FF) * (100 + (1_000_000UL << 32)) + ((word >> 16) & 0x0000_00FF_0000_00FF) * (1 + (10_000UL << 32))) >> 32;
        value = (uint)word;
        return true;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static uint At<TChar>(ReadOnlySpan<TChar> s, int i)
        where TChar : unmanaged, IBinaryInteger<TChar> => uint.CreateTruncating(s[i]);

    /// <summary>The double nearest to significand·10^exponent when it can be decided here; ±0 is the caller's sign.</summary>
    internal static bool TryCompose(ulong significand, int exponent, out double value)
    {
        if (significand == 0)
        {
            value = 0;
            return true;
        }

        // Both operands exact: IEEE division or multiplication rounds once, correctly.
        if (significand <= 1UL << 53 && exponent >= -22 && exponent <= 22)
        {
            double w = significand;
            value = exponent < 0 ? w / ExactPowers[-exponent] : w * ExactPowers[exponent];
            return true;
        }

        return TryEiselLemire(significand, exponent, out value);
    }

    private static ReadOnlySpan<double> ExactPowers =>
    [
        1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19,
        1e20, 1e21, 1e22,
    ];

    /// <summary>
    /// The Eisel–Lemire step for a normal double result: false when the 128-bit product leaves the rounding
    /// undecided (a near-halfway case), or the result is subnormal or infinite.
    /// </summary>
    private static bool TryEiselLemire(ulong significand, int exponent, out double value)
    {
        value = 0;
        if (exponent < PowersOfTen128.SmallestExponent || exponent > PowersOfTen128.LargestExponent) return false;
        int leadingZeros = System.Numerics.BitOperations.LeadingZeroCount(significand);
        ulong w = significand << leadingZeros;
        // ⌊exponent·log2 10⌋ + 64 + bias − leading zeros: the biased exponent before the 54-bit shift below.
        ulong biased = (ulong)(((217706 * exponent) >> 16) + 64 + 1023) - (ulong)leadingZeros;
        int at = 2 * (exponent - PowersOfTen128.SmallestExponent);
        ReadOnlySpan<ulong> table = PowersOfTen128.Mantissas;
        ulong high = Math.BigMul(w, table[at], out ulong low);
        // The truncated power is below the true one by less than one unit of its low half: when the bits below the
        // 54 kept ones are all ones, that error could carry into them, so take the low half of the power in too.
        if ((high & 0x1FF) == 0x1FF && low + w < w)
        {
            ulong carryHigh = Math.BigMul(w, table[at + 1], out ulong carryLow);
            ulong mergedLow = low + carryHigh;
            ulong mergedHigh = mergedLow < low ? high + 1 : high;
            if ((mergedHigh & 0x1FF) == 0x1FF && mergedLow + 1 == 0 && carryLow + w < w) return false;
            high = mergedHigh;
            low = mergedLow;
        }

        ulong top = high >> 63;
        ulong mantissa = high >> (int)(top + 9);
        biased -= 1 ^ top;
        // Exactly halfway between two doubles as far as the product shows: the truncated digits decide.
        if (low == 0 && (high & 0x1FF) == 0 && (mantissa & 3) == 1) return false;
        mantissa += mantissa & 1;
        mantissa >>= 1;
        if (mantissa >> 53 > 0)
        {
            mantissa >>= 1;
            biased++;
        }

        // Zero (subnormal) or 0x7FF and above (infinite): the runtime's reader.
        if (biased - 1 >= 0x7FF - 1) return false;
        value = BitConverter.UInt64BitsToDouble(biased << 52 | (mantissa & 0x000F_FFFF_FFFF_FFFF));
        return true;
    }
}
