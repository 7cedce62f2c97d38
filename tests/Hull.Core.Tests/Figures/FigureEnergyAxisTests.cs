using System.Xml.Linq;
using Hull.Core.Figures;
using Hull.Core.Tests.References;
using Hull.Core.Tests.Thermo;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>A figure labels its energy axis with the hull's own axis (name and unit), not a fixed formation energy.</summary>
public sealed class FigureEnergyAxisTests
{
    [Fact]
    public void Grand_potential_hull_figure_is_labelled_with_its_axis_and_unit()
    {
        PhaseEntry[] entries = DecompositionEnergyReferenceTests.RandomQuaternary(seed: 13, compounds: 40);
        HullAxis axis = HullAxis.GrandPotential([KeyValuePair.Create("O", -1.1)]);
        SystemHull hull = SystemHull.OnAxis(axis, GrandPotentialEntries.Of(entries, axis));
        string svg = PhaseDiagram.Draw(FigureInput.FromHull(hull, FigureTestData.Metadata)).Svg;
        _ = new SvgFigure(svg);
        Assert.Contains("Grand potential (O open at -1.1 eV)", svg, StringComparison.Ordinal);
        Assert.DoesNotContain("Formation energy", svg, StringComparison.Ordinal);
        Assert.Contains("eV per closed-element atom", svg, StringComparison.Ordinal);
    }

    [Fact]
    public void Free_energy_binary_figure_axis_title_names_the_temperature()
    {
        (SystemHull closed, _) = FigureTestData.Random(["Fe", "O"], 10, 2);
        HullAxis axis = HullAxis.FreeEnergy(900);
        SystemHull hull = SystemHull.OnAxis(axis, closed.Entries.Select(e => new HullAxisEntry(e.Entry, e.AxisEnergyEvPerAtom)).ToArray());
        string svg = PhaseDiagram.Draw(FigureInput.FromHull(hull, FigureTestData.Metadata)).Svg;
        Assert.Contains(">Formation free energy at 900 K (eV/atom)<", svg, StringComparison.Ordinal);
    }

    [Fact]
    public void A_long_energy_axis_title_of_a_binary_breaks_into_name_and_unit_and_stays_beside_the_plot()
    {
        // Two open elements make a grand-potential title too long for the plot's height on one rotated line.
        (SystemHull closed, _) = FigureTestData.Random(["Fe", "O"], 10, 2);
        HullAxis axis = HullAxis.GrandPotential([KeyValuePair.Create("Li", -2.125), KeyValuePair.Create("N", -0.3125)]);
        SystemHull hull = SystemHull.OnAxis(axis, closed.Entries.Select(e => new HullAxisEntry(e.Entry, e.AxisEnergyEvPerAtom)).ToArray());
        string svg = PhaseDiagram.Draw(FigureInput.FromHull(hull, FigureTestData.Metadata)).Svg;
        _ = new SvgFigure(svg);
        XDocument doc = XDocument.Parse(svg);
        XNamespace ns = "http://www.w3.org/2000/svg";
        XElement[] rotated = [.. doc.Descendants(ns + "text").Where(t => ((string?)t.Attribute("transform") ?? "").StartsWith("rotate(-90", StringComparison.Ordinal))];
        Assert.Equal(["Grand potential (Li open at -2.125 eV, N open at -0.3125 eV)", "(eV per closed-element atom)"], rotated.Select(t => t.Value));
        foreach (XElement line in rotated)
        {
            // Drawn length along the plot's height, estimated generously (0.62 em per character, the figures'
            // label-placement estimate): within the plot's vertical extent, so it meets neither heading nor axis.
            double size = double.Parse((string)line.Attribute("font-size")!, System.Globalization.CultureInfo.InvariantCulture);
            Assert.True(line.Value.Length * 0.62 * size <= BinaryFigure.PlotBottom - BinaryFigure.PlotTop, $"{line.Value} at {size} px");
            double x = double.Parse((string)line.Attribute("x")!, System.Globalization.CultureInfo.InvariantCulture);
            Assert.InRange(x, size, BinaryFigure.PlotLeft - 40);
        }

        // Rendered by rsvg-convert (Debian librsvg2-bin): the title's ink lies beside the plot, none of it below.
        using var scratch = new ScratchFolder("rsvg-axis-title");
        File.WriteAllText(scratch.File("figure.svg"), svg);
        ToolProcess.Run("rsvg-convert", ["--output", scratch.File("figure.png"), scratch.File("figure.svg")], scratch.Path, "librsvg2-bin");
        PngImage png = PngImage.Read(File.ReadAllBytes(scratch.File("figure.png")));
        int Ink(int top, int bottom)
        {
            int ink = 0;
            for (int y = top; y < bottom; y++)
            {
                for (int x = 5; x < 50; x++)
                {
                    var (r, g, b, a) = png.At(x, y);
                    if (a > 0 && (r < 200 || g < 200 || b < 200)) ink++;
                }
            }

            return ink;
        }

        Assert.True(Ink((int)BinaryFigure.PlotTop, (int)BinaryFigure.PlotBottom) > 200);

        // The legend's unit breaks after "per" and no text of it runs past the page's right edge (estimated as above).
        Assert.Equal(["(eV per", "closed-element atom)"], FigureLegend.UnitLines("eV per closed-element atom"));
        Assert.Equal(["(eV/atom)"], FigureLegend.UnitLines("eV/atom"));
        foreach (XElement text in doc.Descendants(ns + "text").Where(t => t.Attribute("transform") is null && (string?)t.Attribute("text-anchor") is null or "start"))
        {
            double x0 = double.Parse((string)text.Attribute("x")!, System.Globalization.CultureInfo.InvariantCulture);
            double size = double.Parse((string)text.Attribute("font-size")!, System.Globalization.CultureInfo.InvariantCulture);
            if (x0 < BinaryFigure.PlotRight) continue;
            Assert.True(x0 + (text.Value.Length * 0.62 * size) <= BinaryFigure.Width, $"'{text.Value}' at x {x0} runs off the page");
        }
        Assert.Equal(0, Ink((int)BinaryFigure.PlotBottom + 2, (int)BinaryFigure.PlotBottom + 60)); // above the footer line
    }
}
