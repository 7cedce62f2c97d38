using System.Globalization;
using System.Numerics;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// An exact fraction of arbitrary-size integers, reduced, with a positive denominator. Used where exact linear
/// algebra on compositions could outgrow 64-bit <see cref="Rational"/> intermediates (elimination multiplies
/// denominators together).
/// </summary>
internal readonly struct BigFraction : IEquatable<BigFraction>, IComparable<BigFraction>
{
    private readonly BigInteger _denominatorMinusOne;

    public BigFraction(BigInteger numerator, BigInteger denominator)
    {
        if (denominator.IsZero)
        {
            throw new DivideByZeroException("BigFraction with a zero denominator.");
        }

        if (denominator.Sign < 0)
        {
            numerator = -numerator;
            denominator = -denominator;
        }

        BigInteger gcd = BigInteger.GreatestCommonDivisor(numerator, denominator);
        if (!gcd.IsOne && !gcd.IsZero)
        {
            numerator /= gcd;
            denominator /= gcd;
        }

        Numerator = numerator.IsZero ? BigInteger.Zero : numerator;
        _denominatorMinusOne = numerator.IsZero ? BigInteger.Zero : denominator - 1;
    }

    public static BigFraction Zero => default;

    public static BigFraction One => new(BigInteger.One, BigInteger.One);

    public BigInteger Numerator { get; }

    public BigInteger Denominator => _denominatorMinusOne + 1;

    public bool IsZero => Numerator.IsZero;

    public int Sign => Numerator.Sign;

    public static BigFraction FromRational(Rational value) => new(value.Numerator, value.Denominator);

    public static implicit operator BigFraction(long value) => new(value, BigInteger.One);

    public static BigFraction operator -(BigFraction value) => new(-value.Numerator, value.Denominator);

    public static BigFraction operator +(BigFraction a, BigFraction b) =>
        new(a.Numerator * b.Denominator + b.Numerator * a.Denominator, a.Denominator * b.Denominator);

    public static BigFraction operator -(BigFraction a, BigFraction b) =>
        new(a.Numerator * b.Denominator - b.Numerator * a.Denominator, a.Denominator * b.Denominator);

    public static BigFraction operator *(BigFraction a, BigFraction b) =>
        new(a.Numerator * b.Numerator, a.Denominator * b.Denominator);

    public static BigFraction operator /(BigFraction a, BigFraction b)
    {
        if (b.IsZero)
        {
            throw new DivideByZeroException("BigFraction division by zero.");
        }

        return new BigFraction(a.Numerator * b.Denominator, a.Denominator * b.Numerator);
    }

    public static bool operator ==(BigFraction a, BigFraction b) => a.Equals(b);

    public static bool operator !=(BigFraction a, BigFraction b) => !a.Equals(b);

    public static bool operator <(BigFraction a, BigFraction b) => a.CompareTo(b) < 0;

    public static bool operator >(BigFraction a, BigFraction b) => a.CompareTo(b) > 0;

    public int CompareTo(BigFraction other) =>
        (Numerator * other.Denominator).CompareTo(other.Numerator * Denominator);

    public bool Equals(BigFraction other) => Numerator == other.Numerator && Denominator == other.Denominator;

    public override bool Equals(object? obj) => obj is BigFraction other && Equals(other);

    public override int GetHashCode() => HashCode.Combine(Numerator, Denominator);

    /// <summary>The nearest double, also for numerators and denominators beyond the double range.</summary>
    public double ToDouble()
    {
        BigInteger numerator = Numerator;
        BigInteger denominator = Denominator;
        // Shift both down together so each converts without overflow; 1000 bits leaves double headroom.
        long excess = Math.Max(BigInteger.Abs(numerator).GetBitLength(), denominator.GetBitLength()) - 1000;
        if (excess > 0)
        {
            numerator >>= (int)excess;
            denominator >>= (int)excess;
            if (denominator.IsZero)
            {
                return numerator.Sign * double.PositiveInfinity;
            }
        }

        return (double)numerator / (double)denominator;
    }

    /// <summary>The value as a 64-bit <see cref="Rational"/>, or false when it does not fit.</summary>
    public bool TryToRational(out Rational value)
    {
        if (BigInteger.Abs(Numerator) > long.MaxValue || Denominator > long.MaxValue)
        {
            value = Rational.Zero;
            return false;
        }

        value = new Rational((long)Numerator, (long)Denominator);
        return true;
    }

    public override string ToString() =>
        Denominator.IsOne
            ? Numerator.ToString(CultureInfo.InvariantCulture)
            : Numerator.ToString(CultureInfo.InvariantCulture) + "/" + Denominator.ToString(CultureInfo.InvariantCulture);
}
