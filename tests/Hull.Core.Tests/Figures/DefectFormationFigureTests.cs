using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Figures;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// The formation-energy figure: the lowest line of a constructed defect drawn through its hand-worked transition
/// levels at the documented layout's positions, and rendered by rsvg-convert (Debian librsvg2-bin).
/// </summary>
public sealed class DefectFormationFigureTests
{
    // A constructed defect: E_f(q; E_F) = a_q + q E_F with a_{+2} = 1.0, a_{+1} = 2.0, a_0 = 3.5 eV, gap 3 eV.
    // ε(+2/+1) = (1.0 − 2.0)/(1 − 2) = 1.0 eV, ε(+1/0) = (2.0 − 3.5)/(0 − 1) = 1.5 eV; the lowest line runs
    // (0, 1.0), (1.0, 3.0), (1.5, 3.5), (3, 3.5).
    private static DefectFigureInput Input(double min = 0, double max = 3) => new(
        "MgO", "window vertex 1 (with O)", "Δμ(Mg) = −6 eV, Δμ(O) = 0 eV", 3.0, min, max,
        [new DefectFigureLine("V_O", new Dictionary<int, double> { [2] = 1.0, [1] = 2.0, [0] = 3.5 }),
         new DefectFigureLine("V_Mg", new Dictionary<int, double> { [0] = 3.0, [-1] = 3.2 })],
        new FigureMetadata("d", 3, "ab"), "s", 2);

    [Fact]
    public void The_lowest_line_breaks_at_the_hand_worked_levels()
    {
        DefectFigureResult figure = DefectFormationFigure.Draw(Input());
        XDocument svg = XDocument.Parse(figure.Svg);
        XElement line = svg.Descendants().Single(e => e.Name.LocalName == "polyline" && (string?)e.Attribute("data-defect") == "V_O");
        // Layout: plot x from 84 to 580 px over E_F 0..3; y from 440 (bottom) to 78 (top). V_Mg's line is
        // min(3.0, 3.2 − E_F): from 3.0 down to 0.2 at E_F = 3, so the energies span 0.2 to 3.5, which
        // AxisTicks rounds out to 0..4 in steps of 1 (span 3.3, raw step 0.66 → 1).
        double X(double e) => 84 + e / 3.0 * 496;
        double Y(double e) => 78 + (4.0 - e) / 4.0 * 362;
        (double, double)[] expected = [(X(0), Y(1.0)), (X(1.0), Y(3.0)), (X(1.5), Y(3.5)), (X(3), Y(3.5))];
        var drawn = ((string)line.Attribute("points")!).Split(' ').Select(p => p.Split(','))
            .Select(p => (double.Parse(p[0], CultureInfo.InvariantCulture), double.Parse(p[1], CultureInfo.InvariantCulture))).ToArray();
        Assert.Equal(expected.Length, drawn.Length);
        for (int i = 0; i < expected.Length; i++)
        {
            Assert.Equal(expected[i].Item1, drawn[i].Item1, 0.051);
            Assert.Equal(expected[i].Item2, drawn[i].Item2, 0.051);
        }

        // ε(+2/+1), ε(+1/0) of V_O and ε(0/−1) = (3.0 − 3.2)/(−1 − 0) = 0.2 eV of V_Mg.
        Assert.Equal(3, figure.MarkedLevelCount);
        Assert.Equal(3, svg.Descendants().Count(e => (string?)e.Attribute("data-kind") == "level"));
        Assert.Equal(2, figure.DefectCount);
    }

    [Fact]
    public void Renders_with_rsvg_convert_and_shows_each_line_in_its_colour()
    {
        DefectFigureResult figure = DefectFormationFigure.Draw(Input(-0.5, 3.5));
        using var scratch = new ScratchFolder("rsvg-defects");
        string svgPath = scratch.File("figure.svg"), pngPath = scratch.File("figure.png");
        File.WriteAllText(svgPath, figure.Svg);
        ToolProcess.Run("rsvg-convert", ["--output", pngPath, svgPath], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(pngPath));
        Assert.Equal(800, png.Width);
        Assert.Equal(540, png.Height);

        // The legend swatches (documented layout: x 606..640 px, y = 78 + 28 + 22 d − 4) carry each line's colour.
        var svg = XDocument.Parse(figure.Svg);
        var strokes = svg.Descendants().Where(e => e.Name.LocalName == "polyline").Select(e => (string)e.Attribute("stroke")!).ToArray();
        Assert.Equal(2, strokes.Distinct().Count());
        for (int d = 0; d < strokes.Length; d++)
        {
            var (r, g, b, _) = png.At(608, 78 + 28 + 22 * d - 4);
            int er = Convert.ToInt32(strokes[d][1..3], 16), eg = Convert.ToInt32(strokes[d][3..5], 16), eb = Convert.ToInt32(strokes[d][5..7], 16);
            Assert.True(Math.Abs(r - er) < 40 && Math.Abs(g - eg) < 40 && Math.Abs(b - eb) < 40, $"swatch {d} shows rgb({r}, {g}, {b}), not {strokes[d]}");
        }

        // The Fermi level outside the gap is shaded: left of the VBM (E_F < 0) at mid-height.
        var (sr, sg, sb, _) = png.At(86, 300);
        Assert.True(sr < 250 && sr == sg && sg == sb, $"the valence-band shade is rgb({sr}, {sg}, {sb})");
    }

    [Fact]
    public void An_empty_range_or_no_defect_is_refused()
    {
        Assert.Throws<FigureInputException>(() => DefectFormationFigure.Draw(Input(2, 2)));
        Assert.Throws<FigureInputException>(() => DefectFormationFigure.Draw(Input() with { Lines = [] }));
    }
}
