using Hull.Core.Defects;
using Hull.Core.Figures;
using Hull.Core.Tests.Defects;
using Hull.Core.Tests.References;

namespace Hull.Core.Tests.Figures;

/// <summary>The carrier figure: one line per defect and carrier, the Fermi level between the edges, rendered by rsvg-convert.</summary>
public sealed class CarrierFigureTests
{
    private static (double[] X, FermiLevelSolution[] Solutions) Sweep()
    {
        var calculator = new FormationEnergyCalculator(WorkedDefectStudy.Study(), WorkedDefectStudy.References, WorkedDefectStudy.Point);
        var ensemble = DefectEnsemble.FromCalculator(calculator);
        var model = new CarrierModel(ParabolicBands.FromEffectiveMasses(0.35, 2.0), ExtraDonorsPerCubicCentimetre: 1e17,
            GapTemperature: new GapTemperatureDependence(5e-4, 600, 0, 0.5));
        double[] x = [.. Enumerable.Range(0, 41).Select(i => 500 + 25.0 * i)];
        return (x, [.. x.Select(t => ChargeNeutrality.Solve(ensemble, model, t))]);
    }

    [Fact]
    public void Draws_each_defect_the_carriers_and_the_fermi_level_and_renders()
    {
        var (x, solutions) = Sweep();
        string text = CarrierFigure.Render("MgO:Li, worked study", CarrierFigureAxis.Temperature, x, solutions);
        var svg = new SvgFigure(text);
        Assert.Equal(["V_O", "Li_Mg", "V_O+Li_Mg"], svg.OfKind("defect").Select(e => (string)e.Attribute("data-id")!));
        Assert.Equal(["n", "p"], svg.OfKind("carrier").Select(e => (string)e.Attribute("data-id")!));
        var fermi = Assert.Single(svg.OfKind("fermi-level"));
        Assert.Equal(x.Length, ((string)fermi.Attribute("d")!).Count(c => c is 'M' or 'L'));

        using var scratch = new ScratchFolder("rsvg-carriers");
        string svgPath = scratch.File("carriers.svg"), pngPath = scratch.File("carriers.png");
        File.WriteAllText(svgPath, text);
        ToolProcess.Run("rsvg-convert", ["--output", pngPath, svgPath], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(pngPath));
        Assert.Equal((int)svg.Width, png.Width);
        // Both panels are drawn on (frames, grid, lines, band fills): the layout's panels are x 86–630, y 58–388 and 444–594.
        Assert.True(Ink(png, 86, 58, 630, 388) > 0.01, "upper panel empty");
        Assert.True(Ink(png, 86, 444, 630, 594) > 0.05, "lower panel empty");
    }

    [Fact]
    public void Along_a_path_the_x_axis_says_so()
    {
        var (x, solutions) = Sweep();
        double[] fractions = [.. x.Select((_, i) => (double)i / (x.Length - 1))];
        var svg = new SvgFigure(CarrierFigure.Render("path", CarrierFigureAxis.Path("O-rich", "O-lean"), fractions, solutions));
        Assert.Contains("Position from O-rich to O-lean (fraction of the way)", svg.Text);
        Assert.Contains("x-axis=\"Position from O-rich to O-lean\"", svg.Text);
    }

    [Fact]
    public void A_line_that_ends_below_the_floor_keeps_its_label_at_the_floor()
    {
        // The most abundant defect's total falls 30 decades over the second half of the sweep, far below the 16 decades shown.
        var (x, solutions) = Sweep();
        int half = x.Length / 2, top = solutions[half].Defects.Select((d, k) => (d.PerCubicCentimetre, k)).Max().k;
        FermiLevelSolution[] falling = [.. solutions.Select((s, i) => i <= half ? s : s with
        {
            Defects = [.. s.Defects.Select((d, k) => k != top ? d : d with { PerCubicCentimetre = d.PerCubicCentimetre * Math.Pow(10, -30.0 * (i - half) / (x.Length - 1 - half)) })],
        })];
        var svg = new SvgFigure(CarrierFigure.Render("falling", CarrierFigureAxis.Temperature, x, falling));
        string first = falling[0].Defects[top].Defect;
        var labels = svg.Document.Descendants().Where(e => e.Name.LocalName == "text" && e.Attribute("data-label-for") is not null).ToArray();
        string[] expected = [.. falling[0].Defects.Select(d => d.Defect), "n", "p"];
        Assert.Equal(expected.Order(), labels.Select(e => (string)e.Attribute("data-label-for")!).Order());
        var marked = Assert.Single(labels, e => e.Attribute("data-below-floor") is not null);
        Assert.Equal(first, (string)marked.Attribute("data-label-for")!);
        Assert.EndsWith("\u2193", marked.Value);
    }

    [Fact]
    public void Bad_sweeps_are_refused()
    {
        var (x, solutions) = Sweep();
        Assert.Throws<FigureInputException>(() => CarrierFigure.Render("t", CarrierFigureAxis.Temperature, x[..1], solutions[..1]));
        Assert.Throws<FigureInputException>(() => CarrierFigure.Render("t", CarrierFigureAxis.Temperature, [.. x.Reverse()], solutions));
    }

    private static double Ink(PngImage png, int left, int top, int right, int bottom)
    {
        int ink = 0, total = 0;
        for (int y = top; y < bottom; y++)
        {
            for (int x = left; x < right; x++)
            {
                var (r, g, b, a) = png.At(x, y);
                total++;
                if (a > 0 && (r < 240 || g < 240 || b < 240)) ink++;
            }
        }

        return (double)ink / total;
    }
}
