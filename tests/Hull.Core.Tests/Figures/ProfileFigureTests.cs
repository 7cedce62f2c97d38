using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Electrochemistry;
using Hull.Core.Thermo.Reactions;
using static Hull.Core.Tests.Thermo.OpenElementHullTests;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// The voltage-profile and reaction-profile figures: well-formed SVG whose drawn steps and breakpoints sit where
/// the profile's numbers say, rendered by rsvg-convert (Debian librsvg2-bin) to a PNG with ink on the curve.
/// </summary>
public sealed class ProfileFigureTests
{
    private static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    [Fact]
    public void Voltage_steps_are_drawn_at_the_plateau_voltages_and_render()
    {
        // The hand-worked Li-Sn host of InsertionVoltageTests: 0.80, 0.60, 0.30 V.
        VoltageProfile profile = InsertionVoltages.Profile(SystemHull.OverElements(
        [
            Formation("Li", "Li", 0), Formation("Sn", "Sn", 0), Formation("LiSn", "LiSn", -0.80),
            Formation("Li2Sn", "Li2Sn", -1.30), Formation("Li3Sn", "Li3Sn", -2.00), Formation("Li4Sn", "Li4Sn", -2.30),
        ]), Composition.Parse("Sn"), "Li");
        string svg = VoltageProfileFigure.Render(profile, new FigureMetadata("demo", 3, "ab12"));
        XDocument doc = XDocument.Parse(svg);
        XElement steps = doc.Descendants(Svg + "path").Single(p => (string?)p.Attribute("data-kind") == "voltage-steps");
        double[] ys = PathPoints((string)steps.Attribute("d")!).Select(p => p.Y).ToArray();
        Assert.Equal(6, ys.Length);
        // Equal voltage steps map to equal page distances: 0.80 → 0.60 and 0.60 → 0.30 differ by 2:3.
        Assert.Equal(2.0 / 3.0, (ys[2] - ys[0]) / (ys[4] - ys[2]), 2);
        Assert.Equal(3, doc.Descendants(Svg + "circle").Count(c => (string?)c.Attribute("data-kind") == "plateau"));
        Assert.Contains("0 K energies stand in for Gibbs energies", svg);
        AssertRenders(svg, (string)steps.Attribute("d")!);
    }

    [Fact]
    public void Reaction_breakpoints_are_drawn_and_render()
    {
        SystemHull hull = SystemHull.OverElements(
        [
            Formation("Li", "Li", 0), Formation("Fe", "Fe", 0), Formation("F", "F", 0),
            Formation("LiF", "LiF", -6.0), Formation("FeF2", "FeF2", -7.0),
        ]);
        ReactionProfile profile = PhaseReactions.Profile(hull, "Li", "FeF2");
        string svg = ReactionProfileFigure.Render(profile);
        XDocument doc = XDocument.Parse(svg);
        Assert.Equal(profile.Points.Count, doc.Descendants(Svg + "circle").Count(c => (string?)c.Attribute("data-kind") == "breakpoint"));
        XElement curve = doc.Descendants(Svg + "path").Single(p => (string?)p.Attribute("data-kind") == "reaction-energy");
        (double X, double Y)[] points = PathPoints((string)curve.Attribute("d")!);
        // The minimum at x = 2/5 is the lowest drawn point (largest page y).
        int lowest = Array.IndexOf(points, points.MaxBy(p => p.Y));
        Assert.Equal(profile.MostNegativeIndex, lowest);
        AssertRenders(svg, (string)curve.Attribute("d")!);
    }

    [Fact]
    public void Headings_and_x_names_write_formulas_with_subscripts_and_return_to_the_baseline()
    {
        SystemHull hull = SystemHull.OverElements(
        [
            Formation("Li", "Li", 0), Formation("Fe", "Fe", 0), Formation("F", "F", 0),
            Formation("LiF", "LiF", -6.0), Formation("FeF2", "FeF2", -7.0),
        ]);
        XDocument doc = XDocument.Parse(ReactionProfileFigure.Render(PhaseReactions.Profile(hull, "Li", "FeF2")));
        XElement heading = doc.Descendants(Svg + "text").First(t => t.Value.StartsWith("Reaction of", StringComparison.Ordinal));
        XElement xName = doc.Descendants(Svg + "text").Single(t => t.Value.StartsWith("atom fraction of", StringComparison.Ordinal));
        // The read text stays the plain sentence; the amount 2 of FeF2 is a lowered, smaller run (common practice for
        // chemical formulas), and the drops and rises of each line sum to zero so that what follows is on the baseline.
        Assert.Equal("Reaction of Li with FeF2", heading.Value);
        Assert.Equal("atom fraction of Li in the mixture", xName.Value);
        foreach (XElement line in new[] { heading, xName })
        {
            Assert.Equal("preserve", (string?)line.Attribute(XNamespace.Xml + "space"));
            double net = line.Descendants(Svg + "tspan").Sum(t => double.Parse((string?)t.Attribute("dy") ?? "0", CultureInfo.InvariantCulture));
            Assert.Equal(0.0, net, 9);
        }

        XElement two = heading.Descendants(Svg + "tspan").Single(t => t.Value == "2");
        Assert.True(double.Parse((string)two.Attribute("dy")!, CultureInfo.InvariantCulture) > 0);
    }

    private static (double X, double Y)[] PathPoints(string d) =>
        d.Split(['M', 'L'], StringSplitOptions.RemoveEmptyEntries)
            .Select(p => p.Trim().Split(' '))
            .Select(p => (double.Parse(p[0], CultureInfo.InvariantCulture), double.Parse(p[1], CultureInfo.InvariantCulture)))
            .ToArray();

    private static void AssertRenders(string svg, string curve)
    {
        using var scratch = new ScratchFolder("rsvg-profile");
        string svgPath = scratch.File("figure.svg"), pngPath = scratch.File("figure.png");
        File.WriteAllText(svgPath, svg);
        ToolProcess.Run("rsvg-convert", ["--output", pngPath, svgPath], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(pngPath));
        // Midway along the curve's first segment the curve's stroke shows (not white).
        (double X, double Y)[] points = PathPoints(curve);
        var (r, g, b, _) = png.At((int)Math.Round((points[0].X + points[1].X) / 2), (int)Math.Round((points[0].Y + points[1].Y) / 2));
        Assert.True(r < 230 || g < 230 || b < 230, $"the curve does not show: rgb({r}, {g}, {b})");
    }
}
