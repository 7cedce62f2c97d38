using System.Globalization;
using System.Text;
using Hull.Core.Defects;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// Concentrations and the Fermi level along a sweep (temperature, or a position along a path between two window
/// vertices): above, every defect's total and the free carriers on a log scale with each line labelled at its end;
/// below, the Fermi level between the band edges. A pure function from solutions to SVG text.
/// </summary>
public static class CarrierFigure
{
    private const double Width = 780, Height = 640, Left = 86, Right = 150, Top = 58;
    private const double UpperHeight = 330, Gap = 56, LowerHeight = 150;

    // Concentrations more than this many decades below the highest are drawn at the floor (they would only crowd it).
    private const double DecadesShown = 16;

    private static readonly string[] Dashes = ["", "7 3", "2 2.5", "9 3 2 3", "4 4", "1.5 3.5"];

    private const string BandFill = "#e6e6e6";

    /// <param name="title">The figure's heading, e.g. "Al2O3:Mg quenched from 1600 K".</param>
    /// <param name="axis">What the x values are.</param>
    /// <param name="x">One x value per solution, rising.</param>
    /// <param name="solutions">The solutions along the sweep; every one lists the same defects.</param>
    /// <param name="source">The dataset version the solutions came from, recorded in the metadata; null for none.</param>
    public static string Render(string title, CarrierFigureAxis axis, IReadOnlyList<double> x, IReadOnlyList<FermiLevelSolution> solutions, FigureMetadata? source = null) =>
        Render([(title, false)], axis, x, solutions, source);

    /// <summary>As above, with a title in parts: those marked as formulas are written with subscripts.</summary>
    public static string Render(IReadOnlyList<(string Text, bool IsFormula)> title, CarrierFigureAxis axis, IReadOnlyList<double> x, IReadOnlyList<FermiLevelSolution> solutions, FigureMetadata? source = null)
    {
        string plainTitle = string.Concat(title.Select(p => p.Text));
        if (solutions.Count < 2 || x.Count != solutions.Count) throw new FigureInputException($"a carrier figure needs two or more solutions and one x value each (got {solutions.Count} and {x.Count})", nameof(solutions));
        for (int i = 0; i < x.Count; i++)
        {
            if (!double.IsFinite(x[i]) || (i > 0 && !(x[i] > x[i - 1]))) throw new FigureInputException($"x values must be finite and rising (x[{i}] = {x[i]})", nameof(x));
        }

        var names = solutions[0].Defects.Select(d => d.Defect).ToArray();
        if (solutions.Any(s => !s.Defects.Select(d => d.Defect).SequenceEqual(names))) throw new FigureInputException("every solution of a carrier figure must list the same defects", nameof(solutions));

        var series = new List<(string Id, string Label, string Kind, string Colour, string Dash, double[] Log10)>();
        for (int d = 0; d < names.Length; d++)
        {
            series.Add((names[d], names[d], "defect", FigurePalette.StablePhase, Dashes[d % Dashes.Length], [.. solutions.Select(s => Log10(s.Defects[d].PerCubicCentimetre))]));
        }

        series.Add(("n", "electrons n", "carrier", FigurePalette.HullEdge, "", [.. solutions.Select(s => Log10(s.ElectronsPerCubicCentimetre))]));
        series.Add(("p", "holes p", "carrier", FigurePalette.HullEdge, "5 3", [.. solutions.Select(s => Log10(s.HolesPerCubicCentimetre))]));

        double highest = series.SelectMany(s => s.Log10).Where(double.IsFinite).DefaultIfEmpty(0).Max();
        double floor = Math.Floor(highest - DecadesShown);
        double lowest = Math.Max(floor, series.SelectMany(s => s.Log10).Where(double.IsFinite).DefaultIfEmpty(floor).Min());
        double yMin = Math.Floor(lowest), yMax = Math.Ceiling(highest);
        if (yMax - yMin < 2) yMax = yMin + 2;
        (double xMin, double xMax) = (x[0], x[^1]);
        double plotWidth = Width - Left - Right;
        double X(double v) => Left + (v - xMin) / (xMax - xMin) * plotWidth;
        double YUpper(double v) => Top + (yMax - Math.Max(v, yMin)) / (yMax - yMin) * UpperHeight;

        var canvas = new SvgCanvas(Width, Height);
        var b = canvas.Body;
        b.Append($"<text x=\"{Px(Left)}\" y=\"{Px(32)}\" font-size=\"{Num(FigurePalette.TitleFontSize, "0.#")}\" fill=\"{FigurePalette.Text}\" xml:space=\"preserve\">{FormulaText.Sentence(FigurePalette.TitleFontSize, [.. title])}</text>\n");

        // Upper panel: decades.
        Frame(canvas, Top, UpperHeight, plotWidth);
        int decadeStep = (int)Math.Max(1, Math.Ceiling((yMax - yMin) / 8));
        for (double k = yMin; k <= yMax + 1e-9; k += decadeStep)
        {
            double y = YUpper(k);
            canvas.Line(Left, y, Left + plotWidth, y, FigurePalette.Frame, 0.4, "stroke-opacity=\"0.35\"");
            b.Append($"<text x=\"{Px(Left - 8)}\" y=\"{Px(y + 4)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" text-anchor=\"end\" fill=\"{FigurePalette.Text}\">10<tspan dy=\"-5\" font-size=\"8.5\">{k.ToString("0", CultureInfo.InvariantCulture)}</tspan></text>\n");
        }

        VerticalTitle(canvas, Top + UpperHeight / 2, "Concentration (cm\u207b\u00b3)");
        var ends = new List<(double Y, int Series, double LeaderFromX, bool BelowFloor)>();
        for (int s = 0; s < series.Count; s++)
        {
            var (id, _, kind, colour, dash, logs) = series[s];
            string path = ClippedPath(x, logs, yMin, X, YUpper);
            if (path.Length == 0) continue;
            string dashAttribute = dash.Length > 0 ? $" stroke-dasharray=\"{dash}\"" : string.Empty;
            b.Append($"<path data-kind=\"{kind}\" data-id=\"{Escape(id)}\" d=\"{path}\" fill=\"none\" stroke=\"{colour}\" stroke-width=\"1.8\"{dashAttribute}/>\n");
            if (logs[^1] >= yMin) ends.Add((YUpper(logs[^1]), s, Left + plotWidth, false));
            else if (LastFloorCrossing(x, logs, yMin) is { } crossing) ends.Add((YUpper(yMin), s, X(crossing), true));
        }

        // End labels, pushed apart to one line height and kept inside the panel. A line that ends below the floor is
        // labelled at the floor, led there from where it left the panel, and marked with a down arrow.
        ends.Sort((a, c) => a.Y.CompareTo(c.Y));
        const double spacing = 13;
        var placed = new double[ends.Count];
        for (int i = 0; i < ends.Count; i++) placed[i] = Math.Max(ends[i].Y, i == 0 ? Top + 4 : placed[i - 1] + spacing);
        for (int i = ends.Count - 1; i >= 0; i--) placed[i] = Math.Min(placed[i], i == ends.Count - 1 ? Top + UpperHeight : placed[i + 1] - spacing);
        for (int i = 0; i < ends.Count; i++)
        {
            var (_, label, _, colour, _, _) = series[ends[i].Series];
            double lx = Left + plotWidth + 6;
            if (ends[i].BelowFloor)
            {
                canvas.Line(ends[i].LeaderFromX, ends[i].Y, Left + plotWidth, ends[i].Y, colour, 0.6, "stroke-dasharray=\"1 2\"");
            }

            if (Math.Abs(placed[i] - ends[i].Y) > 1) canvas.Line(Left + plotWidth, ends[i].Y, lx - 1, placed[i], colour, 0.6);
            string text = (series[ends[i].Series].Kind == "defect" ? DefectNameText.Markup(label, FigurePalette.SmallFontSize) : Escape(label))
                + (ends[i].BelowFloor ? " \u2193" : string.Empty);
            string below = ends[i].BelowFloor ? " data-below-floor=\"true\"" : string.Empty;
            b.Append($"<text data-label-for=\"{Escape(series[ends[i].Series].Id)}\"{below} x=\"{Px(lx)}\" y=\"{Px(placed[i] + 4)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" fill=\"{colour}\">{text}</text>\n");
        }

        // Lower panel: the Fermi level between the band edges.
        double lowerTop = Top + UpperHeight + Gap;
        double eLow = solutions.Min(s => Math.Min(s.Edges.ValenceEv, s.FermiLevelEv)) - 0.3;
        double eHigh = solutions.Max(s => Math.Max(s.Edges.ConductionEv, s.FermiLevelEv)) + 0.3;
        var (eMin, eMax, eStep) = AxisTicks.Range(eLow, eHigh);
        double YLower(double v) => lowerTop + (eMax - v) / (eMax - eMin) * LowerHeight;
        var valence = new StringBuilder($"M{Px(X(x[0]))},{Px(YLower(eMin))}");
        var conduction = new StringBuilder($"M{Px(X(x[0]))},{Px(YLower(eMax))}");
        var fermi = new StringBuilder();
        for (int i = 0; i < x.Count; i++)
        {
            valence.Append($"L{Px(X(x[i]))},{Px(YLower(solutions[i].Edges.ValenceEv))}");
            conduction.Append($"L{Px(X(x[i]))},{Px(YLower(solutions[i].Edges.ConductionEv))}");
            fermi.Append(i == 0 ? 'M' : 'L').Append($"{Px(X(x[i]))},{Px(YLower(Math.Clamp(solutions[i].FermiLevelEv, eMin, eMax)))}");
        }

        valence.Append($"L{Px(X(x[^1]))},{Px(YLower(eMin))}Z");
        conduction.Append($"L{Px(X(x[^1]))},{Px(YLower(eMax))}Z");
        b.Append($"<path data-kind=\"valence-band\" d=\"{valence}\" fill=\"{BandFill}\" stroke=\"none\"/>\n");
        b.Append($"<path data-kind=\"conduction-band\" d=\"{conduction}\" fill=\"{BandFill}\" stroke=\"none\"/>\n");
        Frame(canvas, lowerTop, LowerHeight, plotWidth);
        for (double e = eMin; e <= eMax + eStep * 1e-6; e += eStep)
        {
            b.Append($"<text x=\"{Px(Left - 8)}\" y=\"{Px(YLower(e) + 4)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" text-anchor=\"end\" fill=\"{FigurePalette.Text}\">{AxisTicks.Format(e, eStep)}</text>\n");
        }

        b.Append($"<path data-kind=\"fermi-level\" data-id=\"E_F\" d=\"{fermi}\" fill=\"none\" stroke=\"{FigurePalette.Text}\" stroke-width=\"2\"/>\n");
        double labelX = Left + plotWidth + 6;
        b.Append($"<text x=\"{Px(labelX)}\" y=\"{Px(YLower(solutions[^1].FermiLevelEv) + 4)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" fill=\"{FigurePalette.Text}\">E<tspan dy=\"3\" font-size=\"8.5\">F</tspan></text>\n");
        b.Append($"<text x=\"{Px(Left + 6)}\" y=\"{Px(lowerTop + 14)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" fill=\"{FigurePalette.UnstableOutline}\">conduction band</text>\n");
        b.Append($"<text x=\"{Px(Left + 6)}\" y=\"{Px(lowerTop + LowerHeight - 6)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" fill=\"{FigurePalette.UnstableOutline}\">valence band</text>\n");
        VerticalTitle(canvas, lowerTop + LowerHeight / 2, "E above VBM (eV)");

        // Shared x axis under the lower panel.
        var (_, _, tStep) = AxisTicks.Range(xMin, xMax);
        for (double t = Math.Ceiling(xMin / tStep - 1e-9) * tStep; t <= xMax + tStep * 1e-6; t += tStep)
        {
            double px = X(t);
            canvas.Line(px, lowerTop + LowerHeight, px, lowerTop + LowerHeight + 5, FigurePalette.Frame, 1);
            canvas.Line(px, Top + UpperHeight, px, Top + UpperHeight + 5, FigurePalette.Frame, 1);
            b.Append($"<text x=\"{Px(px)}\" y=\"{Px(lowerTop + LowerHeight + 19)}\" font-size=\"{Num(FigurePalette.SmallFontSize, "0.#")}\" text-anchor=\"middle\" fill=\"{FigurePalette.Text}\">{AxisTicks.Format(t, tStep)}</text>\n");
        }

        b.Append($"<text x=\"{Px(Left + plotWidth / 2)}\" y=\"{Px(lowerTop + LowerHeight + 42)}\" font-size=\"{Num(FigurePalette.LabelFontSize, "0.#")}\" text-anchor=\"middle\" fill=\"{FigurePalette.Text}\">{Escape(axis.Title)}</text>\n");

        string metadata = $"kind=\"carriers\" x-axis=\"{Escape(axis.Name)}\" x-unit=\"{Escape(axis.Unit)}\" defects=\"{Escape(string.Join(' ', names))}\" "
            + $"statistics=\"{solutions[0].Statistics.ToString().ToLowerInvariant()}\" form=\"{(solutions[0].Form is { } f ? f.ToString().ToLowerInvariant() : "frozen")}\""
            + (source is null ? string.Empty : " " + source.SvgAttributes());
        return canvas.Finish(plainTitle, metadata);
    }

    // The line above the floor only: pieces below it are left out, cut where they cross it.
    private static string ClippedPath(IReadOnlyList<double> x, double[] logs, double floor, Func<double, double> px, Func<double, double> py)
    {
        var path = new StringBuilder();
        bool drawing = false;
        for (int i = 0; i < logs.Length; i++)
        {
            bool above = logs[i] >= floor;
            if (i > 0 && above != (logs[i - 1] >= floor) && double.IsFinite(logs[i]) && double.IsFinite(logs[i - 1]))
            {
                double t = (floor - logs[i - 1]) / (logs[i] - logs[i - 1]);
                path.Append(drawing ? 'L' : 'M').Append(Px(px(x[i - 1] + t * (x[i] - x[i - 1])))).Append(',').Append(Px(py(floor)));
                drawing = !drawing;
            }
            else if (i > 0 && above != (logs[i - 1] >= floor))
            {
                drawing = false;
            }

            if (above)
            {
                path.Append(drawing ? 'L' : 'M').Append(Px(px(x[i]))).Append(',').Append(Px(py(logs[i])));
                drawing = true;
            }
        }

        return path.ToString();
    }

    // Where the line last falls through the floor (x), or null when it never shows above it.
    private static double? LastFloorCrossing(IReadOnlyList<double> x, double[] logs, double floor)
    {
        for (int i = logs.Length - 1; i > 0; i--)
        {
            if (logs[i - 1] < floor || logs[i] >= floor) continue;
            if (!double.IsFinite(logs[i])) return x[i - 1];
            double t = (floor - logs[i - 1]) / (logs[i] - logs[i - 1]);
            return x[i - 1] + t * (x[i] - x[i - 1]);
        }

        return null;
    }

    private static double Log10(double value) => value > 0 ? Math.Log10(value) : double.NegativeInfinity;

    private static void Frame(SvgCanvas canvas, double top, double height, double width) =>
        canvas.Body.Append($"<rect data-kind=\"frame\" x=\"{Px(Left)}\" y=\"{Px(top)}\" width=\"{Px(width)}\" height=\"{Px(height)}\" fill=\"none\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"1\"/>\n");

    private static void VerticalTitle(SvgCanvas canvas, double centreY, string text) =>
        canvas.Body.Append($"<text transform=\"translate({Px(24)},{Px(centreY)}) rotate(-90)\" font-size=\"{Num(FigurePalette.LabelFontSize, "0.#")}\" text-anchor=\"middle\" fill=\"{FigurePalette.Text}\">{Escape(text)}</text>\n");
}
