using Hull.Core.Figures;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>Figures that cannot be drawn as asked are refused with a message that says what and what to do.</summary>
public sealed class FigureInputErrorTests
{
    [Fact]
    public void More_than_four_components_are_refused_with_advice()
    {
        (SystemHull hull, _) = FigureTestData.Random(["Co", "Li", "Mn", "Ni", "O"], 10, 1);
        var e = Assert.Throws<FigureInputException>(() => FigureTestData.Draw(hull));
        Assert.Contains("5 components", e.Message, StringComparison.Ordinal);
        Assert.Contains("sub-system", e.Message, StringComparison.Ordinal);
        Assert.Contains("end-members", e.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(0.0, 0, 0, "MaxAboveHullEvPerAtom")]
    [InlineData(double.NaN, 0, 0, "MaxAboveHullEvPerAtom")]
    [InlineData(0.1, 400, 0, "AzimuthDegrees")]
    [InlineData(0.1, 0, -91, "ElevationDegrees")]
    public void Bad_options_are_named(double cutoff, double azimuth, double elevation, string parameter)
    {
        (SystemHull hull, _) = FigureTestData.Random(["Fe", "O"], 5, 1);
        var options = new FigureOptions { MaxAboveHullEvPerAtom = cutoff, AzimuthDegrees = azimuth, ElevationDegrees = elevation };
        var e = Assert.Throws<FigureInputException>(() => FigureTestData.Draw(hull, options));
        Assert.Equal(parameter, e.ParamName);
    }
}
