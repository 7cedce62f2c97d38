using System.Globalization;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>The legend at a figure's right: the energy-above-hull scale with ticks, and a key of the marks.</summary>
internal static class FigureLegend
{
    public const double Width = 150;

    /// <summary>Steps of the drawn gradient: enough that no banding shows at the bar's height.</summary>
    public const int GradientStops = 11;

    /// <summary>Draws the legend with its top-left corner at (x, y); returns the box it takes.</summary>
    public static LabelBox Draw(SvgCanvas canvas, double x, double y, double cutoff, EnergyAxis axis, int hidden, string edgeName)
    {
        const double barWidth = 16, barHeight = 200;
        canvas.Text(x, y + 12, "Above hull", FigurePalette.SmallFontSize);
        IReadOnlyList<string> unitLines = UnitLines(axis.Unit);
        for (int i = 0; i < unitLines.Count; i++) canvas.Text(x, y + 26 + (14 * i), unitLines[i], FigurePalette.SmallFontSize);
        double top = y + 36 + (14 * (unitLines.Count - 1));
        var gradient = new System.Text.StringBuilder();
        gradient.Append("<defs><linearGradient id=\"above-hull-scale\" x1=\"0\" y1=\"1\" x2=\"0\" y2=\"0\">");
        for (int k = 0; k < GradientStops; k++)
        {
            double t = k / (double)(GradientStops - 1);
            gradient.Append($"<stop offset=\"{Num(t, "0.##")}\" stop-color=\"{AboveHullScale.ColorAt(t)}\"/>");
        }

        gradient.Append("</linearGradient></defs>\n");
        canvas.Raw(gradient.ToString());
        canvas.Raw($"<rect data-kind=\"scale\" x=\"{Px(x)}\" y=\"{Px(top)}\" width=\"{Px(barWidth)}\" height=\"{Px(barHeight)}\" fill=\"url(#above-hull-scale)\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"0.8\"/>\n");
        foreach (double t in new[] { 0.0, 0.5, 1.0 })
        {
            double ty = top + barHeight * (1 - t);
            canvas.Line(x + barWidth, ty, x + barWidth + 5, ty, FigurePalette.Frame, 1);
            canvas.Text(x + barWidth + 8, ty + 4, (t * cutoff).ToString(cutoff < 0.1 ? "0.000" : "0.00", CultureInfo.InvariantCulture), FigurePalette.SmallFontSize);
        }

        double ky = top + barHeight + 26;
        double r = FigurePalette.StableMarkerRadius * 1.25;
        canvas.Raw($"<path d=\"M{Px(x + 8)} {Px(ky - r)}L{Px(x + 8 + r)} {Px(ky)}L{Px(x + 8)} {Px(ky + r)}L{Px(x + 8 - r)} {Px(ky)}Z\" fill=\"{FigurePalette.StablePhase}\"/>\n");
        canvas.Text(x + 22, ky + 4, "stable phase", FigurePalette.SmallFontSize);
        ky += 20;
        canvas.Line(x, ky, x + 16, ky, FigurePalette.HullEdge, 1.8);
        canvas.Text(x + 22, ky + 4, edgeName, FigurePalette.SmallFontSize);
        ky += 20;
        canvas.Raw($"<circle cx=\"{Px(x + 8)}\" cy=\"{Px(ky)}\" r=\"{Px(FigurePalette.UnstableMarkerRadius)}\" fill=\"{AboveHullScale.ColorAt(0.4)}\" stroke=\"{FigurePalette.UnstableOutline}\" stroke-width=\"0.6\"/>\n");
        canvas.Text(x + 22, ky + 4, "above hull", FigurePalette.SmallFontSize);
        ky += 20;
        if (hidden > 0)
        {
            // The unit is the scale's, written above it: a long one (per closed-element atom) would leave the page here.
            canvas.Text(x, ky + 4, $"{hidden} more above {cutoff.ToString("0.###", CultureInfo.InvariantCulture)}", FigurePalette.SmallFontSize);
            canvas.Text(x, ky + 18, "not shown", FigurePalette.SmallFontSize);
            ky += 28;
        }

        return new LabelBox(x - 4, y, Width, ky - y + 4);
    }

    /// <summary>"(unit)" on one line when it fits the legend's width, else broken after its "per".</summary>
    internal static IReadOnlyList<string> UnitLines(string unit)
    {
        string whole = $"({unit})";
        int per = unit.IndexOf(" per ", StringComparison.Ordinal);
        if (FormulaText.PlainWidth(whole, FigurePalette.SmallFontSize) <= Width - 4 || per < 0) return [whole];
        return [$"({unit[..(per + 4)]}", $"{unit[(per + 5)..]})"];
    }
}
