using System.Collections.Immutable;
using System.Diagnostics.CodeAnalysis;
using System.Numerics;

namespace Hull.Core.Chemistry;

/// <summary>
/// An exact amount of each element in one formula unit, e.g. Li2CO3 = {C: 1, Li: 2, O: 3}.
/// Immutable; at least one element; every stored amount is a positive <see cref="Rational"/>.
/// </summary>
/// <remarks>
/// Equality is by exact amounts: Li2O2 and LiO are different compositions with the same
/// <see cref="Reduced"/> form (see <see cref="HasSameProportions"/>). A parsed composition also remembers the order
/// in which its elements were written, for display only (<see cref="Formula"/>: LiCoO2 stays LiCoO2); it takes no
/// part in equality.
/// </remarks>
public sealed class Composition : IEquatable<Composition>
{
    private readonly ImmutableSortedDictionary<string, Rational> _amounts;
    private readonly string[] _elements;
    private readonly IReadOnlyList<string> _elementsView;
    private readonly int _hashCode;
    // The elements in the order written (parsed compositions and those derived from them), or null: Hill order.
    private readonly string[]? _writtenOrder;
    private Reduction? _reduction;
    private string? _formula;
    private string? _hillFormula;

    private Composition(ImmutableSortedDictionary<string, Rational> amounts, string[]? writtenOrder = null)
    {
        _amounts = amounts;
        _writtenOrder = writtenOrder;
        _elements = [.. amounts.Keys];
        _elementsView = Array.AsReadOnly(_elements);
        Rational atoms = Rational.Zero;
        var hash = new HashCode();
        foreach ((string symbol, Rational amount) in amounts)
        {
            atoms += amount;
            hash.Add(symbol, StringComparer.Ordinal);
            hash.Add(amount);
        }

        AtomsPerFormulaUnit = atoms;
        _hashCode = hash.ToHashCode();
    }

    /// <summary>
    /// Element symbols in ordinal order (<see cref="string.CompareOrdinal(string, string)"/>): the canonical
    /// component order.
    /// </summary>
    public IReadOnlyList<string> Elements => _elementsView;

    /// <summary>Amount of each element per formula unit, enumerated in ordinal symbol order.</summary>
    public IReadOnlyDictionary<string, Rational> Amounts => _amounts;

    /// <summary>Total number of atoms in one formula unit (sum of the amounts).</summary>
    public Rational AtomsPerFormulaUnit { get; }

    /// <summary>True when the composition has exactly one element.</summary>
    public bool IsSingleElement => _elements.Length == 1;

    /// <summary>Elements joined by '-' in ordinal order, e.g. "Fe-O" or "Co-Li-O".</summary>
    public string ChemicalSystem => string.Join('-', _elements);

    /// <summary>
    /// The smallest whole-number formula with the same proportions (Li2O2 → LiO, Li0.5CoO2 → LiCo2O4):
    /// every amount is a whole number and their greatest common divisor is 1.
    /// </summary>
    /// <exception cref="OverflowException">When the whole-number amounts do not fit in 64 bits.</exception>
    public Composition Reduced => GetReduction().Reduced;

    /// <summary>The factor with this = <see cref="Reduced"/> scaled by it (Li2O2: 2; Li0.5CoO2: 1/2).</summary>
    public Rational ReductionFactor => GetReduction().Factor;

    /// <summary>
    /// The formula text, elements in the order they were written when the composition was parsed (brackets and
    /// adducts flattened: Ca(OH)2 → CaO2H2, CuSO4·5H2O → CuSO9H10), otherwise in <see cref="HillFormula"/>'s order.
    /// An amount of 1 is left out; whole amounts are written as integers; other amounts as exact decimals when they
    /// need at most <see cref="MaxDecimalPlacesInFormula"/> places ("0.5", "0.125"), otherwise as fractions ("1/3").
    /// <see cref="Parse"/> reads it back to an equal composition.
    /// </summary>
    public string Formula => _formula ??= FormatFormula(_writtenOrder ?? HillOrder());

    /// <summary>
    /// The formula in Hill order, the order of formula indexes: carbon first and hydrogen second when carbon is
    /// present, every other element in alphabetical symbol order (without carbon, all elements alphabetically, H
    /// included). Equal compositions have equal Hill formulas, whatever order they were written in.
    /// </summary>
    public string HillFormula => _hillFormula ??= FormatFormula(HillOrder());

    /// <summary>The formula of <see cref="Reduced"/>.</summary>
    public string ReducedFormula => Reduced.Formula;

    /// <summary>
    /// Longest exact decimal written in <see cref="Formula"/>. Site fractions in practice have one to four
    /// decimal places (0.5, 0.25, 0.125, 0.0625); beyond six places a fraction ("1/1024") reads better.
    /// </summary>
    public const int MaxDecimalPlacesInFormula = 6;

    /// <summary>Parses a formula; see <see cref="FormulaParser"/> for the accepted text.</summary>
    /// <exception cref="FormulaParseException">When the text is not a formula; says what and where.</exception>
    public static Composition Parse(string formula) => FormulaParser.Parse(formula);

    /// <summary>Parses a formula; false with the error (what and where) when it is not one.</summary>
    public static bool TryParse(
        [NotNullWhen(true)] string? formula,
        [NotNullWhen(true)] out Composition? composition,
        [NotNullWhen(false)] out FormulaParseException? error) =>
        FormulaParser.TryParse(formula, out composition, out error);

    /// <summary>Parses a formula; false when it is not one.</summary>
    public static bool TryParse([NotNullWhen(true)] string? formula, [NotNullWhen(true)] out Composition? composition) =>
        FormulaParser.TryParse(formula, out composition, out _);

    /// <summary>
    /// Builds a composition from (symbol, amount) pairs.
    /// </summary>
    /// <exception cref="ArgumentException">
    /// When a symbol is not an element (case-sensitive), appears twice, an amount is not positive, or there are
    /// no pairs; the message names the symbol.
    /// </exception>
    public static Composition FromAmounts(IEnumerable<KeyValuePair<string, Rational>> amounts)
    {
        ArgumentNullException.ThrowIfNull(amounts);
        var builder = ImmutableSortedDictionary.CreateBuilder<string, Rational>(StringComparer.Ordinal);
        foreach ((string symbol, Rational amount) in amounts)
        {
            if (!ElementTable.IsSymbol(symbol))
            {
                throw new ArgumentException($"'{symbol}' is not an element symbol (symbols are case-sensitive, e.g. 'Co').", nameof(amounts));
            }

            if (amount.Sign <= 0)
            {
                throw new ArgumentException($"The amount of {symbol} is {amount}; amounts must be positive.", nameof(amounts));
            }

            if (!builder.TryAdd(symbol, amount))
            {
                throw new ArgumentException($"Element {symbol} is given more than once.", nameof(amounts));
            }
        }

        if (builder.Count == 0)
        {
            throw new ArgumentException("A composition needs at least one element.", nameof(amounts));
        }

        return new Composition(builder.ToImmutable());
    }

    /// <summary>Builds a composition from (symbol, amount) pairs; same rules as the other overload.</summary>
    public static Composition FromAmounts(params (string Symbol, Rational Amount)[] amounts)
    {
        ArgumentNullException.ThrowIfNull(amounts);
        return FromAmounts(amounts.Select(pair => KeyValuePair.Create(pair.Symbol, pair.Amount)));
    }

    /// <summary>One atom of a single element, e.g. "Fe".</summary>
    /// <exception cref="ArgumentException">When the symbol is not an element.</exception>
    public static Composition OfElement(string symbol) => FromAmounts((symbol, Rational.One));

    /// <summary>Used by the parser, which has already checked symbols and signs.</summary>
    internal static Composition FromValidatedAmounts(Dictionary<string, Rational> amounts, IReadOnlyList<string> writtenOrder) =>
        new(amounts.ToImmutableSortedDictionary(StringComparer.Ordinal), [.. writtenOrder]);

    /// <summary>The amount of <paramref name="symbol"/> per formula unit; zero when absent.</summary>
    /// <exception cref="ArgumentException">When <paramref name="symbol"/> is not an element symbol.</exception>
    public Rational AmountOf(string symbol)
    {
        RequireSymbol(symbol);
        return _amounts.TryGetValue(symbol, out Rational amount) ? amount : Rational.Zero;
    }

    /// <summary>True when <paramref name="symbol"/> is present (with a positive amount).</summary>
    public bool Contains(string symbol) => _amounts.ContainsKey(symbol);

    /// <summary>Exact fraction of the atoms that are <paramref name="symbol"/>; zero when absent.</summary>
    /// <exception cref="ArgumentException">When <paramref name="symbol"/> is not an element symbol.</exception>
    public Rational AtomicFractionExact(string symbol) => AmountOf(symbol) / AtomsPerFormulaUnit;

    /// <summary>Fraction of the atoms that are <paramref name="symbol"/>, as a double; zero when absent.</summary>
    /// <exception cref="ArgumentException">When <paramref name="symbol"/> is not an element symbol.</exception>
    public double AtomicFraction(string symbol) => AtomicFractionExact(symbol).ToDouble();

    /// <summary>The same proportions scaled to one atom in total (amounts become atomic fractions).</summary>
    public Composition PerAtom() => Scale(AtomsPerFormulaUnit.Reciprocal());

    /// <summary>Every amount multiplied by <paramref name="factor"/> (&gt; 0).</summary>
    /// <exception cref="ArgumentOutOfRangeException">When the factor is zero or negative.</exception>
    /// <exception cref="OverflowException">When a scaled amount does not fit.</exception>
    public Composition Scale(Rational factor)
    {
        if (factor.Sign <= 0)
        {
            throw new ArgumentOutOfRangeException(nameof(factor), factor, $"A composition can only be scaled by a positive factor, not {factor}.");
        }

        if (factor == Rational.One)
        {
            return this;
        }

        var builder = ImmutableSortedDictionary.CreateBuilder<string, Rational>(StringComparer.Ordinal);
        foreach ((string symbol, Rational amount) in _amounts)
        {
            builder.Add(symbol, amount * factor);
        }

        return new Composition(builder.ToImmutable(), _writtenOrder);
    }

    /// <summary>True when both have the same element proportions (equal <see cref="Reduced"/> forms).</summary>
    public bool HasSameProportions(Composition other)
    {
        ArgumentNullException.ThrowIfNull(other);
        return Reduced.Equals(other.Reduced);
    }

    /// <summary>
    /// Molar mass of one formula unit from the conventional standard atomic weights in <see cref="ElementTable"/>.
    /// </summary>
    /// <exception cref="InvalidOperationException">When an element has no standard atomic weight; names it.</exception>
    public double MolarMassGramsPerMole
    {
        get
        {
            double total = 0;
            foreach ((string symbol, Rational amount) in _amounts)
            {
                Element element = ElementTable.BySymbol(symbol);
                if (element.StandardAtomicWeight is not double weight)
                {
                    throw new InvalidOperationException(
                        $"{element.Name} ({symbol}) has no standard atomic weight, so {Formula} has no molar mass.");
                }

                total += amount.ToDouble() * weight;
            }

            return total;
        }
    }

    /// <summary>Element-wise sum of two compositions.</summary>
    public static Composition operator +(Composition left, Composition right)
    {
        ArgumentNullException.ThrowIfNull(left);
        ArgumentNullException.ThrowIfNull(right);
        var builder = left._amounts.ToBuilder();
        foreach ((string symbol, Rational amount) in right._amounts)
        {
            builder[symbol] = builder.TryGetValue(symbol, out Rational existing) ? existing + amount : amount;
        }

        // Written order survives when either side has one: the left's elements first, then the right's new ones.
        string[]? order = left._writtenOrder is null && right._writtenOrder is null
            ? null
            : [.. left.DisplayOrder().Concat(right.DisplayOrder()).Distinct(StringComparer.Ordinal)];
        return new Composition(builder.ToImmutable(), order);
    }

    public static bool operator ==(Composition? left, Composition? right) =>
        left is null ? right is null : left.Equals(right);

    public static bool operator !=(Composition? left, Composition? right) => !(left == right);

    /// <inheritdoc />
    public bool Equals(Composition? other)
    {
        if (other is null)
        {
            return false;
        }

        if (ReferenceEquals(this, other))
        {
            return true;
        }

        if (_hashCode != other._hashCode || _elements.Length != other._elements.Length)
        {
            return false;
        }

        foreach ((string symbol, Rational amount) in _amounts)
        {
            if (!other._amounts.TryGetValue(symbol, out Rational otherAmount) || otherAmount != amount)
            {
                return false;
            }
        }

        return true;
    }

    /// <inheritdoc />
    public override bool Equals(object? obj) => Equals(obj as Composition);

    /// <inheritdoc />
    public override int GetHashCode() => _hashCode;

    /// <summary>The <see cref="Formula"/>.</summary>
    public override string ToString() => Formula;

    private static void RequireSymbol(string symbol)
    {
        if (!ElementTable.IsSymbol(symbol))
        {
            throw new ArgumentException($"'{symbol}' is not an element symbol (symbols are case-sensitive, e.g. 'Co').", nameof(symbol));
        }
    }

    private Reduction GetReduction()
    {
        Reduction? known = Volatile.Read(ref _reduction);
        if (known is not null)
        {
            return known;
        }

        // amounts p_i/q_i: multiply by L = lcm(q_i) to get integers n_i, then divide by g = gcd(n_i).
        // Reduced amounts are n_i/g and this = Reduced * (g/L). BigInteger keeps the intermediate steps exact.
        BigInteger lcm = BigInteger.One;
        foreach (Rational amount in _amounts.Values)
        {
            lcm = lcm / BigInteger.GreatestCommonDivisor(lcm, amount.Denominator) * amount.Denominator;
        }

        var scaled = new List<(string Symbol, BigInteger Whole)>(_elements.Length);
        BigInteger gcd = BigInteger.Zero;
        foreach ((string symbol, Rational amount) in _amounts)
        {
            BigInteger whole = amount.Numerator * (lcm / amount.Denominator);
            scaled.Add((symbol, whole));
            gcd = BigInteger.GreatestCommonDivisor(gcd, whole);
        }

        var builder = ImmutableSortedDictionary.CreateBuilder<string, Rational>(StringComparer.Ordinal);
        foreach ((string symbol, BigInteger whole) in scaled)
        {
            BigInteger reducedAmount = whole / gcd;
            if (reducedAmount > long.MaxValue)
            {
                throw new OverflowException(
                    $"The whole-number form of {Formula} needs an amount of {symbol} ({reducedAmount}) beyond 64 bits.");
            }

            builder.Add(symbol, Rational.FromInteger((long)reducedAmount));
        }

        // g/L is in lowest terms only after dividing by gcd(g, L).
        BigInteger common = BigInteger.GreatestCommonDivisor(gcd, lcm);
        BigInteger factorNumerator = gcd / common;
        BigInteger factorDenominator = lcm / common;
        if (factorNumerator > long.MaxValue || factorDenominator > long.MaxValue)
        {
            throw new OverflowException($"The reduction factor of {Formula} does not fit in a 64-bit fraction.");
        }

        Composition reduced = new(builder.ToImmutable(), _writtenOrder);
        Reduction result;
        if (reduced.Equals(this))
        {
            result = new Reduction(this, Rational.One);
        }
        else
        {
            reduced._reduction = new Reduction(reduced, Rational.One);
            result = new Reduction(reduced, new Rational((long)factorNumerator, (long)factorDenominator));
        }

        // One reference holds both parts, so a reader on another thread never sees half of the result.
        Volatile.Write(ref _reduction, result);
        return result;
    }

    private string FormatFormula(IEnumerable<string> order)
    {
        var text = new System.Text.StringBuilder();
        foreach (string symbol in order)
        {
            text.Append(symbol);
            text.Append(FormatAmount(_amounts[symbol]));
        }

        return text.ToString();
    }

    private IEnumerable<string> DisplayOrder() => _writtenOrder ?? HillOrder();

    private IEnumerable<string> HillOrder()
    {
        if (!_amounts.ContainsKey("C"))
        {
            return _elements;
        }

        IEnumerable<string> leading = _amounts.ContainsKey("H") ? ["C", "H"] : ["C"];
        return leading.Concat(_elements.Where(symbol => symbol is not "C" and not "H"));
    }

    private static string FormatAmount(Rational amount)
    {
        if (amount == Rational.One)
        {
            return string.Empty;
        }

        return amount.TryFormatExactDecimal(MaxDecimalPlacesInFormula, out string? text) ? text : amount.ToString();
    }

    /// <summary>The whole-number form and the factor back to this composition, computed once.</summary>
    private sealed record Reduction(Composition Reduced, Rational Factor);
}
