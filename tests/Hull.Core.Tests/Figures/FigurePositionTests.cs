using Hull.Core.Tests.Thermo;
using Hull.Core.Figures;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// Where points land, against literals worked out by hand from the layouts' documented numbers, not from the
/// code's own maps: the triangle has side 480 px with its bottom-left corner at (80, 560); the tetrahedron's
/// circumscribed sphere has radius 220 px about (300, 350); the binary's plot area is x 90..560, y 70..430.
/// </summary>
public sealed class FigurePositionTests
{
    /// <summary>Coordinates are written to 0.1 px.</summary>
    private const double Px = 0.051;

    [Fact]
    public void Ternary_corners_and_centroid()
    {
        SystemHull hull = SystemHull.OverElements([
            ThermoTestData.Formation("Co", "Co", 0), ThermoTestData.Formation("Li", "Li", 0), ThermoTestData.Formation("O", "O", 0),
            ThermoTestData.Formation("mid", "CoLiO", -1.0)]);
        var svg = new SvgFigure(FigureTestData.Draw(hull).Svg);
        // Equilateral triangle: apex height = side * sqrt(3) / 2 = 415.692; centroid a third of it up (common practice).
        AssertAt(svg, "Co", 80, 560);
        AssertAt(svg, "Li", 560, 560);
        AssertAt(svg, "O", 320, 144.308);
        AssertAt(svg, "mid", 320, 421.436);
    }

    [Fact]
    public void Binary_points_at_their_composition_and_energy()
    {
        SystemHull hull = SystemHull.OverElements([
            ThermoTestData.Formation("Fe", "Fe", 0), ThermoTestData.Formation("O", "O", 0),
            ThermoTestData.Formation("FeO", "FeO", -0.5), ThermoTestData.Formation("FeO3", "FeO3", -0.3),
            ThermoTestData.Formation("Fe3O", "Fe3O", -0.1)]);
        var svg = new SvgFigure(FigureTestData.Draw(hull).Svg);
        // Energies span -0.5..0, so the axis runs from -0.5 (bottom, y 430) to 0 (top, y 70): 720 px per eV/atom.
        AssertAt(svg, "Fe", 90, 70);
        AssertAt(svg, "O", 560, 70);
        AssertAt(svg, "FeO", 325, 430);
        AssertAt(svg, "FeO3", 442.5, 286);
        AssertAt(svg, "Fe3O", 207.5, 142);
    }

    [Theory]
    // Regular tetrahedron, apex up, unit corners (0,0,1), (sqrt(8/9),0,-1/3), (-sqrt(2/9),±sqrt(2/3),-1/3):
    // seen along +y at azimuth 0, elevation 0, the screen shows (x, z); at azimuth 90 the corners turn to (-y, x);
    // at elevation 90 the screen's up is the corners' y (common practice).
    [InlineData(0, 0, 300, 130, 507.4, 423.3, 196.3, 423.3, 196.3, 423.3)]
    [InlineData(90, 0, 300, 130, 300, 423.3, 120.4, 423.3, 479.6, 423.3)]
    [InlineData(0, 90, 300, 350, 507.4, 350, 196.3, 170.4, 196.3, 529.6)]
    public void Tetrahedron_corners_and_centroid_at_a_fixed_view(double azimuth, double elevation,
        double x0, double y0, double x1, double y1, double x2, double y2, double x3, double y3)
    {
        SystemHull hull = SystemHull.OverElements([
            ThermoTestData.Formation("Co", "Co", 0), ThermoTestData.Formation("Li", "Li", 0),
            ThermoTestData.Formation("Ni", "Ni", 0), ThermoTestData.Formation("O", "O", 0),
            ThermoTestData.Formation("mid", "CoLiNiO", -1.0)]);
        var svg = new SvgFigure(FigureTestData.Draw(hull, new FigureOptions { AzimuthDegrees = azimuth, ElevationDegrees = elevation }).Svg);
        AssertAt(svg, "Co", x0, y0);
        AssertAt(svg, "Li", x1, y1);
        AssertAt(svg, "Ni", x2, y2);
        AssertAt(svg, "O", x3, y3);
        AssertAt(svg, "mid", 300, 350);
    }

    private static void AssertAt(SvgFigure svg, string id, double x, double y)
    {
        (double X, double Y) at = svg.CentreOf(svg.Markers[id]);
        Assert.True(Math.Abs(at.X - x) <= Px && Math.Abs(at.Y - y) <= Px, $"{id} drawn at ({at.X}, {at.Y}), expected ({x}, {y})");
    }
}
