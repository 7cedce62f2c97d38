using System.Text;

namespace Hull.Core.Figures;

/// <summary>
/// A formula as SVG text with real subscripts (the amounts after each element or closing bracket), and an estimate
/// of its drawn width for label placement.
/// </summary>
internal static class FormulaText
{
    /// <summary>Subscripts are drawn at this fraction of the font size (common practice for chemical formulas).</summary>
    public const double SubscriptScale = 0.72;

    /// <summary>Subscripts sit this fraction of the font size below the baseline.</summary>
    public const double SubscriptDrop = 0.28;

    /// <summary>
    /// Average advance of a character of the sans-serif fonts we name, as a fraction of the font size; a little
    /// generous, so that estimated boxes contain the drawn text.
    /// </summary>
    public const double CharacterWidth = 0.62;

    /// <summary>The parts of a formula: (text, is subscript).</summary>
    public static IReadOnlyList<(string Text, bool Subscript)> Split(string formula)
    {
        var parts = new List<(string, bool)>();
        var current = new StringBuilder();
        bool inSubscript = false;
        char previous = '\0';
        foreach (char c in formula)
        {
            bool amount = (char.IsAsciiDigit(c) || (c == '.' && inSubscript)) && (inSubscript || char.IsAsciiLetter(previous) || previous == ')' || previous == ']');
            if (amount != inSubscript && current.Length > 0)
            {
                parts.Add((current.ToString(), inSubscript));
                current.Clear();
            }

            inSubscript = amount;
            current.Append(c);
            previous = c;
        }

        if (current.Length > 0) parts.Add((current.ToString(), inSubscript));
        return parts;
    }

    /// <summary>Estimated drawn width of plain text (no subscripts) at <paramref name="fontSize"/> px.</summary>
    public static double PlainWidth(string text, double fontSize) => text.Length * CharacterWidth * fontSize;

    /// <summary>Estimated drawn width at <paramref name="fontSize"/> px.</summary>
    public static double Width(string formula, double fontSize) =>
        Split(formula).Sum(p => p.Text.Length * CharacterWidth * fontSize * (p.Subscript ? SubscriptScale : 1.0));

    /// <summary>The content of a text element: plain runs and subscript tspans, each returning to the baseline.</summary>
    public static string Markup(string formula, double fontSize) => Markup(formula, fontSize, out _);

    /// <summary>The same, saying whether it ends on a subscript (text that follows must then rise back to the baseline).</summary>
    public static string Markup(string formula, double fontSize, out bool endsBelow)
    {
        var b = new StringBuilder();
        string drop = SvgText.Px(SubscriptDrop * fontSize);
        string rise = SvgText.Px(-SubscriptDrop * fontSize);
        string small = SvgText.Px(SubscriptScale * fontSize);
        bool below = false;
        foreach ((string text, bool subscript) in Split(formula))
        {
            if (subscript)
            {
                b.Append($"<tspan dy=\"{drop}\" font-size=\"{small}\">{SvgText.Escape(text)}</tspan>");
                below = true;
            }
            else if (below)
            {
                b.Append($"<tspan dy=\"{rise}\">{SvgText.Escape(text)}</tspan>");
                below = false;
            }
            else
            {
                b.Append(SvgText.Escape(text));
            }
        }

        endsBelow = below;
        return b.ToString();
    }

    /// <summary>
    /// A line of plain text and formulas (each part: its text and whether it is a formula), as the content of one
    /// text element: formulas with subscripts, the text after a subscript back on the baseline.
    /// </summary>
    public static string Sentence(double fontSize, params (string Text, bool IsFormula)[] parts)
    {
        var b = new StringBuilder();
        bool below = false;
        foreach ((string text, bool isFormula) in parts)
        {
            if (isFormula)
            {
                if (below) b.Append($"<tspan dy=\"{SvgText.Px(-SubscriptDrop * fontSize)}\"></tspan>");
                b.Append(Markup(text, fontSize, out below));
            }
            else
            {
                b.Append(After(text, below, fontSize));
                below = false;
            }
        }

        // Back on the baseline at the end too, so that a line's drops and rises always cancel.
        if (below) b.Append($"<tspan dy=\"{SvgText.Px(-SubscriptDrop * fontSize)}\"></tspan>");
        return b.ToString();
    }

    /// <summary>Plain text after a formula, back on the baseline.</summary>
    public static string After(string text, bool formulaEndedBelow, double fontSize) => formulaEndedBelow
        ? $"<tspan dy=\"{SvgText.Px(-SubscriptDrop * fontSize)}\">{SvgText.Escape(text)}</tspan>"
        : SvgText.Escape(text);
}
