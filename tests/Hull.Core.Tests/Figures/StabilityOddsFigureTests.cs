using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Figures;
using Hull.Core.Tests.References;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Uncertainty;
using static Hull.Core.Tests.Thermo.ThermoTestData;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// The stability-odds ternary: one disc per entry at its composition (the ternary's documented layout, worked by
/// hand), its probability and shade as sampled, plain tie-lines behind, rendered by rsvg-convert (Debian librsvg2-bin).
/// </summary>
public sealed class StabilityOddsFigureTests
{
    private static (SystemHull Hull, StabilitySamplingResult Odds, string Svg) Draw()
    {
        PhaseEntry[] entries =
        [
            Formation("Li", "Li", 0), Formation("Co", "Co", 0), Formation("O", "O", 0),
            Formation("Li2O", "Li2O", -2.07), Formation("CoO", "CoO", -1.24), Formation("LiCoO2", "LiCoO2", -1.72),
            Formation("LiCoO2-b", "LiCoO2", -1.70), Formation("Co3O4", "Co3O4", -1.30), Formation("CoO2", "CoO2", -1.05),
        ];
        SystemHull hull = SystemHull.OverElements(entries);
        var sigma = entries.Where(e => e.Composition.Elements.Count > 1).Select(e => new EnergyUncertainty(e.Id, 0.02)).ToArray();
        StabilitySamplingResult odds = StabilitySampling.Run(hull, sigma, [], SamplingPlan.Fixed(1000, 7));
        return (hull, odds, StabilityOddsFigure.Draw(hull, odds, new FigureMetadata("demo", 3, new string('a', 64))));
    }

    [Fact]
    public void Each_entry_is_a_disc_at_its_composition_with_its_probability_and_shade()
    {
        (SystemHull hull, StabilitySamplingResult odds, string svg) = Draw();
        XDocument doc = XDocument.Parse(svg);
        var discs = doc.Descendants().Where(e => e.Name.LocalName == "circle" && e.Attribute("data-probability") is not null)
            .ToDictionary(e => (string)e.Attribute("data-id")!);
        Assert.Equal(odds.Entries.Count, discs.Count);
        foreach (EntryStabilityOdds o in odds.Entries)
        {
            XElement disc = discs[o.EntryId];
            Assert.Equal(o.VertexProbability, double.Parse((string)disc.Attribute("data-probability")!, CultureInfo.InvariantCulture), 1e-4);
            Assert.Equal(StabilityOddsScale.ColorAt(o.VertexProbability), (string)disc.Attribute("fill")!);
        }

        // Components Co, Li, O: Co at (80, 560), Li at (560, 560), O at (320, 560 − 480·√3/2 = 144.31). Li2O has
        // fractions (0, 2/3, 1/3): x = 2/3·560 + 1/3·320 = 480, y = 2/3·560 + 1/3·144.31 = 421.44 (written to 0.1 px).
        Assert.Equal(["Co", "Li", "O"], hull.Components);
        Assert.Equal(480.0, double.Parse((string)discs["Li2O"].Attribute("cx")!, CultureInfo.InvariantCulture), 0.06);
        Assert.Equal(421.44, double.Parse((string)discs["Li2O"].Attribute("cy")!, CultureInfo.InvariantCulture), 0.06);
        // Every plain tie-line is drawn once.
        Assert.Equal(hull.TieLines.Count, doc.Descendants().Count(e => (string?)e.Attribute("data-kind") == "edge"));
        // The two LiCoO2 polymorphs share the stable outcome: their probabilities sum to at most one.
        double pair = odds.Entries.Where(o => o.Formula == "LiCoO2").Sum(o => o.VertexProbability);
        Assert.InRange(pair, 0.99, 1.0);
    }

    [Fact]
    public void Renders_with_rsvg_convert_and_shows_each_disc_in_its_shade()
    {
        (_, StabilitySamplingResult odds, string svg) = Draw();
        using var scratch = new ScratchFolder("rsvg-odds");
        string svgPath = scratch.File("figure.svg"), pngPath = scratch.File("figure.png");
        File.WriteAllText(svgPath, svg);
        ToolProcess.Run("rsvg-convert", ["--output", pngPath, svgPath], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(pngPath));
        Assert.Equal((int)SimplexFigure.Width, png.Width);
        // Li2O's disc centre (worked above) shows its fill.
        string fill = StabilityOddsScale.ColorAt(odds.Entries.Single(o => o.EntryId == "Li2O").VertexProbability);
        var (r, g, b, _) = png.At(480, 421);
        int er = Convert.ToInt32(fill[1..3], 16), eg = Convert.ToInt32(fill[3..5], 16), eb = Convert.ToInt32(fill[5..7], 16);
        Assert.True(Math.Abs(r - er) < 30 && Math.Abs(g - eg) < 30 && Math.Abs(b - eb) < 30, $"Li2O's disc shows rgb({r}, {g}, {b}), not {fill}");
    }

    [Fact]
    public void The_shade_darkens_steadily_with_the_probability_and_a_non_ternary_is_refused()
    {
        double previous = double.MaxValue;
        for (int k = 0; k <= 20; k++)
        {
            double lightness = CieLabLightness(StabilityOddsScale.ColorAt(k / 20.0));
            Assert.True(lightness < previous - 1.0, $"L* at p = {k / 20.0} is {lightness}, not below {previous}");
            previous = lightness;
        }

        SystemHull binary = SystemHull.OverElements([Formation("A", "Li", 0), Formation("B", "Co", 0), Formation("AB", "LiCo", -0.1)]);
        StabilitySamplingResult odds = StabilitySampling.Run(binary, [], [], SamplingPlan.Fixed(10, 1));
        Assert.Throws<FigureInputException>(() => StabilityOddsFigure.Draw(binary, odds, new FigureMetadata("d", 1, "")));
    }

    // CIE L* of an sRGB colour (IEC 61966-2-1 transfer function, D65 white; common practice).
    private static double CieLabLightness(string hex)
    {
        double Linear(int c) => c / 255.0 <= 0.04045 ? c / 255.0 / 12.92 : Math.Pow((c / 255.0 + 0.055) / 1.055, 2.4);
        double y = 0.2126 * Linear(Convert.ToInt32(hex[1..3], 16)) + 0.7152 * Linear(Convert.ToInt32(hex[3..5], 16)) + 0.0722 * Linear(Convert.ToInt32(hex[5..7], 16));
        return y > 216.0 / 24389 ? 116 * Math.Cbrt(y) - 16 : 24389.0 / 27 * y;
    }
}
