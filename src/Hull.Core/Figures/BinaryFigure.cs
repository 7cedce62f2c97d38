using System.Globalization;

namespace Hull.Core.Figures;

/// <summary>A binary: the hull-axis energy against the atom fraction of the second component, the hull as a line.</summary>
internal static class BinaryFigure
{
    /// <summary>
    /// The rotated energy-axis title as one line when it fits the plot's height, else the name and the unit on two
    /// lines (a grand-potential name lists every open element), the font shrunk further only if a line still does
    /// not fit; each line with its x (the baseline of a line rotated by -90°) and font size.
    /// </summary>
    internal static IReadOnlyList<(double X, string Line, double Size)> EnergyAxisTitleLines(EnergyAxis axis)
    {
        const double room = PlotBottom - PlotTop;
        double size = FigurePalette.LabelFontSize;
        if (FormulaText.PlainWidth(axis.Title, size) <= room) return [(32, axis.Title, size)];
        string[] lines = [axis.Name, $"({axis.Unit})"];
        double longest = lines.Max(l => FormulaText.PlainWidth(l, size));
        if (longest > room) size = Math.Floor(size * room / longest * 10) / 10; // floored to the 0.1 px the SVG writes
        return [(30 - (size * 0.65), lines[0], size), (30 + (size * 0.65), lines[1], size)];
    }

    // Layout, px: the plot area, then the legend to its right.
    public const double Width = 780, Height = 540;
    public const double PlotLeft = 90, PlotRight = 560, PlotTop = 70, PlotBottom = 430;
    private const double LegendLeft = 610;

    public static FigureResult Draw(FigurePlan plan)
    {
        FigureInput input = plan.Input;
        var canvas = new SvgCanvas(Width, Height);
        IEnumerable<FigurePoint> shown = plan.Stable.Concat(plan.Unstable);
        double low = Math.Min(0.0, shown.Min(p => p.EnergyEvPerAtom));
        double high = Math.Max(0.0, shown.Max(p => p.EnergyEvPerAtom));
        (double yMin, double yMax, double step) = AxisTicks.Range(low, high);
        double X(FigurePoint p) => PlotLeft + p.Fractions[1] * (PlotRight - PlotLeft);
        double Y(double e) => PlotTop + (yMax - e) / (yMax - yMin) * (PlotBottom - PlotTop);

        canvas.Title(plan);
        canvas.Text(20, 48, $"{input.Axis.Name}; {plan.CompositionNote}", FigurePalette.SmallFontSize);

        // Frame, zero line and ticks.
        canvas.Raw($"<rect x=\"{SvgText.Px(PlotLeft)}\" y=\"{SvgText.Px(PlotTop)}\" width=\"{SvgText.Px(PlotRight - PlotLeft)}\" height=\"{SvgText.Px(PlotBottom - PlotTop)}\" fill=\"none\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"1\"/>\n");
        if (yMax > 0 && yMin < 0) canvas.Line(PlotLeft, Y(0), PlotRight, Y(0), FigurePalette.Frame, 0.8, "stroke-dasharray=\"4 3\"");
        int ticks = (int)Math.Round((yMax - yMin) / step);
        for (int k = 0; k <= ticks; k++)
        {
            double e = yMin + k * step;
            canvas.Line(PlotLeft - 5, Y(e), PlotLeft, Y(e), FigurePalette.Frame, 1);
            canvas.Text(PlotLeft - 8, Y(e) + 4, AxisTicks.Format(e, step), FigurePalette.SmallFontSize, "end");
        }

        for (int k = 0; k <= 5; k++)
        {
            double x = PlotLeft + k / 5.0 * (PlotRight - PlotLeft);
            canvas.Line(x, PlotBottom, x, PlotBottom + 5, FigurePalette.Frame, 1);
            canvas.Text(x, PlotBottom + 18, (k / 5.0).ToString("0.0", CultureInfo.InvariantCulture), FigurePalette.SmallFontSize, "middle");
        }

        canvas.Text((PlotLeft + PlotRight) / 2, PlotBottom + 56, $"Atom fraction of {input.Components[1]}", FigurePalette.LabelFontSize, "middle");
        double yMid = (PlotTop + PlotBottom) / 2;
        foreach ((double x, string line, double size) in EnergyAxisTitleLines(input.Axis))
        {
            canvas.Text(x, yMid, line, size, "middle", $"transform=\"rotate(-90 {SvgText.Px(x)} {SvgText.Px(yMid)})\"");
        }

        var placer = new LabelPlacer(new LabelBox(PlotLeft + 2, PlotTop + 2, PlotRight - PlotLeft - 4, PlotBottom - PlotTop - 4));
        canvas.BeginEdges();
        foreach (FigureEdge edge in input.Edges)
        {
            FigurePoint a = plan.ById[edge.FirstId], b = plan.ById[edge.SecondId];
            canvas.Edge(edge, X(a), Y(a.EnergyEvPerAtom), X(b), Y(b.EnergyEvPerAtom), 1.0);
        }

        canvas.EndGroup();
        canvas.BeginUnstable();
        foreach (FigurePoint p in plan.Unstable)
        {
            double t = p.EnergyAboveHullEvPerAtom / plan.Cutoff;
            canvas.UnstableMarker(p, X(p), Y(p.EnergyEvPerAtom), AboveHullScale.ColorAt(t), PhaseDiagram.TitleOf(p, input.Axis));
            placer.Avoid(LabelBox.Around(X(p), Y(p.EnergyEvPerAtom), FigurePalette.UnstableMarkerRadius));
        }
        canvas.EndGroup();

        canvas.BeginStable();
        foreach (FigurePoint p in plan.Stable)
        {
            canvas.StableMarker(p, X(p), Y(p.EnergyEvPerAtom), PhaseDiagram.TitleOf(p, input.Axis));
            placer.Block(LabelBox.Around(X(p), Y(p.EnergyEvPerAtom), FigurePalette.StableMarkerRadius * 1.3));
        }
        canvas.EndGroup();

        canvas.BeginLabels();
        // The end components are named under the axis ends; the others get labels placed beside their markers.
        for (int k = 0; k < 2; k++)
        {
            (double w, double h) = LabelMetrics.Of(input.Components[k], FigurePalette.LabelFontSize);
            double x = k == 0 ? PlotLeft : PlotRight;
            string? id = plan.Stable.FirstOrDefault(p => FigurePlan.CornerOf(p) == k)?.Id;
            canvas.FormulaLabel(input.Components[k], new LabelBox(x - w / 2, PlotBottom + 23, w, h), FigurePalette.LabelFontSize, id);
        }

        foreach (FigurePoint p in plan.Stable.Where(p => FigurePlan.CornerOf(p) < 0).OrderBy(p => p.Fractions[1]))
        {
            (double w, double h) = LabelMetrics.Of(p.Formula, FigurePalette.LabelFontSize);
            (LabelBox box, bool leader) = placer.Place(X(p), Y(p.EnergyEvPerAtom), FigurePalette.StableMarkerRadius * 1.25, w, h);
            if (leader) canvas.Line(X(p), Y(p.EnergyEvPerAtom), box.X + box.Width / 2, box.Y + box.Height / 2, FigurePalette.Frame, 0.6);
            canvas.FormulaLabel(p.Formula, box, FigurePalette.LabelFontSize, p.Id);
        }

        canvas.EndGroup();
        FigureLegend.Draw(canvas, LegendLeft, PlotTop, plan.Cutoff, input.Axis, plan.Hidden, "hull");
        canvas.Text(20, Height - 12, PhaseDiagram.Provenance(input.Metadata), FigurePalette.SmallFontSize, extra: $"fill-opacity=\"0.8\"");
        return plan.Result(canvas.Finish(FigureKind.Binary, input, $"{plan.Title}: {input.Axis.Title}"), FigureKind.Binary);
    }
}
