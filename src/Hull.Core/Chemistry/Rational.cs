using System.Diagnostics.CodeAnalysis;
using System.Globalization;
using System.Numerics;

namespace Hull.Core.Chemistry;

/// <summary>
/// An exact fraction Numerator/Denominator of 64-bit integers, always reduced, with Denominator &gt; 0.
/// Arithmetic is exact; a result that does not fit in 64 bits throws <see cref="OverflowException"/>
/// instead of wrapping or rounding, so composition arithmetic never silently loses exactness.
/// </summary>
/// <remarks>
/// The numerator is kept within [-long.MaxValue, long.MaxValue] so that negation and absolute value
/// can never overflow. <c>default(Rational)</c> is zero.
/// </remarks>
public readonly struct Rational : IEquatable<Rational>, IComparable<Rational>
{
    private readonly long _numerator;

    // Zero in the default struct stands for denominator 1, so default(Rational) is a valid zero.
    private readonly long _denominatorMinusOne;

    /// <summary>Zero (0/1).</summary>
    public static Rational Zero => default;

    /// <summary>One (1/1).</summary>
    public static Rational One => new(1, 1, reduced: true);

    /// <summary>Creates numerator/denominator reduced to lowest terms with a positive denominator.</summary>
    /// <exception cref="DivideByZeroException">When <paramref name="denominator"/> is zero.</exception>
    /// <exception cref="OverflowException">When the reduced value does not fit (e.g. long.MinValue/1).</exception>
    public Rational(long numerator, long denominator)
    {
        if (denominator == 0)
        {
            throw new DivideByZeroException($"Rational {numerator}/0 has a zero denominator.");
        }

        this = FromInt128(numerator, denominator, () => $"{numerator}/{denominator}");
    }

    private Rational(long numerator, long denominator, bool reduced)
    {
        _ = reduced;
        _numerator = numerator;
        _denominatorMinusOne = denominator - 1;
    }

    /// <summary>The numerator; carries the sign.</summary>
    public long Numerator => _numerator;

    /// <summary>The denominator; always positive and coprime with the numerator.</summary>
    public long Denominator => _denominatorMinusOne + 1;

    /// <summary>True when the value is zero.</summary>
    public bool IsZero => _numerator == 0;

    /// <summary>True when the value is a whole number.</summary>
    public bool IsInteger => Denominator == 1;

    /// <summary>-1, 0 or 1.</summary>
    public int Sign => Math.Sign(_numerator);

    /// <summary>The integer <paramref name="value"/> as a rational.</summary>
    public static Rational FromInteger(long value)
    {
        if (value == long.MinValue)
        {
            throw new OverflowException("Rational overflow: long.MinValue has no exact negation and is not supported.");
        }

        return new Rational(value, 1, reduced: true);
    }

    public static implicit operator Rational(long value) => FromInteger(value);

    public static explicit operator double(Rational value) => value.ToDouble();

    /// <summary>The nearest double (numerator and denominator each converted, then divided).</summary>
    public double ToDouble() => (double)_numerator / Denominator;

    /// <summary>|this|.</summary>
    public Rational Abs() => _numerator < 0 ? new Rational(-_numerator, Denominator, reduced: true) : this;

    /// <summary>1/this.</summary>
    /// <exception cref="DivideByZeroException">When this is zero.</exception>
    public Rational Reciprocal()
    {
        if (_numerator == 0)
        {
            throw new DivideByZeroException("Rational division by zero: the reciprocal of 0 is undefined.");
        }

        return _numerator > 0
            ? new Rational(Denominator, _numerator, reduced: true)
            : new Rational(-Denominator, -_numerator, reduced: true);
    }

    public static Rational operator -(Rational value) => new(-value._numerator, value.Denominator, reduced: true);

    public static Rational operator +(Rational left, Rational right)
    {
        Int128 numerator = (Int128)left._numerator * right.Denominator + (Int128)right._numerator * left.Denominator;
        Int128 denominator = (Int128)left.Denominator * right.Denominator;
        return FromInt128(numerator, denominator, () => $"{left} + {right}");
    }

    public static Rational operator -(Rational left, Rational right)
    {
        Int128 numerator = (Int128)left._numerator * right.Denominator - (Int128)right._numerator * left.Denominator;
        Int128 denominator = (Int128)left.Denominator * right.Denominator;
        return FromInt128(numerator, denominator, () => $"{left} - {right}");
    }

    public static Rational operator *(Rational left, Rational right)
    {
        Int128 numerator = (Int128)left._numerator * right._numerator;
        Int128 denominator = (Int128)left.Denominator * right.Denominator;
        return FromInt128(numerator, denominator, () => $"{left} * {right}");
    }

    public static Rational operator /(Rational left, Rational right)
    {
        if (right._numerator == 0)
        {
            throw new DivideByZeroException($"Rational division by zero: {left} / 0.");
        }

        Int128 numerator = (Int128)left._numerator * right.Denominator;
        Int128 denominator = (Int128)left.Denominator * right._numerator;
        return FromInt128(numerator, denominator, () => $"{left} / {right}");
    }

    public static bool operator ==(Rational left, Rational right) => left.Equals(right);

    public static bool operator !=(Rational left, Rational right) => !left.Equals(right);

    public static bool operator <(Rational left, Rational right) => left.CompareTo(right) < 0;

    public static bool operator >(Rational left, Rational right) => left.CompareTo(right) > 0;

    public static bool operator <=(Rational left, Rational right) => left.CompareTo(right) <= 0;

    public static bool operator >=(Rational left, Rational right) => left.CompareTo(right) >= 0;

    /// <summary>The smaller of two values.</summary>
    public static Rational Min(Rational a, Rational b) => a <= b ? a : b;

    /// <summary>The larger of two values.</summary>
    public static Rational Max(Rational a, Rational b) => a >= b ? a : b;

    /// <inheritdoc />
    public int CompareTo(Rational other)
    {
        // Cross products of two 64-bit values always fit in 128 bits, so the comparison is exact.
        Int128 left = (Int128)_numerator * other.Denominator;
        Int128 right = (Int128)other._numerator * Denominator;
        return left.CompareTo(right);
    }

    /// <inheritdoc />
    public bool Equals(Rational other) =>
        _numerator == other._numerator && _denominatorMinusOne == other._denominatorMinusOne;

    /// <inheritdoc />
    public override bool Equals(object? obj) => obj is Rational other && Equals(other);

    /// <inheritdoc />
    public override int GetHashCode() => HashCode.Combine(_numerator, Denominator);

    /// <summary>"3", "-2", "1/4" (invariant culture).</summary>
    public override string ToString() =>
        IsInteger
            ? _numerator.ToString(CultureInfo.InvariantCulture)
            : string.Create(CultureInfo.InvariantCulture, $"{_numerator}/{Denominator}");

    /// <summary>
    /// The exact decimal form ("0.25", "-1.5", "3") when the value has a terminating decimal expansion
    /// with at most <paramref name="maxFractionDigits"/> digits after the point; otherwise false.
    /// </summary>
    public bool TryFormatExactDecimal(int maxFractionDigits, [NotNullWhen(true)] out string? text)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(maxFractionDigits);
        long denominator = Denominator;
        int twos = 0;
        int fives = 0;
        while (denominator % 2 == 0)
        {
            denominator /= 2;
            twos++;
        }

        while (denominator % 5 == 0)
        {
            denominator /= 5;
            fives++;
        }

        int digits = Math.Max(twos, fives);
        if (denominator != 1 || digits > maxFractionDigits)
        {
            text = null;
            return false;
        }

        // value = numerator * (10^digits / Denominator) / 10^digits, with the scale an exact integer.
        BigInteger scaled = BigInteger.Abs(_numerator) * (BigInteger.Pow(10, digits) / Denominator);
        string all = scaled.ToString(CultureInfo.InvariantCulture).PadLeft(digits + 1, '0');
        string body = digits == 0 ? all : all[..^digits] + "." + all[^digits..];
        text = _numerator < 0 ? "-" + body : body;
        return true;
    }

    /// <summary>
    /// Parses an integer ("3", "-3"), a decimal ("0.25", "-1.5"; exact: "0.333" is 333/1000) or a fraction
    /// ("1/3", "-2/7"). Surrounding white space is ignored; nothing else is accepted (no exponent, no
    /// thousands separators, no leading '+').
    /// </summary>
    /// <exception cref="FormatException">When the text is not one of these forms, or the denominator is zero.</exception>
    /// <exception cref="OverflowException">When the value does not fit in 64-bit numerator/denominator.</exception>
    public static Rational Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        ParseCore(text.Trim(), text, throwOnError: true, out Rational value);
        return value;
    }

    /// <summary>Like <see cref="Parse"/> but returns false instead of throwing.</summary>
    public static bool TryParse([NotNullWhen(true)] string? text, out Rational value)
    {
        if (text is null)
        {
            value = Zero;
            return false;
        }

        return ParseCore(text.Trim(), text, throwOnError: false, out value);
    }

    /// <summary>
    /// Parses an exact decimal "[-]digits[.digits]" (e.g. "0.333" = 333/1000, "12" = 12). Trailing zeros after
    /// the point are allowed in any number, since they do not change the value.
    /// </summary>
    /// <exception cref="FormatException">When the text is not a plain decimal number.</exception>
    /// <exception cref="OverflowException">When the reduced value does not fit.</exception>
    public static Rational FromDecimalString(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        if (!TryParseDecimal(text.AsSpan(), out Rational value, out bool overflow))
        {
            if (overflow)
            {
                throw new OverflowException($"Rational overflow: '{text}' does not fit in a 64-bit fraction.");
            }

            throw new FormatException($"'{text}' is not a decimal number (expected digits with an optional '-' and '.').");
        }

        return value;
    }

    private static bool ParseCore(string trimmed, string original, bool throwOnError, out Rational value)
    {
        int slash = trimmed.IndexOf('/', StringComparison.Ordinal);
        bool overflow;
        bool ok;
        if (slash < 0)
        {
            ok = TryParseDecimal(trimmed.AsSpan(), out value, out overflow);
        }
        else
        {
            ok = TryParseFraction(trimmed.AsSpan(0, slash), trimmed.AsSpan(slash + 1), out value, out overflow, out bool zeroDenominator);
            if (!ok && zeroDenominator)
            {
                if (throwOnError)
                {
                    throw new FormatException($"'{original}' is not a rational number: its denominator is zero.");
                }

                return false;
            }
        }

        if (ok || !throwOnError)
        {
            return ok;
        }

        if (overflow)
        {
            throw new OverflowException($"Rational overflow: '{original}' does not fit in a 64-bit fraction.");
        }

        throw new FormatException(
            $"'{original}' is not a rational number (expected an integer '3', a decimal '0.25' or a fraction '1/3').");
    }

    private static bool TryParseFraction(
        ReadOnlySpan<char> numeratorText,
        ReadOnlySpan<char> denominatorText,
        out Rational value,
        out bool overflow,
        out bool zeroDenominator)
    {
        value = Zero;
        overflow = false;
        zeroDenominator = false;
        bool negative = numeratorText.Length > 0 && numeratorText[0] == '-';
        ReadOnlySpan<char> numeratorDigits = negative ? numeratorText[1..] : numeratorText;
        if (!IsDigits(numeratorDigits) || !IsDigits(denominatorText))
        {
            return false;
        }

        BigInteger numerator = BigInteger.Parse(numeratorDigits, NumberStyles.None, CultureInfo.InvariantCulture);
        BigInteger denominator = BigInteger.Parse(denominatorText, NumberStyles.None, CultureInfo.InvariantCulture);
        if (denominator.IsZero)
        {
            zeroDenominator = true;
            return false;
        }

        return TryFromBig(negative ? -numerator : numerator, denominator, out value, out overflow);
    }

    private static bool TryParseDecimal(ReadOnlySpan<char> text, out Rational value, out bool overflow)
    {
        value = Zero;
        overflow = false;
        bool negative = text.Length > 0 && text[0] == '-';
        ReadOnlySpan<char> body = negative ? text[1..] : text;
        int point = body.IndexOf('.');
        ReadOnlySpan<char> integerPart = point < 0 ? body : body[..point];
        ReadOnlySpan<char> fractionPart = point < 0 ? ReadOnlySpan<char>.Empty : body[(point + 1)..];
        if (!IsDigits(integerPart) || (point >= 0 && !IsDigits(fractionPart)))
        {
            return false;
        }

        // Trailing zeros after the point change nothing; dropping them keeps the power of ten small.
        fractionPart = fractionPart.TrimEnd('0');
        BigInteger numerator = BigInteger.Parse(
            string.Concat(integerPart, fractionPart), NumberStyles.None, CultureInfo.InvariantCulture);
        BigInteger denominator = BigInteger.Pow(10, fractionPart.Length);
        return TryFromBig(negative ? -numerator : numerator, denominator, out value, out overflow);
    }

    private static bool IsDigits(ReadOnlySpan<char> text)
    {
        if (text.IsEmpty)
        {
            return false;
        }

        foreach (char c in text)
        {
            if (c is < '0' or > '9')
            {
                return false;
            }
        }

        return true;
    }

    private static bool TryFromBig(BigInteger numerator, BigInteger denominator, out Rational value, out bool overflow)
    {
        BigInteger gcd = BigInteger.GreatestCommonDivisor(numerator, denominator);
        if (!gcd.IsZero && !gcd.IsOne)
        {
            numerator /= gcd;
            denominator /= gcd;
        }

        if (BigInteger.Abs(numerator) > long.MaxValue || denominator > long.MaxValue)
        {
            value = Zero;
            overflow = true;
            return false;
        }

        value = new Rational((long)numerator, (long)denominator, reduced: true);
        overflow = false;
        return true;
    }

    private static Rational FromInt128(Int128 numerator, Int128 denominator, Func<string> describe)
    {
        if (denominator < 0)
        {
            numerator = -numerator;
            denominator = -denominator;
        }

        Int128 gcd = Gcd(Int128.Abs(numerator), denominator);
        if (gcd > 1)
        {
            numerator /= gcd;
            denominator /= gcd;
        }

        if (numerator > long.MaxValue || numerator < -long.MaxValue || denominator > long.MaxValue)
        {
            throw new OverflowException(
                $"Rational overflow: the exact result of {describe()} does not fit in a 64-bit numerator and denominator.");
        }

        return new Rational((long)numerator, (long)denominator, reduced: true);
    }

    private static Int128 Gcd(Int128 a, Int128 b)
    {
        while (b != 0)
        {
            (a, b) = (b, a % b);
        }

        return a;
    }

    /// <summary>Greatest common divisor of |a| and |b| (gcd(0, 0) = 0).</summary>
    internal static long Gcd(long a, long b)
    {
        a = Math.Abs(a);
        b = Math.Abs(b);
        while (b != 0)
        {
            (a, b) = (b, a % b);
        }

        return a;
    }
}
