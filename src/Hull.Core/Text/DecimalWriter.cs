using System.Globalization;

namespace Hull.Core.Text;

/// <summary>
/// Writes a double as the runtime's round-trip text (<c>ToString("R", CultureInfo.InvariantCulture)</c>: the shortest
/// decimal that reads back to the same double, the nearest such when several have that length), with a short path
/// for the fixed-point range 1e-4 ≤ |x| &lt; 1e15: the 15, 16 and 17 significant digits correctly rounded in exact
/// 128-bit integer arithmetic, the first that reads back (by an exact test against half a unit in the last place)
/// written. Other values,
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

    /// <summary>m·10^s exactly, for m &lt; 2^53 and 0 ≤ s ≤ 21 (below 2^124).</summary>
    private static UInt128 Scale(ulong m, int s)
    {
        // Past 10^19 the power leaves 64 bits; m·10^(s−19) still fits them (m·100 &lt; 2^60).
        if (s > 19) return Product(m * Pow10[s - 19], Pow10[19]);
        return Product(m, Pow10[s]);
    }

    private static UInt128 Product(ulong a, ulong b)
    {
        ulong high = Math.BigMul(a, b, out ulong low);
        return new UInt128(high, low);
    }

    /// <summary>Characters written, or 0 when the value is left to the runtime.</summary>
    private static int TryWriteShort(double value, Span<char> destination)
    {
        ulong bits = BitConverter.DoubleToUInt64Bits(value);
        bool negative = (long)bits < 0;
        int biased = (int)((bits >> 52) & 0x7FF);
        ulong fraction = bits & 0x000F_FFFF_FFFF_FFFF;
        if (biased == 0 || biased == 0x7FF || fraction == 0) return 0;
        ulong m = fraction | 1UL << 52;
        int e2 = biased - 1075;   // |value| = m / 2^shift
        // 2^(e2+52) ≤ |value| < 2^(e2+53), so p = ⌊log10 |value|⌋ is this or one more (78913/2^18 ≈ log10 2, from below).
        int p = ((e2 + 52) * 78913) >> 18;
        if (p < -5 || p > 14 || e2 >= 0) return 0;
        int shift = -e2;
        // 17 significant digits: |value|·10^s = scaled / 2^shift, its whole part below 10^17.
        int s = 16 - p;
        UInt128 scaled = Scale(m, s);
        UInt128 whole = scaled >> shift;
        if (whole >= Pow10[17])
        {
            if (++p > 14) return 0;
            s--;
            scaled = Scale(m, s);
            whole = scaled >> shift;
        }

        UInt128 rest = scaled - (whole << shift);
        ulong w = (ulong)whole;
        bool exact = rest == UInt128.Zero;
        // A candidate C (in units of 10^-s) reads back as the value exactly when it lies within half a unit in the
        // last place of it: |C − scaled/2^shift| < 10^s/2^(shift+1), the boundary too when m is even (ties go to
        // even). C·2^(shift+1) < 2^127 and 2·scaled < 2^125, so the test is exact in 128 bits.
        UInt128 halfUlp = Power(s);
        UInt128 twice = scaled << 1;
        bool ReadsBack(ulong candidate)
        {
            UInt128 c = (UInt128)candidate << (shift + 1);
            UInt128 distance = c > twice ? c - twice : twice - c;
            return distance < halfUlp || (distance == halfUlp && (m & 1) == 0);
        }

        // 15, then 16 significant digits, each correctly rounded from the exact value; else the 17, which always read back.
        for (int drop = 2; drop >= 1; drop--)
        {
            ulong unit = Pow10[drop];
            ulong q = w / unit, r = w - q * unit, middle = unit / 2;
            if (r > middle || (r == middle && (!exact || (q & 1) == 1))) q++;
            if (ReadsBack(q * unit)) return Place(negative, q, 17 - drop, p, destination);
        }

        UInt128 half = UInt128.One << (shift - 1);
        if (rest > half || (rest == half && (w & 1) == 1)) w++;
        return Place(negative, w, 17, p, destination);
    }

    /// <summary>
    /// Fixed-point text of the <paramref name="count"/>-digit <paramref name="digits"/> with the first digit at 10^leading
    /// (digits = 10^count means the next power of ten), trailing zeros dropped; 0 when that is outside the fixed range.
    /// </summary>
    private static int Place(bool negative, ulong digits, int count, int leading, Span<char> destination)
    {
        if (digits == Pow10[count])
        {
            digits = 1;
            count = 1;
            leading++;
        }

        if (leading < -4 || leading > 14) return 0;
        while (digits % 10 == 0)
        {
            digits /= 10;
            count--;
        }

        int start = negative ? 1 : 0;
        if (negative) destination[0] = '-';
        int length;
        if (leading < 0)
        {
            // 0.000ddd: the digits follow the point and −leading−1 zeros.
            int first = start + 1 - leading;
            destination[start] = '0';
            destination[start + 1] = '.';
            for (int z = start + 2; z < first; z++) destination[z] = '0';
            length = first + count;
            for (int i = length - 1; i >= first; i--, digits /= 10) destination[i] = (char)('0' + (int)(digits % 10));
            return length;
        }

        if (count <= leading + 1)
        {
            // A whole number: the digits, then zeros up to the units.
            length = start + leading + 1;
            for (int z = start + count; z < length; z++) destination[z] = '0';
            for (int i = start + count - 1; i >= start; i--, digits /= 10) destination[i] = (char)('0' + (int)(digits % 10));
            return length;
        }

        int point = start + leading + 1;
        length = start + count + 1;
        for (int i = length - 1; i > point; i--, digits /= 10) destination[i] = (char)('0' + (int)(digits % 10));
        destination[point] = '.';
        for (int i = point - 1; i >= start; i--, digits /= 10) destination[i] = (char)('0' + (int)(digits % 10));
        return length;
    }
}
