namespace Hull.Core.Figures;

/// <summary>
/// Ternary and quaternary figures: the composition triangle, or the tetrahedron seen from a chosen direction, with
/// every tie-line, the stable phases labelled and the unstable entries shaded by their energy above the hull.
/// </summary>
internal static class SimplexFigure
{
    public const double Width = 780, Height = 640;

    // The triangle: side 480 px, bottom-left corner at (80, 560); first component bottom-left, second bottom-right,
    // third at the top.
    public const double TriangleLeft = 80, TriangleBottom = 560, TriangleSide = 480;

    // The tetrahedron: its circumscribed sphere, radius 220 px, centred at (300, 350).
    public const double TetrahedronCenterX = 300, TetrahedronCenterY = 350, TetrahedronRadius = 220;

    internal const double LegendLeft = 610, LegendTop = 80;

    /// <summary>Far edges fade to this opacity, so that depth reads in a still picture.</summary>
    private const double FarthestEdgeOpacity = 0.4;

    public static FigureResult DrawTernary(FigurePlan plan)
    {
        (double X, double Y)[] corners = TernaryCorners;
        (double X, double Y, double Depth) Map(IReadOnlyList<double> f)
        {
            (double x, double y) = TernaryPosition(f);
            return (x, y, 0.0);
        }

        return Draw(plan, FigureKind.Ternary, Map, corners, TernaryCentre, [(0, 1), (1, 2), (2, 0)], string.Empty);
    }

    /// <summary>The triangle's corners: first component bottom-left, second bottom-right, third at the top.</summary>
    internal static (double X, double Y)[] TernaryCorners { get; } =
    [
        (TriangleLeft, TriangleBottom),
        (TriangleLeft + TriangleSide, TriangleBottom),
        (TriangleLeft + TriangleSide / 2, TriangleBottom - TriangleSide * Math.Sqrt(3) / 2),
    ];

    /// <summary>The triangle's centroid.</summary>
    internal static (double X, double Y) TernaryCentre => (TriangleLeft + TriangleSide / 2, TriangleBottom - TriangleSide * Math.Sqrt(3) / 6);

    /// <summary>Where composition fractions fall in the triangle.</summary>
    internal static (double X, double Y) TernaryPosition(IReadOnlyList<double> f)
    {
        (double X, double Y)[] c = TernaryCorners;
        return (f[0] * c[0].X + f[1] * c[1].X + f[2] * c[2].X, f[0] * c[0].Y + f[1] * c[1].Y + f[2] * c[2].Y);
    }

    /// <summary>The corner names, just outside the figure and away from its centre, blocked for other labels.</summary>
    internal static void CornerLabels(SvgCanvas canvas, LabelPlacer placer, IReadOnlyList<string> components, (double X, double Y)[] corners,
        (double X, double Y) centre, Func<int, string?> idOfCorner)
    {
        for (int k = 0; k < components.Count; k++)
        {
            (double w, double h) = LabelMetrics.Of(components[k], FigurePalette.LabelFontSize);
            double dx = corners[k].X - centre.X, dy = corners[k].Y - centre.Y;
            double length = Math.Max(1e-9, Math.Sqrt(dx * dx + dy * dy));
            double reach = 12 + Math.Abs(dx / length) * w / 2 + Math.Abs(dy / length) * h / 2;
            double cx = corners[k].X + dx / length * reach, cy = corners[k].Y + dy / length * reach;
            var box = new LabelBox(cx - w / 2, cy - h / 2, w, h);
            placer.Block(box);
            canvas.FormulaLabel(components[k], box, FigurePalette.LabelFontSize, idOfCorner(k));
        }
    }

    public static FigureResult DrawQuaternary(FigurePlan plan, double azimuthDegrees, double elevationDegrees)
    {
        var view = new TetrahedronView(azimuthDegrees, elevationDegrees);
        (double X, double Y, double Depth) Map(IReadOnlyList<double> f)
        {
            (double u, double v, double depth) = view.Project(f);
            return (TetrahedronCenterX + TetrahedronRadius * u, TetrahedronCenterY - TetrahedronRadius * v, depth);
        }

        var corners = new (double X, double Y)[4];
        for (int k = 0; k < 4; k++)
        {
            var (x, y, _) = Map(Unit(k, 4));
            corners[k] = (x, y);
        }

        string note = FormattableString.Invariant($"; view: azimuth {azimuthDegrees:0.#}°, elevation {elevationDegrees:0.#}°");
        return Draw(plan, FigureKind.Quaternary, Map, corners, (TetrahedronCenterX, TetrahedronCenterY),
            [(0, 1), (0, 2), (0, 3), (1, 2), (2, 3), (3, 1)], note);
    }

    private static FigureResult Draw(
        FigurePlan plan,
        FigureKind kind,
        Func<IReadOnlyList<double>, (double X, double Y, double Depth)> map,
        (double X, double Y)[] corners,
        (double X, double Y) centre,
        (int, int)[] frameEdges,
        string viewNote)
    {
        FigureInput input = plan.Input;
        int n = input.Components.Count;
        var canvas = new SvgCanvas(Width, Height);
        canvas.Title(plan);
        canvas.Text(20, 48, $"{plan.CompositionNote}; shade: {input.Axis.Name.ToLowerInvariant()} above the hull{viewNote}", FigurePalette.SmallFontSize);

        foreach ((int a, int b) in frameEdges)
        {
            canvas.Line(corners[a].X, corners[a].Y, corners[b].X, corners[b].Y, FigurePalette.Frame, 1.2);
        }

        // Depth of each edge's middle sets its opacity: near edges solid, far edges faded.
        canvas.BeginEdges();
        foreach (FigureEdge edge in input.Edges)
        {
            var a = map(plan.ById[edge.FirstId].Fractions);
            var b = map(plan.ById[edge.SecondId].Fractions);
            double depth = (a.Depth + b.Depth) / 2;
            double opacity = kind == FigureKind.Ternary ? 1.0 : 1.0 - (1.0 - FarthestEdgeOpacity) * Math.Clamp((depth + 1) / 2, 0, 1);
            canvas.Edge(edge, a.X, a.Y, b.X, b.Y, opacity);
        }

        var placer = new LabelPlacer(new LabelBox(4, 56, LegendLeft - 12, Height - 56 - 26));
        canvas.EndGroup();
        canvas.BeginUnstable();
        foreach (FigurePoint p in plan.Unstable)
        {
            var (x, y, _) = map(p.Fractions);
            canvas.UnstableMarker(p, x, y, AboveHullScale.ColorAt(p.EnergyAboveHullEvPerAtom / plan.Cutoff), PhaseDiagram.TitleOf(p, input.Axis));
            placer.Avoid(LabelBox.Around(x, y, FigurePalette.UnstableMarkerRadius));
        }
        canvas.EndGroup();

        var markers = new List<(FigurePoint Point, double X, double Y)>();
        canvas.BeginStable();
        foreach (FigurePoint p in plan.Stable)
        {
            var (x, y, _) = map(p.Fractions);
            canvas.StableMarker(p, x, y, PhaseDiagram.TitleOf(p, input.Axis));
            placer.Block(LabelBox.Around(x, y, FigurePalette.StableMarkerRadius * 1.3));
            markers.Add((p, x, y));
        }
        canvas.EndGroup();

        canvas.BeginLabels();
        CornerLabels(canvas, placer, input.Components, corners, centre, k => plan.Stable.FirstOrDefault(p => FigurePlan.CornerOf(p) == k)?.Id);

        // Crowded regions first: a phase with close neighbours has the fewest free places.
        var order = markers.Where(m => FigurePlan.CornerOf(m.Point) < 0)
            .OrderBy(m => markers.Min(o => ReferenceEquals(o.Point, m.Point) ? double.MaxValue : Distance(o.X, o.Y, m.X, m.Y)))
            .ThenBy(m => m.Point.Id, StringComparer.Ordinal);
        foreach (var (p, x, y) in order)
        {
            (double w, double h) = LabelMetrics.Of(p.Formula, FigurePalette.LabelFontSize);
            (LabelBox box, bool leader) = placer.Place(x, y, FigurePalette.StableMarkerRadius * 1.25, w, h);
            if (leader) canvas.Line(x, y, Nearest(box.X, box.Right, x), Nearest(box.Y, box.Bottom, y), FigurePalette.Frame, 0.6);
            canvas.FormulaLabel(p.Formula, box, FigurePalette.LabelFontSize, p.Id);
        }

        canvas.EndGroup();
        FigureLegend.Draw(canvas, LegendLeft, LegendTop, plan.Cutoff, input.Axis, plan.Hidden, "tie-line");
        canvas.Text(20, Height - 12, PhaseDiagram.Provenance(input.Metadata), FigurePalette.SmallFontSize, extra: "fill-opacity=\"0.8\"");
        return plan.Result(canvas.Finish(kind, input, plan.Title), kind);
    }

    private static double Distance(double x1, double y1, double x2, double y2) => Math.Sqrt((x1 - x2) * (x1 - x2) + (y1 - y2) * (y1 - y2));

    private static double Nearest(double low, double high, double value) => Math.Clamp(value, low, high);

    private static double[] Unit(int k, int n) => Enumerable.Range(0, n).Select(j => j == k ? 1.0 : 0.0).ToArray();
}
