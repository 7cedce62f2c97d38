using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Figures;
using Hull.Core.Tests.References;
using Hull.Core.Tests.Windows;
using Hull.Core.Thermo;
using Hull.Core.Windows;
using static Hull.Core.Tests.Windows.HandbookSpinelWindowTests;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// Window maps: the drawn window read back from the SVG (pixels turned back into eV through the plot box and ranges the
/// figure records) against hand-worked handbook vertices; segments and points drawn as such; labels inside the page
/// and apart (estimated extents, and rsvg-convert's pixels); sections equal to slices.
/// </summary>
public sealed class WindowFigureTests
{
    private static readonly XNamespace Ns = "http://www.w3.org/2000/svg";

    /// <summary>Pixel coordinates are written to 0.1 px: half of that, as a share of the plot, is the read-back tolerance.</summary>
    private static double Tolerance(double[] range, double plotPixels) => 0.051 / plotPixels * (range[1] - range[0]);

    internal sealed record ReadBack(SvgFigure Svg, double[] Plot, double[] XRange, double[] YRange)
    {
        public (double X, double Y) ToEv(double px, double py) =>
            (XRange[0] + ((px - Plot[0]) / Plot[2] * (XRange[1] - XRange[0])), YRange[0] + ((Plot[1] + Plot[3] - py) / Plot[3] * (YRange[1] - YRange[0])));

        public (double X, double Y)[] WindowPoints()
        {
            XElement[] window = Svg.Elements.Where(e => (string?)e.Attribute("data-kind") == "window").ToArray();
            if (window.Length == 0) return [];
            XElement w = Assert.Single(window);
            double[] v = w.Name.LocalName == "circle" ? [SvgFigure.Attr(w, "cx"), SvgFigure.Attr(w, "cy")] : SvgFigure.Numbers((string)w.Attribute("d")!);
            return Enumerable.Range(0, v.Length / 2).Select(k => ToEv(v[2 * k], v[(2 * k) + 1])).ToArray();
        }

        public (double X, double Y)[] VertexMarkers() =>
            Svg.Elements.Where(e => (string?)e.Attribute("data-kind") == "window-vertex").Select(e => ToEv(SvgFigure.Attr(e, "cx"), SvgFigure.Attr(e, "cy"))).ToArray();

        public double XTolerance => Tolerance(XRange, Plot[2]);

        public double YTolerance => Tolerance(YRange, Plot[3]);
    }

    internal static ReadBack Read(string svg)
    {
        var figure = new SvgFigure(svg);
        XElement meta = figure.Elements.Single(e => e.Name.LocalName == "figure");
        double[] Numbers(string name) => ((string)meta.Attribute(name)!).Split(' ').Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray();
        Assert.Equal("window-map", (string?)meta.Attribute("kind"));
        return new ReadBack(figure, Numbers("plot"), Numbers("x-range"), Numbers("y-range"));
    }

    [Fact]
    public void Spinel_map_draws_the_hand_worked_window_and_its_bounding_phases()
    {
        SystemHull hull = SystemHull.OverElements(Oxides());
        WindowMap map = WindowMaps.Of(hull, "spinel", "Mg", "O");
        WindowFigureResult figure = WindowFigure.Render(map, new FigureMetadata("handbook", 1, "00"));
        ReadBack back = Read(figure.Svg);
        Assert.Equal(2, figure.Dimension);

        // CRC Handbook, 97th ed. (2016), ΔfH°(298.15 K), worked by hand in HandbookSpinelWindowTests: the four vertices
        // (Δμ_Mg, Δμ_O), element order Al, Mg, O there.
        (double X, double Y)[] expected = ExpectedVertices.Select(v => (v[1], v[2])).ToArray();
        foreach ((double X, double Y)[] drawn in new[] { back.WindowPoints(), back.VertexMarkers() })
        {
            Assert.Equal(expected.Length, drawn.Length);
            foreach ((double x, double y) in expected)
            {
                Assert.Single(drawn, p => Math.Abs(p.X - x) <= back.XTolerance && Math.Abs(p.Y - y) <= back.YTolerance);
            }
        }

        // The polygon goes round its boundary: the shoelace area of the drawn ring equals the hand-worked one.
        (double X, double Y)[] ring = back.WindowPoints();
        double[][] hand = [ExpectedVertices[0], ExpectedVertices[1], ExpectedVertices[3], ExpectedVertices[2]];
        double Shoelace(IReadOnlyList<(double X, double Y)> r) => Math.Abs(Enumerable.Range(0, r.Count).Sum(k => (r[k].X * r[(k + 1) % r.Count].Y) - (r[(k + 1) % r.Count].X * r[k].Y))) / 2;
        Assert.Equal(Shoelace(hand.Select(v => (v[1], v[2])).ToArray()), Shoelace(ring), 0.02);

        // MgO and Al2O3 bound the window; their lines are drawn and labelled with their formulas, and so are the
        // reference edges of Al (which follows from the spinel's equality) and O.
        XElement[] limits = back.Svg.Elements.Where(e => (string?)e.Attribute("data-kind") == "phase-limit").ToArray();
        Assert.Equal(["corundum", "periclase"], limits.Select(e => (string)e.Attribute("data-id")!).Order());
        Assert.All(limits, e => Assert.Equal("true", (string?)e.Attribute("data-bounds")));
        Assert.Contains(back.Svg.Elements, e => (string?)e.Attribute("data-kind") == "reference-edge" && (string?)e.Attribute("data-id") == "Al");
        var labels = back.Svg.Elements.Where(e => (string?)e.Attribute("data-kind") == "label").ToDictionary(e => (string)e.Attribute("data-id")!, e => e.Value);
        Assert.Equal("MgO", labels["periclase"]);
        Assert.Equal("Al2O3", labels["corundum"]);
        Assert.Equal("Δμ(Al) = 0", labels["Al"]);
        Assert.Equal(0, figure.CrowdedLabels);
        AssertTextStaysApartAndOnThePage(figure.Svg, "spinel");
    }

    [Fact]
    public void A_compound_on_a_hull_edge_is_drawn_as_a_segment_and_one_inside_a_facet_as_a_point()
    {
        // MgO + Al2O3 as one entry (on the tie-line exactly) and MgO + Al2O3 + O (inside the MgO-Al2O3-O facet),
        // without the spinel: windows of dimension 1 and 0 (handbook values as above).
        List<PhaseEntry> entries = [.. Oxides().Where(e => e.Id != "spinel"),
            Fu("edge", "Mg2Al2O5", (2 * Periclase) + Corundum), Fu("facet", "MgAl2O5", Periclase + Corundum)];
        SystemHull hull = SystemHull.OverElements(entries);
        foreach ((string id, int dimension) in new[] { ("edge", 1), ("facet", 0) })
        {
            StabilityWindow window = StabilityWindows.Of(hull, id);
            Assert.Equal(dimension, window.Dimension);
            WindowFigureResult figure = WindowFigure.Render(WindowMaps.Of(hull, id, "Al", "O"));
            Assert.Equal(dimension, figure.Dimension);
            ReadBack back = Read(figure.Svg);
            XElement drawn = back.Svg.Elements.Single(e => (string?)e.Attribute("data-kind") == "window");
            Assert.Equal(dimension.ToString(CultureInfo.InvariantCulture), (string?)drawn.Attribute("data-dimension") ?? "0");
            (double X, double Y)[] points = dimension == 0 ? back.VertexMarkers() : back.WindowPoints();
            Assert.Equal(window.Vertices.Count, points.Length);
            foreach (WindowVertex v in window.Vertices)
            {
                Assert.Single(points, p => Math.Abs(p.X - v.ChemicalPotentialsEv[0]) <= back.XTolerance && Math.Abs(p.Y - v.ChemicalPotentialsEv[2]) <= back.YTolerance);
            }

            // No area is shaded and the notes say why.
            Assert.DoesNotContain(back.Svg.Elements, e => (string?)e.Attribute("data-kind") == "window" && (string?)e.Attribute("data-dimension") == "2");
            string notes = string.Join(" ", back.Svg.Elements.Where(e => (string?)e.Attribute("data-kind") == "note").Select(e => e.Value));
            Assert.Contains("so its window is no area", notes, StringComparison.Ordinal);
            AssertTextStaysApartAndOnThePage(figure.Svg, id);
        }
    }

    [Fact]
    public void A_section_of_a_four_element_window_at_a_vertex_is_the_slice_there()
    {
        (SystemHull hull, EntryStability compound) = FourElementCompound();
        StabilityWindow whole = StabilityWindows.Of(hull, compound.Id);
        string[] elements = [.. whole.Elements];
        foreach (WindowVertex vertex in whole.Vertices.Take(4))
        {
            var at = new Dictionary<string, double> { [elements[2]] = vertex.ChemicalPotentialsEv[2] };
            WindowMap map = WindowMaps.Of(hull, compound.Id, elements[0], elements[1], at);
            WindowSlice slice = StabilityWindows.Slice(hull, compound.Id, at);
            Assert.Equal(elements[3], map.DependentElement);
            Assert.Equal(slice.Slice.Dimension, map.Dimension);
            ReadBack back = Read(WindowFigure.Render(map).Svg);
            (double X, double Y)[] drawn = map.Dimension == 2 ? back.WindowPoints() : back.VertexMarkers();
            Assert.Equal(slice.Slice.Vertices.Count, drawn.Length);
            foreach (WindowVertex v in slice.Slice.Vertices)
            {
                Assert.Single(drawn, p => Math.Abs(p.X - v.ChemicalPotentialsEv[0]) <= back.XTolerance && Math.Abs(p.Y - v.ChemicalPotentialsEv[1]) <= back.YTolerance);
            }
        }

        // No section given: at the vertices' mean of the fixed element; the most abundant of the two others follows.
        WindowMap byDefault = WindowMaps.Of(hull, compound.Id, elements[0], elements[1]);
        Assert.True(byDefault.SectionChosenByDefault);
        Assert.Equal(2, byDefault.Dimension);
        string fixedElement = Assert.Single(byDefault.FixedPotentialsEv.Keys);
        int f = Array.IndexOf(elements, fixedElement);
        Assert.Equal(whole.Vertices.Average(v => v.ChemicalPotentialsEv[f]), byDefault.FixedPotentialsEv[fixedElement], 12);
        AssertTextStaysApartAndOnThePage(WindowFigure.Render(byDefault).Svg, "section");
    }

    [Fact]
    public void Bad_axes_and_sections_are_refused_with_what_and_where()
    {
        SystemHull hull = SystemHull.OverElements(Oxides());
        var e = Assert.Throws<WindowInputException>(() => WindowMaps.Of(hull, "spinel", "Ca", "O"));
        Assert.Equal(WindowInputSubject.MapAxis, e.Subject);
        Assert.Contains("Ca is not an element of Al-Mg-O", e.Message, StringComparison.Ordinal);
        Assert.Throws<WindowInputException>(() => WindowMaps.Of(hull, "spinel", "O", "O"));
        e = Assert.Throws<WindowInputException>(() => WindowMaps.Of(hull, "spinel", "Mg", "O", new Dictionary<string, double> { ["Al"] = -1 }));
        Assert.Contains("takes no section potentials", e.Message, StringComparison.Ordinal);
        (SystemHull four, EntryStability compound) = FourElementCompound();
        string[] elements = [.. four.Components];
        e = Assert.Throws<WindowInputException>(() => WindowMaps.Of(four, compound.Id, elements[0], elements[1],
            new Dictionary<string, double> { [elements[2]] = -1, [elements[3]] = -1 }));
        Assert.Contains("fixes all but one", e.Message, StringComparison.Ordinal);
        e = Assert.Throws<WindowInputException>(() => WindowMaps.Of(four, compound.Id, elements[0], elements[1], new Dictionary<string, double> { [elements[0]] = -1 }));
        Assert.Contains("is an axis of the map", e.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Above_the_hull_there_is_nothing_to_shade_and_the_figure_says_so()
    {
        List<PhaseEntry> entries = [.. Oxides(), Fu("high", "MgAl2O4", Spinel + 50)];
        WindowFigureResult figure = WindowFigure.Render(WindowMaps.Of(SystemHull.OverElements(entries), "high", "Mg", "O"));
        Assert.Equal(-1, figure.Dimension);
        Assert.StartsWith("No window: MgAl2O4 is", string.Join(" ", new SvgFigure(figure.Svg).Elements.Where(e => (string?)e.Attribute("data-kind") == "note").Select(e => e.Value)), StringComparison.Ordinal);
        Assert.DoesNotContain("data-kind=\"window\"", figure.Svg, StringComparison.Ordinal);
    }

    /// <summary>A seeded random quaternary (A-B-C-D as Co-Li-Mn-O) whose compound LiCoMnO4 is a hull vertex.</summary>
    internal static (SystemHull Hull, EntryStability Compound) FourElementCompound()
    {
        string[] elements = ["Co", "Li", "Mn", "O"];
        var rng = new Random(4_040);
        var entries = new List<PhaseEntry>();
        foreach (string e in elements) entries.Add(new PhaseEntry($"el-{e}", Hull.Core.Chemistry.Composition.OfElement(e), 0, EnergyBasis.FormationPerAtom));
        entries.Add(new PhaseEntry("host", Hull.Core.Chemistry.Composition.Parse("LiCoMnO4"), -2.2, EnergyBasis.FormationPerAtom));
        var seen = new HashSet<string> { "LiCoMnO4" };
        while (entries.Count < 40)
        {
            long[] a = elements.Select(_ => (long)rng.Next(0, 5)).ToArray();
            if (a.Count(v => v > 0) < 2) continue;
            string formula = string.Concat(elements.Zip(a).Where(p => p.Second > 0).Select(p => p.First + p.Second));
            if (!seen.Add(Hull.Core.Chemistry.Composition.Parse(formula).ReducedFormula)) continue;
            double oxygen = a[3] / (double)a.Sum();
            entries.Add(new PhaseEntry($"p{entries.Count}", Hull.Core.Chemistry.Composition.Parse(formula), (-3.4 * oxygen * (1 - oxygen)) - (0.3 * rng.NextDouble()), EnergyBasis.FormationPerAtom));
        }

        SystemHull hull = SystemHull.OverElements(entries, elements: elements);
        EntryStability host = hull.GetEntry("host");
        Assert.True(host.IsHullVertex);
        return (hull, host);
    }

    /// <summary>
    /// Every text's estimated box (0.62 em a character, the figures' label estimate; formulas by their subscripts)
    /// inside the page, the labels' boxes apart from each other; then rendered by rsvg-convert (Debian librsvg2-bin):
    /// no ink within 2 px of the page's edges, and ink in the plot.
    /// </summary>
    internal static void AssertTextStaysApartAndOnThePage(string svg, string name)
    {
        var figure = new SvgFigure(svg);
        var boxes = new List<(string Text, double Left, double Top, double Right, double Bottom, bool Label)>();
        foreach (XElement text in figure.Elements.Where(e => e.Name.LocalName == "text" && e.Attribute("transform") is null))
        {
            double x = SvgFigure.Attr(text, "x"), y = SvgFigure.Attr(text, "y"), size = SvgFigure.Attr(text, "font-size");
            bool label = (string?)text.Attribute("data-kind") == "label";
            double width = label ? LabelWidth(text.Value, size) : text.Value.Length * 0.62 * size;
            string anchor = (string?)text.Attribute("text-anchor") ?? "start";
            double left = anchor == "middle" ? x - (width / 2) : anchor == "end" ? x - width : x;
            boxes.Add((text.Value, left, y - (0.82 * size), left + width, y + (0.43 * size), label));
        }

        foreach (var b in boxes)
        {
            Assert.True(b.Left >= 0 && b.Right <= figure.Width && b.Top >= 0 && b.Bottom <= figure.Height, $"'{b.Text}' leaves the page: {b.Left:F1}..{b.Right:F1} x {b.Top:F1}..{b.Bottom:F1}");
        }

        var labels = boxes.Where(b => b.Label).ToArray();
        for (int i = 0; i < labels.Length; i++)
        {
            for (int j = i + 1; j < labels.Length; j++)
            {
                bool apart = labels[i].Right <= labels[j].Left || labels[j].Right <= labels[i].Left || labels[i].Bottom <= labels[j].Top || labels[j].Bottom <= labels[i].Top;
                Assert.True(apart, $"labels '{labels[i].Text}' and '{labels[j].Text}' overlap");
            }
        }

        using var scratch = new ScratchFolder("rsvg-window-" + name);
        File.WriteAllText(scratch.File("map.svg"), svg);
        ToolProcess.Run("rsvg-convert", ["--output", scratch.File("map.png"), scratch.File("map.svg")], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(scratch.File("map.png")));
        Assert.Equal((int)figure.Width, png.Width);
        int edgeInk = 0, plotInk = 0;
        for (int y = 0; y < png.Height; y++)
        {
            for (int x = 0; x < png.Width; x++)
            {
                var (r, g, b, a) = png.At(x, y);
                if (a == 0 || (r > 235 && g > 235 && b > 235)) continue;
                if (x < 2 || y < 2 || x >= png.Width - 2 || y >= png.Height - 2) edgeInk++;
                if (x > WindowFigure.PlotLeft + 2 && x < WindowFigure.PlotRight - 2 && y > WindowFigure.PlotTop + 2 && y < WindowFigure.PlotBottom - 2) plotInk++;
            }
        }

        Assert.Equal(0, edgeInk);
        Assert.True(plotInk > 500, $"the plot has {plotInk} inked pixels");
    }

    // A formula's width with its subscripts at 0.72 of the size (FormulaText's rule, common practice), 2 px of slack.
    private static double LabelWidth(string text, double size)
    {
        double width = 0;
        char previous = '\0';
        bool inSubscript = false;
        foreach (char c in text)
        {
            inSubscript = (char.IsAsciiDigit(c) || (c == '.' && inSubscript)) && (inSubscript || char.IsAsciiLetter(previous) || previous == ')');
            width += 0.62 * size * (inSubscript ? 0.72 : 1);
            previous = c;
        }

        return width + 2;
    }
}
