using System.Globalization;
using System.Text;

namespace Hull.Core.Figures;

/// <summary>Number and text formatting for SVG: invariant culture, fixed precision, XML-escaped text.</summary>
internal static class SvgText
{
    /// <summary>A coordinate to 0.1 px: finer than any screen or print needs, and it keeps large figures small.</summary>
    public static string Px(double value)
    {
        if (!double.IsFinite(value)) throw new InvalidOperationException($"A figure coordinate is {value}.");
        double rounded = Math.Round(value, 1);
        return (rounded == 0 ? 0.0 : rounded).ToString("0.#", CultureInfo.InvariantCulture);
    }

    public static string Num(double value, string format) => value.ToString(format, CultureInfo.InvariantCulture);

    public static string Escape(string text)
    {
        var b = new StringBuilder(text.Length);
        foreach (char c in text)
        {
            switch (c)
            {
                case '&': b.Append("&amp;"); break;
                case '<': b.Append("&lt;"); break;
                case '>': b.Append("&gt;"); break;
                case '"': b.Append("&quot;"); break;
                case '\'': b.Append("&apos;"); break;
                default:
                    // Control characters are not allowed in XML 1.0 text; ids may come from anywhere.
                    b.Append(c < ' ' && c is not '\t' and not '\n' and not '\r' ? '?' : c);
                    break;
            }
        }

        return b.ToString();
    }
}
