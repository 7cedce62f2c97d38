using Hull.Core.Tests.References;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// Each figure kind renders with rsvg-convert (Debian librsvg2-bin) to a PNG whose plot area is drawn on, with the
/// stable phases' colour at their markers.
/// </summary>
public sealed class RenderTests
{
    /// <summary>Share of the plot area's pixels that must differ from white: the frame and edges alone cover more.</summary>
    private const double MinimumInkShare = 0.01;

    public static TheoryData<string, double, double, double, double> Kinds => new()
    {
        // System, then the plot area (left, top, right, bottom) in figure px from the layouts' documented numbers.
        { "Fe-O", 90, 70, 560, 430 },
        { "Co-Li-O", 80, 144, 560, 560 },
        { "Co-Li-Ni-O", 80, 130, 520, 570 },
    };

    [Theory]
    [MemberData(nameof(Kinds))]
    public void Renders_to_a_png_with_a_drawn_plot_area(string system, double left, double top, double right, double bottom)
    {
        (SystemHull hull, _) = FigureTestData.Random(system.Split('-'), 40, 17);
        var figure = FigureTestData.Draw(hull);
        using var scratch = new ScratchFolder("rsvg");
        string svgPath = scratch.File("figure.svg");
        string pngPath = scratch.File("figure.png");
        File.WriteAllText(svgPath, figure.Svg);
        ToolProcess.Run("rsvg-convert", ["--output", pngPath, svgPath], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(pngPath));
        var svg = new SvgFigure(figure.Svg);
        Assert.Equal((int)svg.Width, png.Width);
        Assert.Equal((int)svg.Height, png.Height);

        int ink = 0, total = 0;
        for (int y = (int)top; y < (int)bottom; y++)
        {
            for (int x = (int)left; x < (int)right; x++)
            {
                var (r, g, b, a) = png.At(x, y);
                total++;
                if (a > 0 && (r < 240 || g < 240 || b < 240)) ink++;
            }
        }

        Assert.True(ink >= MinimumInkShare * total, $"only {ink} of {total} plot-area pixels are drawn on");

        // At each stable phase's marker centre the stable colour #23378a shows (anti-aliasing allowed for). In a
        // projected tetrahedron a marker can lie behind another phase or its label, so there most, not all, must.
        var missing = new List<string>();
        foreach (HullPhase phase in hull.StablePhases)
        {
            (double cx, double cy) = svg.CentreOf(svg.Markers[phase.Id]);
            var (r, g, b, _) = png.At((int)Math.Round(cx), (int)Math.Round(cy));
            if (!(Math.Abs(r - 0x23) < 40 && Math.Abs(g - 0x37) < 40 && Math.Abs(b - 0x8a) < 40)) missing.Add($"{phase.Id} at ({cx}, {cy}) shows rgb({r}, {g}, {b})");
        }

        int allowed = system.Split('-').Length == 4 ? hull.StablePhases.Count / 5 : 0;
        Assert.True(missing.Count <= allowed, string.Join("; ", missing));
    }
}
