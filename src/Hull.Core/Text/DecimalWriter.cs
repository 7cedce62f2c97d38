using System.Globalization;

namespace Hull.Core.Text;

/// <summary>
/// Writes a double as the runtime's round-trip text (<c>ToString("R", CultureInfo.InvariantCulture)</c>: the shortest
/// decimal that reads back to the same double, the nearest such when several have that length), with a short path
/// for the fixed-point range 1e-4 ≤ |x| &lt; 1e15: the 15, 16 and 17 significant digits correctly rounded in exact
/// 128-bit integer arithmetic, the first that reads back (through <see cref="DecimalReader"/>) written. Other values,
/// and a mantissa that is a power of two (its lower neighbour is closer, so a nearest-digits candidate may miss a
/// shorter one), go to the runtime's formatter.
/// </summary>
public static class DecimalWriter
{
    /// <summary>Enough for any double's round-trip text.</summary>
    public const int MaxLength = 32;

    /// <summary>Appends the round-trip text of <paramref name="value"/> at <paramref name="destination"/>; the number of characters written.</summary>
    /// <exception cref="ArgumentException">Fewer than <see cref="MaxLength"/> characters of room.</exception>
    public static int Write(double value, Span<char> destination)
    {
        if (destination.Length < MaxLength) throw new ArgumentException($"need {MaxLength} characters of room, got {destination.Length}", nameof(destination));
        int written = TryWriteShort(value, destination);
        if (written > 0) return written;
        if (!value.TryFormat(destination, out written, "R", CultureInfo.InvariantCulture)) throw new InvalidOperationException("a double's round-trip text did not fit in 32 characters");
        return written;
    }

    /// <summary>The round-trip text as a string.</summary>
    public static string ToText(double value)
    {
        Span<char> buffer = stackalloc char[MaxLength];
        return new string(buffer[..Write(value, buffer)]);
    }

    private static ReadOnlySpan<ulong> Pow10 =>
    [
        1, 10, 100, 1_000, 10_000, 100_000, 1_000_000, 10_000_000, 100_000_000, 1_000_000_000, 10_000_000_000,
        100_000_000_000, 1_000_000_000_000, 10_000_000_000_000, 100_000_000_000_000, 1_000_000_000_000_000,
        10_000_000_000_000_000, 100_000_000_000_000_000, 1_000_000_000_000_000_000, 10_000_000_000_000_000_000,
    ];

    private static UInt128 Power(int e) => e < Pow10.Length ? Pow10[e] : (UInt128)Pow10[e - 19] * Pow10[19];

    /// <summary>Characters written, or 0 when the value is left to the runtime.</summary>
    private static int TryWriteShort(double value, Span<char> destination)
    {
        ulong bits = BitConverter.DoubleToUInt64Bits(value);
        bool negative = (long)bits < 0;
        int biased = (int)((bits >> 52) & 0x7FF);
        ulong fraction = bits & 0x000F_FFFF_FFFF_FFFF;
        if (biased == 0 || biased == 0x7FF || fraction == 0) return 0;
        ulong m = fraction | 1UL << 52;
        int e2 = biased - 1075;   // value = m·2^e2
        // 2^(e2+52) ≤ |value| < 2^(e2+53), so ⌊log10 |value|⌋ is this or one more (78913/2^18 ≈ log10 2, from below).
        int p = ((e2 + 52) * 78913) >> 18;
        if (p < -5 || p > 14 || e2 >= 0) return 0;
        int shift = -e2;
        for (int n = 15; n <= 17; n++)
        {
            int s = n - 1 - p;
            // Exact: m < 2^53 and 10^s ≤ 10^22 < 2^74, so the product stays below 2^127.
            UInt128 scaled = (UInt128)m * Power(s);
            UInt128 whole = scaled >> shift;
            if (whole >= Pow10[n])
            {
                // ⌊log10 |value|⌋ was one more: the same digit count again at the next exponent.
                if (++p > 14) return 0;
                n--;
                continue;
            }

            UInt128 rest = scaled - (whole << shift);
            UInt128 half = UInt128.One << (shift - 1);
            ulong digits = (ulong)whole;
            if (rest > half || (rest == half && (digits & 1) == 1)) digits++;
            int exponent = -s;
            if (digits == Pow10[n])
            {
                digits = Pow10[n - 1];
                exponent++;
            }

            if (!DecimalReader.TryCompose(digits, exponent, out double back)) return 0;
            if (back != Math.Abs(value)) continue;
            int leading = exponent + n - 1;   // ⌊log10⌋ of what is written
            if (leading < -4 || leading > 14) return 0;
            return Place(negative, digits, n, leading, destination);
        }

        return 0;
    }

    /// <summary>Fixed-point text of digits·10^(leading − count + 1), trailing zeros dropped.</summary>
    private static int Place(bool negative, ulong digits, int count, int leading, Span<char> destination)
    {
        while (digits % 10 == 0)
        {
            digits /= 10;
            count--;
        }

        Span<char> text = stackalloc char[20];
        for (int i = count - 1; i >= 0; i--)
        {
            text[i] = (char)('0' + (int)(digits % 10));
            digits /= 10;
        }

        int at = 0;
        if (negative) destination[at++] = '-';
        if (leading < 0)
        {
            destination[at++] = '0';
            destination[at++] = '.';
            for (int z = 0; z < -leading - 1; z++) destination[at++] = '0';
            text[..count].CopyTo(destination[at..]);
            return at + count;
        }

        int integerDigits = leading + 1;
        if (count <= integerDigits)
        {
            text[..count].CopyTo(destination[at..]);
            at += count;
            for (int z = count; z < integerDigits; z++) destination[at++] = '0';
            return at;
        }

        text[..integerDigits].CopyTo(destination[at..]);
        at += integerDigits;
        destination[at++] = '.';
        text[integerDigits..count].CopyTo(destination[at..]);
        return at + count - integerDigits;
    }
}
