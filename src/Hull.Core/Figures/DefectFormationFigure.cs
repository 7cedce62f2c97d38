using System.Globalization;
using Hull.Core.Defects;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// Formation energy against Fermi level at one chemical-potential point: for each defect the line of its
/// lowest-energy charge state, with its thermodynamic transition levels marked and labelled q/q′, the band edges
/// drawn, and a legend. Every defect line carries data-kind="defect" and data-defect; every level marker
/// data-kind="level" with its charges.
/// </summary>
public static class DefectFormationFigure
{
    // Layout, px: the plot area, then the legend to its right.
    private const double Width = 800, Height = 540;
    private const double PlotLeft = 84, PlotRight = 580, PlotTop = 78, PlotBottom = 440;
    private const double LegendLeft = 606;
    private const double LevelMarkerRadius = 4.2;
    private const double LevelFontSize = 10.5;

    /// <summary>Draws the figure.</summary>
    /// <exception cref="FigureInputException">No defect, a range that is empty or not finite, a defect with no charge state.</exception>
    public static DefectFigureResult Draw(DefectFigureInput input)
    {
        ArgumentNullException.ThrowIfNull(input);
        if (input.Lines.Count == 0) throw new FigureInputException("a formation-energy figure needs at least one defect", nameof(input.Lines));
        if (!double.IsFinite(input.FermiMinEv) || !double.IsFinite(input.FermiMaxEv) || !(input.FermiMaxEv > input.FermiMinEv))
        {
            throw new FigureInputException(
                string.Create(CultureInfo.InvariantCulture, $"the Fermi-level range {input.FermiMinEv} to {input.FermiMaxEv} eV is not a range (the lower end must be below the upper)"),
                nameof(input.FermiMinEv));
        }

        foreach (DefectFigureLine line in input.Lines)
        {
            if (line.InterceptsEv.Count == 0) throw new FigureInputException($"defect '{line.Defect}' has no charge state to draw", nameof(input.Lines));
        }

        double x0 = input.FermiMinEv, x1 = input.FermiMaxEv;
        // The lowest line breaks only at thermodynamic levels, so it is exact through the ends and the levels inside.
        var curves = input.Lines.Select(line =>
        {
            TransitionLevel[] levels = [.. ChargeTransitions.Levels(line.Defect, line.InterceptsEv, input.BandGapEv)
                .Where(l => l.Kind == TransitionLevelKind.Thermodynamic && l.LevelEv > x0 && l.LevelEv < x1)];
            double[] xs = [x0, .. levels.Select(l => l.LevelEv), x1];
            return (Line: line, Levels: levels, Points: xs.Select(x => (X: x, E: Lowest(line.InterceptsEv, x))).ToArray());
        }).ToArray();

        double low = curves.Min(c => c.Points.Min(p => p.E)), high = curves.Max(c => c.Points.Max(p => p.E));
        (double yMin, double yMax, double yStep) = AxisTicks.Range(low, high);
        double X(double e) => PlotLeft + (e - x0) / (x1 - x0) * (PlotRight - PlotLeft);
        double Y(double e) => PlotTop + (yMax - e) / (yMax - yMin) * (PlotBottom - PlotTop);

        var canvas = new SvgCanvas(Width, Height);
        double titleSize = FigurePalette.TitleFontSize;
        canvas.Raw($"<text x=\"20\" y=\"30\" xml:space=\"preserve\" font-size=\"{Px(titleSize)}\" font-weight=\"bold\" fill=\"{FigurePalette.Text}\">Defect formation energies in ");
        canvas.Raw(FormulaText.Markup(input.HostFormula, titleSize));
        canvas.Raw("</text>\n");
        canvas.Text(20, 50, $"{input.PointLabel}: {input.PointDescription}", FigurePalette.SmallFontSize);

        // Outside the gap the Fermi level lies in a band: shaded, so levels there read as outside.
        string band = "#ededed";
        if (x0 < 0) canvas.Raw($"<rect data-kind=\"band\" x=\"{Px(PlotLeft)}\" y=\"{Px(PlotTop)}\" width=\"{Px(X(Math.Min(0, x1)) - PlotLeft)}\" height=\"{Px(PlotBottom - PlotTop)}\" fill=\"{band}\"/>\n");
        if (x1 > input.BandGapEv) canvas.Raw($"<rect data-kind=\"band\" x=\"{Px(X(Math.Max(input.BandGapEv, x0)))}\" y=\"{Px(PlotTop)}\" width=\"{Px(PlotRight - X(Math.Max(input.BandGapEv, x0)))}\" height=\"{Px(PlotBottom - PlotTop)}\" fill=\"{band}\"/>\n");
        canvas.Raw($"<rect x=\"{Px(PlotLeft)}\" y=\"{Px(PlotTop)}\" width=\"{Px(PlotRight - PlotLeft)}\" height=\"{Px(PlotBottom - PlotTop)}\" fill=\"none\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"1\"/>\n");
        if (yMax > 0 && yMin < 0) canvas.Line(PlotLeft, Y(0), PlotRight, Y(0), FigurePalette.Frame, 0.8, "stroke-dasharray=\"4 3\"");
        foreach ((double edge, string name) in new[] { (0.0, "VBM"), (input.BandGapEv, "CBM") })
        {
            if (edge < x0 || edge > x1) continue;
            canvas.Line(X(edge), PlotTop, X(edge), PlotBottom, FigurePalette.Frame, 1.2, "data-kind=\"band-edge\"");
            canvas.Text(X(edge), PlotTop - 6, name, FigurePalette.SmallFontSize, "middle");
        }

        int yTicks = (int)Math.Round((yMax - yMin) / yStep);
        for (int k = 0; k <= yTicks; k++)
        {
            double e = yMin + k * yStep;
            canvas.Line(PlotLeft - 5, Y(e), PlotLeft, Y(e), FigurePalette.Frame, 1);
            canvas.Text(PlotLeft - 8, Y(e) + 4, AxisTicks.Format(e, yStep), FigurePalette.SmallFontSize, "end");
        }

        (_, _, double xStep) = AxisTicks.Range(x0, x1);
        for (double e = Math.Ceiling(x0 / xStep - 1e-9) * xStep; e <= x1 + xStep * 1e-9; e += xStep)
        {
            canvas.Line(X(e), PlotBottom, X(e), PlotBottom + 5, FigurePalette.Frame, 1);
            canvas.Text(X(e), PlotBottom + 18, AxisTicks.Format(e, xStep), FigurePalette.SmallFontSize, "middle");
        }

        canvas.Text((PlotLeft + PlotRight) / 2, PlotBottom + 40, "Fermi level above the VBM (eV)", FigurePalette.LabelFontSize, "middle");
        double yMid = (PlotTop + PlotBottom) / 2;
        canvas.Text(30, yMid, "Formation energy (eV)", FigurePalette.LabelFontSize, "middle", $"transform=\"rotate(-90 30 {Px(yMid)})\"");

        int marked = 0;
        var placer = new LabelPlacer(new LabelBox(PlotLeft + 2, PlotTop + 2, PlotRight - PlotLeft - 4, PlotBottom - PlotTop - 4));
        for (int d = 0; d < curves.Length; d++)
        {
            var (line, _, points) = curves[d];
            string dash = DefectLineStyles.Dash(d);
            canvas.Raw($"<polyline data-kind=\"defect\" data-defect=\"{Escape(line.Defect)}\" fill=\"none\" stroke=\"{DefectLineStyles.Colour(d)}\" stroke-width=\"2.4\" stroke-linejoin=\"round\""
                + (dash.Length > 0 ? $" stroke-dasharray=\"{dash}\"" : string.Empty)
                + $" points=\"{string.Join(' ', points.Select(p => $"{Px(X(p.X))},{Px(Y(p.E))}"))}\"><title>{Escape(line.Defect)}</title></polyline>\n");
            foreach (var p in points) placer.Avoid(LabelBox.Around(X(p.X), Y(p.E), 2));
        }

        for (int d = 0; d < curves.Length; d++)
        {
            var (line, levels, _) = curves[d];
            foreach (TransitionLevel level in levels)
            {
                double x = X(level.LevelEv), y = Y(Lowest(line.InterceptsEv, level.LevelEv));
                string text = $"{Charge(level.Charge)}/{Charge(level.OtherCharge)}";
                canvas.Raw($"<circle data-kind=\"level\" data-defect=\"{Escape(line.Defect)}\" data-charges=\"{level.Charge} {level.OtherCharge}\" cx=\"{Px(x)}\" cy=\"{Px(y)}\" r=\"{Px(LevelMarkerRadius)}\" "
                    + $"fill=\"{FigurePalette.Background}\" stroke=\"{DefectLineStyles.Colour(d)}\" stroke-width=\"1.8\"><title>{Escape(line.Defect)} ε({text}) = {Num(level.LevelEv, "0.###")} eV</title></circle>\n");
                placer.Block(LabelBox.Around(x, y, LevelMarkerRadius + 1));
                marked++;
            }
        }

        canvas.BeginLabels();
        for (int d = 0; d < curves.Length; d++)
        {
            var (line, levels, _) = curves[d];
            foreach (TransitionLevel level in levels)
            {
                double x = X(level.LevelEv), y = Y(Lowest(line.InterceptsEv, level.LevelEv));
                string text = $"{Charge(level.Charge)}/{Charge(level.OtherCharge)}";
                double w = FormulaText.PlainWidth(text, LevelFontSize) + 2, h = LabelMetrics.Height * LevelFontSize;
                (LabelBox box, bool leader) = placer.Place(x, y, LevelMarkerRadius, w, h);
                if (leader) canvas.Line(x, y, box.X + box.Width / 2, box.Y + box.Height / 2, FigurePalette.Frame, 0.6);
                canvas.Text(box.X + 1, box.Y + LabelMetrics.Ascent * LevelFontSize, text, LevelFontSize, extra: $"data-kind=\"level-label\" data-defect=\"{Escape(line.Defect)}\"");
            }
        }

        canvas.EndGroup();

        // Legend: a swatch of each line with the defect's name.
        canvas.Text(LegendLeft, PlotTop + 4, "Lowest charge state", FigurePalette.LabelFontSize, extra: "font-weight=\"bold\"");
        for (int d = 0; d < curves.Length; d++)
        {
            double y = PlotTop + 28 + d * 22;
            string dash = DefectLineStyles.Dash(d);
            canvas.Line(LegendLeft, y - 4, LegendLeft + 34, y - 4, DefectLineStyles.Colour(d), 2.4, dash.Length > 0 ? $"stroke-dasharray=\"{dash}\"" : null);
            canvas.Raw($"<text data-kind=\"legend\" data-defect=\"{Escape(curves[d].Line.Defect)}\" x=\"{Px(LegendLeft + 42)}\" y=\"{Px(y)}\" font-size=\"{Px(FigurePalette.LabelFontSize)}\" fill=\"{FigurePalette.Text}\">"
                + DefectNameText.Markup(curves[d].Line.Defect, FigurePalette.LabelFontSize) + "</text>\n");
        }

        double noteTop = PlotTop + 40 + curves.Length * 22;
        canvas.Raw($"<circle cx=\"{Px(LegendLeft + 17)}\" cy=\"{Px(noteTop - 4)}\" r=\"{Px(LevelMarkerRadius)}\" fill=\"{FigurePalette.Background}\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"1.8\"/>\n");
        canvas.Text(LegendLeft + 42, noteTop, "transition level q/q′", FigurePalette.SmallFontSize);
        canvas.Raw($"<rect x=\"{Px(LegendLeft + 6)}\" y=\"{Px(noteTop + 12)}\" width=\"22\" height=\"12\" fill=\"{band}\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"0.6\"/>\n");
        canvas.Text(LegendLeft + 42, noteTop + 22, "Fermi level in a band", FigurePalette.SmallFontSize);
        canvas.Text(LegendLeft, noteTop + 48, string.Create(CultureInfo.InvariantCulture, $"band gap {input.BandGapEv:0.###} eV"), FigurePalette.SmallFontSize);

        canvas.Text(20, Height - 12, $"{PhaseDiagram.Provenance(input.Metadata)}; study {input.StudyName} version {input.StudyVersion}",
            FigurePalette.SmallFontSize, extra: "fill-opacity=\"0.8\"");
        string metadata =
            $"kind=\"defect-formation\" host=\"{Escape(input.HostFormula)}\" point=\"{Escape(input.PointLabel)}\" " +
            input.Metadata.SvgAttributes() + " " +
            $"study=\"{Escape(input.StudyName)}\" study-version=\"{input.StudyVersion}\" band-gap-ev=\"{Num(input.BandGapEv, "R")}\"";
        string svg = canvas.Finish($"Defect formation energies in {input.HostFormula} at {input.PointLabel}", metadata);
        return new DefectFigureResult(svg, curves.Length, marked);
    }

    /// <summary>The lowest E_f(q) + q E_F over the charge states.</summary>
    private static double Lowest(IReadOnlyDictionary<int, double> intercepts, double fermiEv) => intercepts.Min(p => p.Value + p.Key * fermiEv);

    /// <summary>A charge as written in a level label: +2, 0, −1 (a true minus sign).</summary>
    private static string Charge(int q) => q > 0 ? $"+{q}" : q < 0 ? $"\u2212{-q}" : "0";
}
