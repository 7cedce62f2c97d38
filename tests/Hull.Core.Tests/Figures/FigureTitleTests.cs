using System.Xml.Linq;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>The heading a figure shows: its components, then what kind of hull, as words a reader can read.</summary>
public sealed class FigureTitleTests
{
    [Fact]
    public void Pseudo_ternary_heading_reads_as_separate_words()
    {
        // Invented layered-oxide energies (eV/atom); only the components and the kind of hull matter here.
        PhaseEntry[] entries =
        [
            new("LCO", Composition.Parse("LiCoO2"), -1.80, EnergyBasis.FormationPerAtom),
            new("LNO", Composition.Parse("LiNiO2"), -1.50, EnergyBasis.FormationPerAtom),
            new("LMO", Composition.Parse("LiMnO2"), -1.90, EnergyBasis.FormationPerAtom),
            new("NMC", Composition.Parse("Li3CoNiMnO6"), -1.76, EnergyBasis.FormationPerAtom),
        ];
        var basis = new EndMemberBasis(
            [Composition.Parse("LiCoO2"), Composition.Parse("LiNiO2"), Composition.Parse("LiMnO2")], ["LiCoO2", "LiNiO2", "LiMnO2"]);
        SystemHull hull = SystemHull.OverEndMembers(entries, basis);
        var svg = new SvgFigure(PhaseDiagram.Draw(FigureInput.FromHull(hull, FigureTestData.Metadata)).Svg);

        XElement heading = svg.Elements.First(e => e.Name == SvgFigure.Svg + "text" && (string?)e.Attribute("font-weight") == "bold");
        // The heading is drawn with tspans for subscripts; its text content is what a reader (or a screen reader) gets.
        string shown = heading.Value.Replace('\u00a0', ' ');
        Assert.Equal("LiCoO2–LiNiO2–LiMnO2 pseudo-ternary hull", shown);
        // The space opens the tspan that rises back from the last subscript; without preserved white space a
        // renderer (rsvg-convert did) drops it and draws "LiMnO2pseudo-ternary".
        Assert.Equal("preserve", (string?)heading.Attribute(XNamespace.Xml + "space"));
        string documentTitle = svg.Document.Root!.Element(SvgFigure.Svg + "title")!.Value;
        Assert.StartsWith("LiCoO2-LiNiO2-LiMnO2 pseudo-ternary hull", documentTitle, StringComparison.Ordinal);
    }
}
