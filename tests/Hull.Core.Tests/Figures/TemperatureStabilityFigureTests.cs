using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Figures;
using Hull.Core.Tests.References;
using Hull.Core.Tests.Thermo.Temperature;
using Hull.Core.Thermo.Temperature;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// The stability-against-temperature figure: crossing markers at the zero line where the decomposition temperatures
/// are (NBS Tables (1982) copper oxides, see <see cref="HandbookOxides"/>), the curves through the exact breakpoints,
/// rendered by rsvg-convert (Debian librsvg2-bin) to a PNG with the first curve's colour at a crossing marker.
/// </summary>
public sealed class TemperatureStabilityFigureTests
{
    private static (string Svg, TemperatureCurve[] Curves) CopperFigure()
    {
        ThermoSystem system = HandbookOxides.Ellingham(HandbookOxides.Copper(), 1.0);
        TemperatureCurve[] curves = new[] { "CuO", "Cu2O" }.Select(id =>
            TemperatureCurve.Of(system, DecompositionTemperatures.Find(system, id, 300, 2500), 200)).ToArray();
        return (TemperatureStabilityFigure.Render(curves, new FigureMetadata("oxides", 2, "cd34")), curves);
    }

    [Fact]
    public void Every_crossing_is_marked_on_the_zero_line_at_its_temperature()
    {
        (string svg, TemperatureCurve[] curves) = CopperFigure();
        XDocument doc = XDocument.Parse(svg);
        XElement[] markers = doc.Descendants().Where(e => (string?)e.Attribute("data-kind") == "crossing").ToArray();
        Assert.Equal(3, markers.Length);
        XElement zero = doc.Descendants().Single(e => (string?)e.Attribute("data-kind") == "zero");
        double zeroY = double.Parse(((string)zero.Attribute("d")!).Split(' ', 'L')[1], CultureInfo.InvariantCulture);
        double[] expected = [.. curves.SelectMany(c => c.Result.Crossings).Select(c => c.TemperatureK)];
        double[] drawn = [.. markers.Select(m => double.Parse((string)m.Attribute("data-temperature-k")!, CultureInfo.InvariantCulture))];
        Assert.Equal(expected.Length, drawn.Length);
        for (int i = 0; i < expected.Length; i++) Assert.Equal(expected[i], drawn[i], 0.01);
        Assert.All(markers, m => Assert.Equal(zeroY, double.Parse((string)m.Attribute("cy")!, CultureInfo.InvariantCulture), 0.01));
        // The Cu2O curve is straight between its ends, breakpoint and crossings: five points.
        Assert.Equal(5, curves[1].Points.Count);
        Assert.Contains("fire hazard", svg);
        Assert.Contains("dataset=\"oxides\"", svg);
    }

    [Fact]
    public void The_figure_renders_with_the_curve_colour_at_a_crossing()
    {
        (string svg, _) = CopperFigure();
        XElement marker = XDocument.Parse(svg).Descendants().First(e => (string?)e.Attribute("data-kind") == "crossing");
        using var scratch = new ScratchFolder("rsvg-temperature");
        string svgPath = scratch.File("figure.svg"), pngPath = scratch.File("figure.png");
        File.WriteAllText(svgPath, svg);
        ToolProcess.Run("rsvg-convert", ["--output", pngPath, svgPath], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(pngPath));
        int cx = (int)Math.Round(double.Parse((string)marker.Attribute("cx")!, CultureInfo.InvariantCulture));
        int cy = (int)Math.Round(double.Parse((string)marker.Attribute("cy")!, CultureInfo.InvariantCulture));
        var (r, g, b, _) = png.At(cx + 5, cy);
        Assert.True(r < 230 || g < 230 || b < 230, $"the marker's ring does not show: rgb({r}, {g}, {b})");
        File.Copy(svgPath, "/tmp/thermo-figure.svg", overwrite: true);
    }

    [Fact]
    public void Too_many_curves_or_none_are_refused()
    {
        Assert.Throws<FigureInputException>(() => TemperatureStabilityFigure.Render([]));
    }
}
