using System.Globalization;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// A plot frame for profiles along one variable (voltage against ion content, reaction energy against mixing
/// ratio): a plotting box with rounded tick ranges, grid, axis names, and a mapping from data to page.
/// </summary>
internal sealed class ProfileChart
{
    private const double Left = 84, Right = 36, Top = 64, Bottom = 92;
    private readonly double _bottom;

    /// <param name="width">Page width, px.</param>
    /// <param name="height">Page height, px.</param>
    /// <param name="x">The data range along x (rounded out to ticks).</param>
    /// <param name="y">The data range along y (rounded out to ticks).</param>
    /// <param name="legendLines">Lines of legend to leave room for between the x axis name and the footer.</param>
    public ProfileChart(double width, double height, (double Low, double High) x, (double Low, double High) y, int legendLines = 0)
    {
        _bottom = Bottom + (legendLines * LegendLineHeight);
        Canvas = new SvgCanvas(width, height);
        X = AxisTicks.Range(x.Low, x.High);
        Y = AxisTicks.Range(y.Low, y.High);
    }

    public SvgCanvas Canvas { get; }

    public (double Min, double Max, double Step) X { get; }

    public (double Min, double Max, double Step) Y { get; }

    public double BoxLeft => Left;

    public double BoxRight => Canvas.Width - Right;

    public double BoxTop => Top;

    public double BoxBottom => Canvas.Height - _bottom;

    /// <summary>Page y of a line's baseline in the legend under the x axis.</summary>
    public double LegendY(int line) => BoxBottom + 64 + (line * LegendLineHeight);

    public const double LegendLineHeight = 16;

    public double PageX(double x) => BoxLeft + ((x - X.Min) / (X.Max - X.Min) * (BoxRight - BoxLeft));

    public double PageY(double y) => BoxBottom - ((y - Y.Min) / (Y.Max - Y.Min) * (BoxBottom - BoxTop));

    /// <summary>One line of plain text and formulas (formulas with subscripts); <paramref name="anchor"/> is start, middle or end.</summary>
    public void Sentence(double x, double y, double size, string anchor, (string Text, bool IsFormula)[] parts, string? extra = null) =>
        Canvas.Raw($"<text x=\"{Px(x)}\" y=\"{Px(y)}\" xml:space=\"preserve\" font-size=\"{Px(size)}\" text-anchor=\"{anchor}\" "
            + $"fill=\"{FigurePalette.Text}\"{(extra is null ? string.Empty : " " + extra)}>{FormulaText.Sentence(size, parts)}</text>\n");

    /// <summary>
    /// Heading, grid, ticks, frame and the two axis names; the heading and the x name are parts of plain text and
    /// formulas (formulas drawn with subscripts, see <see cref="FormulaText.Sentence"/>).
    /// </summary>
    public void DrawFrame((string Text, bool IsFormula)[] heading, (string Text, bool IsFormula)[] xName, string yName)
    {
        SvgCanvas c = Canvas;
        double titleSize = FigurePalette.TitleFontSize, labelSize = FigurePalette.LabelFontSize;
        Sentence(20, 30, titleSize, "start", heading, "font-weight=\"bold\"");
        for (double v = X.Min; v <= X.Max + (X.Step * 1e-6); v += X.Step)
        {
            double px = PageX(v);
            c.Line(px, BoxTop, px, BoxBottom, "#e4e4e4", 1);
            c.Text(px, BoxBottom + 18, AxisTicks.Format(v, X.Step), FigurePalette.SmallFontSize, "middle");
        }

        for (double v = Y.Min; v <= Y.Max + (Y.Step * 1e-6); v += Y.Step)
        {
            double py = PageY(v);
            c.Line(BoxLeft, py, BoxRight, py, "#e4e4e4", 1);
            c.Text(BoxLeft - 8, py + 4, AxisTicks.Format(v, Y.Step), FigurePalette.SmallFontSize, "end");
        }

        c.Raw($"<rect x=\"{Px(BoxLeft)}\" y=\"{Px(BoxTop)}\" width=\"{Px(BoxRight - BoxLeft)}\" height=\"{Px(BoxBottom - BoxTop)}\" fill=\"none\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"1\"/>\n");
        Sentence((BoxLeft + BoxRight) / 2, BoxBottom + 40, labelSize, "middle", xName);
        double yMid = (BoxTop + BoxBottom) / 2;
        c.Text(24, yMid, yName, labelSize, "middle", $"transform=\"rotate(-90 24 {Px(yMid)})\"");
    }

    /// <summary>A path through page points with the given stroke; data-kind names what it is.</summary>
    public void Path(IReadOnlyList<(double X, double Y)> points, string color, double width, string dataKind, string? dash = null)
    {
        var d = new System.Text.StringBuilder();
        for (int k = 0; k < points.Count; k++)
        {
            d.Append(k == 0 ? 'M' : 'L').Append(Px(PageX(points[k].X))).Append(' ').Append(Px(PageY(points[k].Y)));
        }

        string dashing = dash is null ? string.Empty : $" stroke-dasharray=\"{dash}\"";
        Canvas.Raw($"<path data-kind=\"{dataKind}\" d=\"{d}\" fill=\"none\" stroke=\"{color}\" stroke-width=\"{Px(width)}\" stroke-linejoin=\"round\"{dashing}/>\n");
    }

    /// <summary>A footer line under the axis name (where the data came from, what the values rest on).</summary>
    public void Footer(string text, int line) =>
        Canvas.Text(20, Canvas.Height - 26 + (line * 14), text, FigurePalette.SmallFontSize, extra: "fill-opacity=\"0.8\"");

    public static string Num(double value) => value.ToString("0.###", CultureInfo.InvariantCulture);
}
