using System.Diagnostics.CodeAnalysis;
using System.Numerics;

namespace Hull.Core.Chemistry;

/// <summary>
/// Reads chemical formulas into exact <see cref="Composition"/>s.
/// </summary>
/// <remarks>
/// Accepted text:
/// <list type="bullet">
/// <item>element symbols, case-sensitive ("Co" is cobalt, "CO" carbon + oxygen, "co" is an error);</item>
/// <item>amounts after an element or a closing bracket: whole ("2"), decimal ("0.5", exact) or fraction ("1/3");</item>
/// <item>groups in round or square brackets, nested ("Mg3(Si2O5)2(OH)2", "K4[Fe(CN)6]");</item>
/// <item>adducts such as hydrates joined by '·' (U+00B7), '•' (U+2022) or '*', each part after the first with an
///   optional leading multiplier ("CuSO4·5H2O", "CaSO4*0.5H2O");</item>
/// <item>white space between any two tokens (not inside a symbol or a number).</item>
/// </list>
/// Everything else is a <see cref="FormulaParseException"/> with the 0-based position of the problem.
/// The same element may appear several times; its amounts add up ("HOH" is H2O).
/// </remarks>
public static class FormulaParser
{
    /// <summary>
    /// Deepest bracket nesting accepted. Real formulas nest two or three levels; the bound keeps the
    /// recursive reader from exhausting the stack on hostile input.
    /// </summary>
    public const int MaxGroupDepth = 32;

    /// <summary>Characters that join the parts of an adduct or hydrate.</summary>
    public static IReadOnlyList<char> AdductSeparators { get; } = ['\u00B7', '\u2022', '*'];

    /// <summary>Parses <paramref name="text"/>.</summary>
    /// <exception cref="ArgumentNullException">When <paramref name="text"/> is null.</exception>
    /// <exception cref="FormulaParseException">When the text is not a formula; says what and where.</exception>
    public static Composition Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var reader = new Reader(text);
        return Composition.FromValidatedAmounts(reader.ReadFormula(), reader.WrittenOrder);
    }

    /// <summary>Parses <paramref name="text"/>; false with the error when it is not a formula (or null).</summary>
    public static bool TryParse(
        [NotNullWhen(true)] string? text,
        [NotNullWhen(true)] out Composition? composition,
        [NotNullWhen(false)] out FormulaParseException? error)
    {
        if (text is null)
        {
            composition = null;
            error = new FormulaParseException(string.Empty, 0, "empty formula (null)");
            return false;
        }

        try
        {
            composition = Parse(text);
            error = null;
            return true;
        }
        catch (FormulaParseException e)
        {
            composition = null;
            error = e;
            return false;
        }
    }

    private static bool IsSeparator(char c) => c is '\u00B7' or '\u2022' or '*';

    private static bool IsUpper(char c) => c is >= 'A' and <= 'Z';

    private static bool IsLower(char c) => c is >= 'a' and <= 'z';

    private static bool IsDigit(char c) => c is >= '0' and <= '9';

    private static bool IsNumberChar(char c) => IsDigit(c) || c is '.' or '/';

    private static char CloserOf(char opener) => opener == '(' ? ')' : ']';

    /// <summary>One pass over one text; positions are 0-based indices into it.</summary>
    private sealed class Reader(string text)
    {
        private int _pos;
        private readonly List<string> _writtenOrder = [];

        /// <summary>The element symbols in the order they first appear in the text.</summary>
        public IReadOnlyList<string> WrittenOrder => _writtenOrder;

        private bool AtEnd => _pos >= text.Length;

        private char Current => text[_pos];

        public Dictionary<string, Rational> ReadFormula()
        {
            SkipWhiteSpace();
            if (AtEnd)
            {
                throw Error(0, "empty formula");
            }

            Dictionary<string, Rational> total = ReadSequence(depth: 0, openerPosition: -1);
            while (true)
            {
                SkipWhiteSpace();
                if (AtEnd)
                {
                    return total;
                }

                // ReadSequence at depth 0 only stops at the end or at a separator.
                char separator = Current;
                _pos++;
                SkipWhiteSpace();
                Rational multiplier = Rational.One;
                int multiplierPosition = _pos;
                if (!AtEnd && IsDigit(Current))
                {
                    multiplier = ReadAmount();
                    SkipWhiteSpace();
                }

                if (AtEnd || !(IsUpper(Current) || Current is '(' or '[' || IsLower(Current)))
                {
                    string after = multiplierPosition == _pos
                        ? $"'{separator}'"
                        : $"the multiplier '{text[multiplierPosition.._pos].TrimEnd()}'";
                    if (!AtEnd && !IsSeparator(Current))
                    {
                        // Let the sequence reader name the bad token (negative amount, stray bracket, ...).
                        _ = ReadSequence(depth: 0, openerPosition: -1);
                    }

                    throw Error(_pos, $"expected an element or a bracket after {after}");
                }

                int partPosition = _pos;
                Dictionary<string, Rational> part = ReadSequence(depth: 0, openerPosition: -1);
                AddScaled(total, part, multiplier, partPosition);
            }
        }

        /// <summary>
        /// Reads elements and groups until the end, an adduct separator (depth 0) or the closing bracket of the
        /// group opened at <paramref name="openerPosition"/> (consumed).
        /// </summary>
        private Dictionary<string, Rational> ReadSequence(int depth, int openerPosition)
        {
            var amounts = new Dictionary<string, Rational>(StringComparer.Ordinal);
            char? expectedCloser = openerPosition < 0 ? null : CloserOf(text[openerPosition]);
            int items = 0;
            while (true)
            {
                SkipWhiteSpace();
                if (AtEnd)
                {
                    if (expectedCloser is not null)
                    {
                        throw Error(openerPosition, $"'{text[openerPosition]}' is never closed");
                    }

                    break;
                }

                char c = Current;
                int start = _pos;
                if (IsUpper(c))
                {
                    _pos++;
                    while (!AtEnd && IsLower(Current))
                    {
                        _pos++;
                    }

                    string symbol = text[start.._pos];
                    if (!ElementTable.IsSymbol(symbol))
                    {
                        throw Error(start, $"unknown element '{symbol}'");
                    }

                    Rational amount = ReadOptionalAmount();
                    Add(amounts, symbol, amount, start);
                    if (!_writtenOrder.Contains(symbol)) _writtenOrder.Add(symbol);
                }
                else if (c is '(' or '[')
                {
                    if (depth + 1 > MaxGroupDepth)
                    {
                        throw Error(start, $"brackets nested deeper than {MaxGroupDepth} levels");
                    }

                    _pos++;
                    Dictionary<string, Rational> group = ReadSequence(depth + 1, start);
                    Rational amount = ReadOptionalAmount();
                    AddScaled(amounts, group, amount, start);
                }
                else if (c is ')' or ']')
                {
                    if (expectedCloser is null)
                    {
                        throw Error(start, $"'{c}' has no matching opening bracket");
                    }

                    if (c != expectedCloser)
                    {
                        throw Error(
                            start,
                            $"'{c}' does not match '{text[openerPosition]}' opened at character {openerPosition + 1}");
                    }

                    if (items == 0)
                    {
                        throw Error(openerPosition, $"empty group '{text[openerPosition]}{c}'");
                    }

                    _pos++;
                    return amounts;
                }
                else if (IsSeparator(c))
                {
                    if (expectedCloser is not null)
                    {
                        throw Error(
                            start,
                            $"'{c}' inside brackets ('{text[openerPosition]}' opened at character {openerPosition + 1} is not closed)");
                    }

                    if (items == 0)
                    {
                        throw Error(start, $"expected an element or a bracket before '{c}'");
                    }

                    break;
                }
                else if (IsLower(c))
                {
                    while (!AtEnd && IsLower(Current))
                    {
                        _pos++;
                    }

                    throw Error(start, $"element symbols start with a capital letter, found '{text[start.._pos]}'");
                }
                else if (IsDigit(c))
                {
                    string number = PeekNumberToken();
                    throw Error(
                        start,
                        $"unexpected number '{number}' (an amount must follow an element or a closing bracket)");
                }
                else if (c == '-' && _pos + 1 < text.Length && IsDigit(text[_pos + 1]))
                {
                    _pos++;
                    throw Error(start, $"negative amount '-{PeekNumberToken()}' (amounts must be positive)");
                }
                else if (c == '.' && _pos + 1 < text.Length && IsDigit(text[_pos + 1]))
                {
                    throw Error(start, $"malformed amount '{PeekNumberToken()}' (write a digit before the point, e.g. '0.5')");
                }
                else
                {
                    throw Error(start, $"unexpected character '{c}'");
                }

                items++;
            }

            if (items == 0)
            {
                throw Error(_pos, "expected an element or a bracket");
            }

            return amounts;
        }

        private Rational ReadOptionalAmount()
        {
            SkipWhiteSpace();
            return !AtEnd && IsDigit(Current) ? ReadAmount() : Rational.One;
        }

        /// <summary>Reads "digits", "digits.digits" or "digits/digits" starting at a digit; positive, exact.</summary>
        private Rational ReadAmount()
        {
            int start = _pos;
            string token = PeekNumberToken();
            _pos += token.Length;
            int point = token.IndexOf('.', StringComparison.Ordinal);
            int slash = token.IndexOf('/', StringComparison.Ordinal);
            bool wellFormed;
            if (slash >= 0)
            {
                if (point >= 0)
                {
                    throw Error(start, $"malformed amount '{token}' (a fraction takes whole numbers, e.g. '1/3')");
                }

                wellFormed = slash > 0 && slash < token.Length - 1 && token.IndexOf('/', slash + 1) < 0;
            }
            else
            {
                wellFormed = point < 0 || (point < token.Length - 1 && token.IndexOf('.', point + 1) < 0);
            }

            if (!wellFormed)
            {
                throw Error(start, $"malformed amount '{token}'");
            }

            // "LiCo02" is almost always a mistyped letter O; no one writes an amount with a leading zero on purpose.
            if (token.Length > 1 && token[0] == '0' && IsDigit(token[1]))
            {
                throw Error(start, $"amount '{token}' has a leading zero (if the letter O was meant, type O, not 0)");
            }

            Rational value;
            try
            {
                if (slash >= 0)
                {
                    BigInteger denominator = BigInteger.Parse(token.AsSpan(slash + 1));
                    if (denominator.IsZero)
                    {
                        throw Error(start, $"amount '{token}' has a zero denominator");
                    }

                    value = Rational.Parse(token);
                }
                else
                {
                    value = Rational.FromDecimalString(token);
                }
            }
            catch (OverflowException)
            {
                throw Error(start, $"amount '{token}' is too large for exact 64-bit arithmetic");
            }

            if (value.IsZero)
            {
                throw Error(start, $"amount '{token}' is zero (amounts must be positive)");
            }

            return value;
        }

        private string PeekNumberToken()
        {
            int end = _pos;
            while (end < text.Length && IsNumberChar(text[end]))
            {
                end++;
            }

            return text[_pos..end];
        }

        private void SkipWhiteSpace()
        {
            while (!AtEnd && char.IsWhiteSpace(Current))
            {
                _pos++;
            }
        }

        private void Add(Dictionary<string, Rational> amounts, string symbol, Rational amount, int position)
        {
            try
            {
                amounts[symbol] = amounts.TryGetValue(symbol, out Rational existing) ? existing + amount : amount;
            }
            catch (OverflowException)
            {
                throw Error(position, $"the amount of {symbol} is too large for exact 64-bit arithmetic");
            }
        }

        private void AddScaled(
            Dictionary<string, Rational> target, Dictionary<string, Rational> part, Rational multiplier, int position)
        {
            foreach ((string symbol, Rational amount) in part)
            {
                Rational scaled;
                try
                {
                    scaled = amount * multiplier;
                }
                catch (OverflowException)
                {
                    throw Error(position, $"the amount of {symbol} is too large for exact 64-bit arithmetic");
                }

                Add(target, symbol, scaled, position);
            }
        }

        private FormulaParseException Error(int position, string problem) => new(text, position, problem);
    }
}
