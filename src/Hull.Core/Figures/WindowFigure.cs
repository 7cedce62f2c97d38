using System.Globalization;
using System.Text;
using Hull.Core.Windows;
using static Hull.Core.Figures.SvgText;

namespace Hull.Core.Figures;

/// <summary>
/// A stability window drawn in the plane of two potentials: the window shaded (or, when it is a segment or a point
/// in that plane, drawn as one), its vertices marked, every constraint that crosses the plot as a line labelled with
/// its formula (the ones that bound the window stronger), the elements' reference edges dashed, and the region above
/// a reference greyed. A key and notes at the right say what is drawn and what was held fixed. A pure function from
/// a <see cref="WindowMap"/> to SVG text.
/// </summary>
public static class WindowFigure
{
    public const double Width = 800, Height = 600;
    public const double PlotLeft = 84, PlotTop = 80, PlotWidth = 440, PlotHeight = 420;
    public const double PlotRight = PlotLeft + PlotWidth, PlotBottom = PlotTop + PlotHeight;
    private const double KeyLeft = PlotRight + 28;

    /// <summary>Competing phases' lines that do not bound the window drawn at most (the nearest to it): more only crowd.</summary>
    public const int MaxOtherLines = 16;

    private const string WindowFill = FigurePalette.StablePhase;
    private const string AboveReferenceFill = "#efefef";
    private const string CoexistingDash = "7 3";
    private const string ReferenceDash = "2.5 3";

    public static WindowFigureResult Render(WindowMap map, FigureMetadata? source = null)
    {
        ArgumentNullException.ThrowIfNull(map);
        WindowMapVertex[] vertices = map.Vertices.ToArray();
        // The plot spans the window with a margin (and the references at 0); ticks at round steps inside it.
        (double xMin, double xMax, double yMin, double yMax) = Extent(map);
        double xStep = AxisTicks.Range(xMin, xMax).Step, yStep = AxisTicks.Range(yMin, yMax).Step;
        double X(double v) => PlotLeft + ((v - xMin) / (xMax - xMin) * PlotWidth);
        double Y(double v) => PlotBottom - ((v - yMin) / (yMax - yMin) * PlotHeight);

        var canvas = new SvgCanvas(Width, Height);
        StringBuilder b = canvas.Body;
        string formula = map.Window.Compound.Composition.ReducedFormula;
        string system = string.Join("\u2013", map.Window.Elements);
        Heading(canvas, map, formula, system, source);

        // Above a reference (Δμ > 0) nothing of the system is stable against the element: greyed.
        if (xMax > 0) b.Append($"<rect data-kind=\"above-reference\" x=\"{Px(X(Math.Max(0, xMin)))}\" y=\"{Px(PlotTop)}\" width=\"{Px(PlotRight - X(Math.Max(0, xMin)))}\" height=\"{Px(PlotHeight)}\" fill=\"{AboveReferenceFill}\"/>\n");
        if (yMax > 0) b.Append($"<rect data-kind=\"above-reference\" x=\"{Px(PlotLeft)}\" y=\"{Px(PlotTop)}\" width=\"{Px(PlotWidth)}\" height=\"{Px(Y(Math.Max(0, yMin)) - PlotTop)}\" fill=\"{AboveReferenceFill}\"/>\n");
        Axes(canvas, map, xMin, xMax, xStep, yMin, yMax, yStep, X, Y);

        // Lines: the bounding ones, the coexisting and reference lines, and the nearest others.
        double cx = vertices.Length > 0 ? vertices.Average(v => v.X) : (xMin + xMax) / 2;
        double cy = vertices.Length > 0 ? vertices.Average(v => v.Y) : (yMin + yMax) / 2;
        var clipped = new List<(WindowMapLine Line, (double X, double Y) P, (double X, double Y) Q)>();
        var others = new List<(WindowMapLine Line, (double X, double Y) P, (double X, double Y) Q, double Distance)>();
        foreach (WindowMapLine line in map.Lines)
        {
            if (Clip(line, xMin, xMax, yMin, yMax) is not { } segment) continue;
            if (line.Kind == WindowMapLineKind.CompetingPhase && !line.Bounds)
            {
                others.Add((line, segment.P, segment.Q, Math.Abs((line.A * cx) + (line.B * cy) - line.C) / Math.Sqrt((line.A * line.A) + (line.B * line.B))));
            }
            else
            {
                clipped.Add((line, segment.P, segment.Q));
            }
        }

        // Labels are placed first, bounding lines before the others; a line that does not bound the window and finds
        // no free place for its label is left out rather than drawn unlabelled or over another label.
        var placer = new LabelPlacer(new LabelBox(PlotLeft + 2, PlotTop + 2, PlotWidth - 4, PlotHeight - 4));
        foreach (WindowMapVertex v in vertices) placer.Block(LabelBox.Around(X(v.X), Y(v.Y), vertices.Length == 1 ? 12 : VertexRadius + 1));
        var drawn = new List<(WindowMapLine Line, (double X, double Y) P, (double X, double Y) Q, LabelBox Box, bool Leader, (double X, double Y) At)>();
        int leftOut = 0, crowded = 0;
        var candidates = clipped.OrderBy(c => c.Line.Kind == WindowMapLineKind.CompetingPhase ? 0 : c.Line.Kind == WindowMapLineKind.Coexisting ? 1 : 2)
            .Select(c => (c.Line, c.P, c.Q))
            .Concat(others.OrderBy(o => o.Distance).ThenBy(o => o.Line.Id, StringComparer.Ordinal).Select(o => (o.Line, o.P, o.Q)));
        foreach (var (line, p, q) in candidates)
        {
            bool other = line.Kind == WindowMapLineKind.CompetingPhase && !line.Bounds;
            if (other && drawn.Count(d => d.Line.Kind == WindowMapLineKind.CompetingPhase && !d.Line.Bounds) >= MaxOtherLines)
            {
                leftOut++;
                continue;
            }

            (double w, double h) = LabelMetrics.Of(LabelText(line), FigurePalette.SmallFontSize);
            (double ax, double ay) = Anchor(line, p, q, vertices);
            if (placer.TryPlace(X(ax), Y(ay), 2, w, h, out LabelBox box, out bool leader))
            {
                drawn.Add((line, p, q, box, leader, (X(ax), Y(ay))));
            }
            else if (other)
            {
                leftOut++;
            }
            else
            {
                // A line that bounds the window is always drawn; its label only where it fits.
                crowded++;
                drawn.Add((line, p, q, default, false, (X(ax), Y(ay))));
            }
        }

        foreach (var (line, p, q, _, _, _) in drawn.AsEnumerable().Reverse())
        {
            (string colour, double width, string dash) = Style(line);
            b.Append($"<line data-kind=\"{KindName(line.Kind)}\" data-id=\"{Escape(line.Id)}\" data-bounds=\"{(line.Bounds ? "true" : "false")}\" ")
                .Append($"x1=\"{Px(X(p.X))}\" y1=\"{Px(Y(p.Y))}\" x2=\"{Px(X(q.X))}\" y2=\"{Px(Y(q.Y))}\" stroke=\"{colour}\" stroke-width=\"{Px(width)}\"")
                .Append(dash.Length > 0 ? $" stroke-dasharray=\"{dash}\"" : string.Empty).Append("/>\n");
        }

        // The window: polygon, segment or point; its vertices on top.
        string elementsText = string.Join(", ", map.Window.Elements);
        if (vertices.Length >= 3 && map.Dimension == 2)
        {
            string d = "M" + string.Join("L", vertices.Select(v => $"{Px(X(v.X))},{Px(Y(v.Y))}")) + "Z";
            b.Append($"<path data-kind=\"window\" data-dimension=\"2\" d=\"{d}\" fill=\"{WindowFill}\" fill-opacity=\"0.2\" stroke=\"{WindowFill}\" stroke-width=\"2\" stroke-linejoin=\"round\"/>\n");
        }
        else if (vertices.Length >= 2)
        {
            string d = $"M{Px(X(vertices[0].X))},{Px(Y(vertices[0].Y))}L{Px(X(vertices[^1].X))},{Px(Y(vertices[^1].Y))}";
            b.Append($"<path data-kind=\"window\" data-dimension=\"1\" d=\"{d}\" fill=\"none\" stroke=\"{WindowFill}\" stroke-width=\"5\" stroke-linecap=\"round\" stroke-opacity=\"0.55\"/>\n");
        }

        else if (vertices.Length == 1)
        {
            b.Append($"<circle data-kind=\"window\" data-dimension=\"0\" cx=\"{Px(X(vertices[0].X))}\" cy=\"{Px(Y(vertices[0].Y))}\" r=\"11\" fill=\"{WindowFill}\" fill-opacity=\"0.15\" stroke=\"{WindowFill}\" stroke-width=\"1.5\"/>\n");
        }

        for (int k = 0; k < vertices.Length; k++)
        {
            WindowMapVertex v = vertices[k];
            string title = $"vertex {k + 1}: " + string.Join(", ", map.Window.Elements.Select((e, i) => $"Δμ({e}) = {v.Vertex.ChemicalPotentialsEv[i].ToString("0.####", CultureInfo.InvariantCulture)} eV"));
            b.Append($"<circle data-kind=\"window-vertex\" data-id=\"{k + 1}\" cx=\"{Px(X(v.X))}\" cy=\"{Px(Y(v.Y))}\" r=\"{Px(VertexRadius)}\" fill=\"{WindowFill}\" stroke=\"{FigurePalette.Background}\" stroke-width=\"1.2\"><title>{Escape(title)}</title></circle>\n");
        }

        canvas.BeginLabels();
        foreach (var (line, _, _, box, leader, at) in drawn)
        {
            if (box.Width == 0) continue;
            if (leader) canvas.Line(at.X, at.Y, box.X + (box.Width / 2), box.Y + (box.Height / 2), FigurePalette.Frame, 0.6);
            canvas.FormulaLabel(LabelText(line), box, FigurePalette.SmallFontSize, line.Id);
        }

        canvas.EndGroup();
        b.Append($"<rect data-kind=\"frame\" x=\"{Px(PlotLeft)}\" y=\"{Px(PlotTop)}\" width=\"{Px(PlotWidth)}\" height=\"{Px(PlotHeight)}\" fill=\"none\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"1\"/>\n");
        Key(canvas, map, drawn.Select(l => l.Line).ToArray(), leftOut, crowded, formula);

        static string R(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        string metadata =
            $"kind=\"window-map\" system=\"{Escape(map.Window.Compound.Composition.ChemicalSystem)}\" compound=\"{Escape(map.Window.Compound.Id)}\" elements=\"{Escape(string.Join(' ', map.Window.Elements))}\" " +
            $"x-element=\"{Escape(map.XElement)}\" y-element=\"{Escape(map.YElement)}\" dependent=\"{Escape(map.DependentElement ?? string.Empty)}\" " +
            $"section=\"{Escape(string.Join(' ', map.FixedPotentialsEv.OrderBy(p => p.Key, StringComparer.Ordinal).Select(p => $"{p.Key}={R(p.Value)}")))}\" dimension=\"{map.Dimension}\" " +
            $"plot=\"{R(PlotLeft)} {R(PlotTop)} {R(PlotWidth)} {R(PlotHeight)}\" x-range=\"{R(xMin)} {R(xMax)}\" y-range=\"{R(yMin)} {R(yMax)}\"" +
            (source is null ? string.Empty : " " + source.SvgAttributes());
        string svg = canvas.Finish($"Stability window of {formula} ({elementsText})", metadata);
        return new WindowFigureResult(svg, map.Dimension, drawn.Select(l => l.Line.Id).ToArray(), leftOut, crowded);
    }

    private const double VertexRadius = 4.5;

    private static string LabelText(WindowMapLine line) => line.Kind == WindowMapLineKind.ElementReference ? $"Δμ({line.Label}) = 0" : line.Label;

    /// <summary>The plotted range: the drawn vertices (else the whole window's), up to the references at 0, with a margin.</summary>
    private static (double, double, double, double) Extent(WindowMap map)
    {
        int x = map.Window.Elements.ToList().IndexOf(map.XElement), y = map.Window.Elements.ToList().IndexOf(map.YElement);
        (double X, double Y)[] points = map.Vertices.Count > 0
            ? map.Vertices.Select(v => (v.X, v.Y)).ToArray()
            : map.Window.Vertices.Select(v => (v.ChemicalPotentialsEv[x], v.ChemicalPotentialsEv[y])).ToArray();
        if (points.Length == 0) points = [(-1, -1)];
        double xLow = points.Min(p => p.X), xHigh = Math.Max(0, points.Max(p => p.X));
        double yLow = points.Min(p => p.Y), yHigh = Math.Max(0, points.Max(p => p.Y));
        // A margin of a tenth of the span, and at least enough to show 2 eV: a segment along one axis or a point
        // would otherwise stretch the other axis over meV.
        static double Pad(double span) => Math.Max(0.1 * span, Math.Max(0, 2 - span) / 2);
        double xPad = Pad(xHigh - xLow), yPad = Pad(yHigh - yLow);
        return (xLow - xPad, xHigh + (xPad / 2), yLow - yPad, yHigh + (yPad / 2));
    }

    private static void Heading(SvgCanvas canvas, WindowMap map, string formula, string system, FigureMetadata? source)
    {
        string lead = map.FixedPotentialsEv.Count > 0 ? "Section of the stability window of " : "Stability window of ";
        string tail = $" in {system}";
        double size = FigurePalette.TitleFontSize;
        double estimate = FormulaText.PlainWidth(lead + tail, size) + FormulaText.Width(formula, size);
        if (estimate > Width - 40) size *= (Width - 40) / estimate;
        canvas.Raw($"<text data-kind=\"heading\" x=\"20\" y=\"32\" xml:space=\"preserve\" font-size=\"{Px(size)}\" font-weight=\"bold\" fill=\"{FigurePalette.Text}\">");
        canvas.Raw(FormulaText.Sentence(size, (lead, false), (formula, true), (tail, false)) + "</text>\n");
        string sub = $"entry {map.Window.Compound.Id}" + (source is null ? string.Empty : $", dataset {source.Dataset} version {source.Version}");
        if (map.FixedPotentialsEv.Count > 0)
        {
            sub += "; at " + string.Join(", ", map.FixedPotentialsEv.OrderBy(p => p.Key, StringComparer.Ordinal)
                .Select(p => $"Δμ({p.Key}) = {p.Value.ToString("0.###", CultureInfo.InvariantCulture)} eV"));
        }

        double subSize = FigurePalette.SmallFontSize;
        if (FormulaText.PlainWidth(sub, subSize) > Width - 40) subSize *= (Width - 40) / FormulaText.PlainWidth(sub, subSize);
        canvas.Text(20, 54, sub, subSize, extra: "data-kind=\"subheading\"");
    }

    private static void Axes(SvgCanvas canvas, WindowMap map, double xMin, double xMax, double xStep, double yMin, double yMax, double yStep,
        Func<double, double> X, Func<double, double> Y)
    {
        StringBuilder b = canvas.Body;
        for (double t = Math.Ceiling((xMin / xStep) - 1e-9) * xStep; t <= xMax + (xStep * 1e-6); t += xStep)
        {
            double px = X(t);
            canvas.Line(px, PlotTop, px, PlotBottom, FigurePalette.Frame, 0.4, "stroke-opacity=\"0.35\"");
            canvas.Line(px, PlotBottom, px, PlotBottom + 5, FigurePalette.Frame, 1);
            canvas.Text(px, PlotBottom + 19, AxisTicks.Format(t, xStep), FigurePalette.SmallFontSize, "middle");
        }

        for (double t = Math.Ceiling((yMin / yStep) - 1e-9) * yStep; t <= yMax + (yStep * 1e-6); t += yStep)
        {
            double py = Y(t);
            canvas.Line(PlotLeft, py, PlotRight, py, FigurePalette.Frame, 0.4, "stroke-opacity=\"0.35\"");
            canvas.Line(PlotLeft - 5, py, PlotLeft, py, FigurePalette.Frame, 1);
            canvas.Text(PlotLeft - 8, py + 4, AxisTicks.Format(t, yStep), FigurePalette.SmallFontSize, "end");
        }

        double size = FigurePalette.LabelFontSize;
        b.Append($"<text data-kind=\"x-title\" x=\"{Px(PlotLeft + (PlotWidth / 2))}\" y=\"{Px(PlotBottom + 46)}\" xml:space=\"preserve\" font-size=\"{Px(size)}\" text-anchor=\"middle\" fill=\"{FigurePalette.Text}\">{PotentialTitle(map.XElement, size)}</text>\n");
        b.Append($"<text data-kind=\"y-title\" transform=\"translate({Px(28)},{Px(PlotTop + (PlotHeight / 2))}) rotate(-90)\" xml:space=\"preserve\" font-size=\"{Px(size)}\" text-anchor=\"middle\" fill=\"{FigurePalette.Text}\">{PotentialTitle(map.YElement, size)}</text>\n");
    }

    /// <summary>"Δμ" with the element as a subscript, then the unit, back on the baseline.</summary>
    private static string PotentialTitle(string element, double size) =>
        $"Δμ<tspan dy=\"{Px(FormulaText.SubscriptDrop * size)}\" font-size=\"{Px(FormulaText.SubscriptScale * size)}\">{Escape(element)}</tspan>" +
        $"<tspan dy=\"{Px(-FormulaText.SubscriptDrop * size)}\"> (eV)</tspan>";

    private static void Key(SvgCanvas canvas, WindowMap map, WindowMapLine[] drawn, int leftOut, int crowded, string formula)
    {
        StringBuilder b = canvas.Body;
        double x = KeyLeft, y = PlotTop + 4;
        double small = FigurePalette.SmallFontSize;
        void Entry(string swatch, string text)
        {
            b.Append(swatch);
            canvas.Text(x + 30, y + 4, text, small);
            y += 20;
        }

        string region = map.Dimension switch
        {
            2 => map.FixedPotentialsEv.Count > 0 ? "the window's section" : "the stability window",
            1 => "the window: a segment",
            0 => "the window: a point",
            _ => "no window drawn",
        };
        if (map.Dimension == 2) Entry($"<rect x=\"{Px(x)}\" y=\"{Px(y - 6)}\" width=\"22\" height=\"12\" fill=\"{WindowFill}\" fill-opacity=\"0.2\" stroke=\"{WindowFill}\" stroke-width=\"2\"/>\n", region);
        else if (map.Dimension == 1) Entry($"<line x1=\"{Px(x)}\" y1=\"{Px(y)}\" x2=\"{Px(x + 22)}\" y2=\"{Px(y)}\" stroke=\"{WindowFill}\" stroke-width=\"5\" stroke-opacity=\"0.55\" stroke-linecap=\"round\"/>\n", region);
        else if (map.Dimension == 0) Entry($"<circle cx=\"{Px(x + 11)}\" cy=\"{Px(y)}\" r=\"7\" fill=\"{WindowFill}\" fill-opacity=\"0.15\" stroke=\"{WindowFill}\" stroke-width=\"1.5\"/>\n", region);
        else Entry(string.Empty, region);
        if (map.Vertices.Count > 0) Entry($"<circle cx=\"{Px(x + 11)}\" cy=\"{Px(y)}\" r=\"4.5\" fill=\"{WindowFill}\"/>\n", map.Vertices.Count == 1 ? "its vertex" : "its vertices");
        foreach (WindowMapLineKind kind in new[] { WindowMapLineKind.CompetingPhase, WindowMapLineKind.Coexisting, WindowMapLineKind.ElementReference })
        {
            foreach (bool bounds in new[] { true, false })
            {
                if (!drawn.Any(l => l.Kind == kind && (l.Bounds == bounds || kind != WindowMapLineKind.CompetingPhase))) continue;
                if (kind != WindowMapLineKind.CompetingPhase && !bounds) continue;
                (string colour, double width, string dash) = Style(new WindowMapLine(kind, "", "", 0, 0, 0, bounds));
                string text = kind switch
                {
                    WindowMapLineKind.CompetingPhase => bounds ? "limit of a bounding phase" : "limit of another phase",
                    WindowMapLineKind.Coexisting => map.DependentElement is null && map.Window.CoexistingPhases.Count == 0 ? "the compound's own line" : "a coexisting phase",
                    _ => "element at its reference",
                };
                Entry($"<line x1=\"{Px(x)}\" y1=\"{Px(y)}\" x2=\"{Px(x + 22)}\" y2=\"{Px(y)}\" stroke=\"{colour}\" stroke-width=\"{Px(width)}\"{(dash.Length > 0 ? $" stroke-dasharray=\"{dash}\"" : string.Empty)}/>\n", text);
            }
        }

        Entry($"<rect x=\"{Px(x)}\" y=\"{Px(y - 6)}\" width=\"22\" height=\"12\" fill=\"{AboveReferenceFill}\" stroke=\"{FigurePalette.Frame}\" stroke-width=\"0.6\"/>\n", "above a reference (Δμ > 0)");

        // Notes: what the drawing is and what it leaves out, wrapped to the key's width.
        var notes = new List<string>();
        if (map.Window.Kind == WindowKind.AboveHull)
        {
            notes.Add($"No window: {formula} is {map.Window.Compound.EnergyAboveHullEvPerAtom.ToString("0.####", CultureInfo.InvariantCulture)} eV/atom above the hull.");
        }
        else if (map.SectionMisses)
        {
            string near = map.NearestPointEv is { } p ? string.Join(", ", map.Window.Elements.Select((e, i) => $"{e} {p[i].ToString("0.###", CultureInfo.InvariantCulture)}")) : "-";
            notes.Add($"The section misses the window; its nearest point (eV): {near}.");
        }
        else
        {
            notes.Add($"Window of dimension {map.Window.Dimension} in {map.Window.Elements.Count} potentials.");
            if (map.Window.Kind == WindowKind.LowerDimensional)
            {
                notes.Add($"{formula} lies inside a face of the hull with {string.Join(", ", map.Window.CoexistingPhases.Select(p => p.Composition.ReducedFormula))}, so its window is no area.");
            }

            if (map.Window.Kind == WindowKind.Lowered)
            {
                notes.Add($"{formula} is above the hull and drawn as lowered {map.Window.LoweredByEvPerAtom?.ToString("0.####", CultureInfo.InvariantCulture)} eV/atom below it.");
            }
        }

        if (map.DependentElement is { } dependent) notes.Add($"Δμ({dependent}) follows from the compound's formation energy.");
        if (map.SectionChosenByDefault) notes.Add("Section at the mean of the window's vertices (none was given).");
        if (leftOut > 0) notes.Add($"{leftOut} more competing phases' lines cross the plot; not drawn (at most {MaxOtherLines} that do not bound the window, nearest first, where their labels fit).");
        if (crowded > 0) notes.Add($"{crowded} bounding lines had no free place for a label.");
        notes.Add("0 K energies stand in for free energies.");
        y += 8;
        foreach (string note in notes)
        {
            foreach (string line in Wrap(note, Width - x - 12, small))
            {
                canvas.Text(x, y, line, small, extra: "data-kind=\"note\"");
                y += 15;
            }

            y += 4;
        }
    }

    /// <summary>Greedy word wrap to an estimated width.</summary>
    internal static IReadOnlyList<string> Wrap(string text, double width, double size)
    {
        var lines = new List<string>();
        var current = new StringBuilder();
        foreach (string word in text.Split(' '))
        {
            string tried = current.Length == 0 ? word : current + " " + word;
            if (current.Length > 0 && FormulaText.PlainWidth(tried, size) > width)
            {
                lines.Add(current.ToString());
                current.Clear().Append(word);
            }
            else
            {
                current.Clear().Append(tried);
            }
        }

        if (current.Length > 0) lines.Add(current.ToString());
        return lines;
    }

    private static (string Colour, double Width, string Dash) Style(WindowMapLine line) => line.Kind switch
    {
        WindowMapLineKind.CompetingPhase when line.Bounds => (FigurePalette.HullEdge, 1.8, string.Empty),
        WindowMapLineKind.CompetingPhase => (FigurePalette.Frame, 1.0, string.Empty),
        WindowMapLineKind.Coexisting => (FigurePalette.StablePhase, 1.8, CoexistingDash),
        _ => (FigurePalette.Text, 1.2, ReferenceDash),
    };

    private static string KindName(WindowMapLineKind kind) => kind switch
    {
        WindowMapLineKind.CompetingPhase => "phase-limit",
        WindowMapLineKind.Coexisting => "coexisting-limit",
        _ => "reference-edge",
    };

    /// <summary>Where a line's label goes: the middle of the window's edge on it, else the middle of its drawn part.</summary>
    private static (double X, double Y) Anchor(WindowMapLine line, (double X, double Y) p, (double X, double Y) q, WindowMapVertex[] vertices)
    {
        double scale = Math.Sqrt((line.A * line.A) + (line.B * line.B));
        var on = vertices.Where(v => Math.Abs((line.A * v.X) + (line.B * v.Y) - line.C) / scale < 1e-6).ToArray();
        if (line.Bounds && on.Length > 0 && line.Kind == WindowMapLineKind.CompetingPhase) return (on.Average(v => v.X), on.Average(v => v.Y));
        return ((p.X + q.X) / 2, (p.Y + q.Y) / 2);
    }

    /// <summary>The part of the line A x + B y = C inside the box, or null when it misses it.</summary>
    internal static ((double X, double Y) P, (double X, double Y) Q)? Clip(WindowMapLine line, double xMin, double xMax, double yMin, double yMax)
    {
        var points = new List<(double X, double Y)>();
        if (Math.Abs(line.B) > 1e-15)
        {
            foreach (double x in new[] { xMin, xMax })
            {
                double y = (line.C - (line.A * x)) / line.B;
                if (y >= yMin - 1e-12 && y <= yMax + 1e-12) points.Add((x, Math.Clamp(y, yMin, yMax)));
            }
        }

        if (Math.Abs(line.A) > 1e-15)
        {
            foreach (double y in new[] { yMin, yMax })
            {
                double x = (line.C - (line.B * y)) / line.A;
                if (x >= xMin - 1e-12 && x <= xMax + 1e-12) points.Add((Math.Clamp(x, xMin, xMax), y));
            }
        }

        if (points.Count < 2) return null;
        var pair = (from a in points from c in points select (a, c)).MaxBy(t => Math.Abs(t.a.X - t.c.X) + Math.Abs(t.a.Y - t.c.Y));
        double span = Math.Abs(pair.a.X - pair.c.X) / (xMax - xMin) + (Math.Abs(pair.a.Y - pair.c.Y) / (yMax - yMin));
        return span > 1e-9 ? (pair.a, pair.c) : null;
    }
}
