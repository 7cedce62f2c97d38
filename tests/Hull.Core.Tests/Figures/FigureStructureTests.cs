using System.Globalization;
using System.Xml.Linq;
using Hull.Core.Figures;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>Every figure kind is well-formed SVG that shows every stable phase and edge, and nothing off the canvas.</summary>
public sealed class FigureStructureTests
{
    public static TheoryData<string, int> Systems => new()
    {
        { "Fe-O", 3 }, { "Co-Li-O", 11 }, { "Co-Li-Ni-O", 23 },
    };

    [Theory]
    [MemberData(nameof(Systems))]
    public void Figure_is_well_formed_complete_and_inside_its_view_box(string system, int seed)
    {
        string[] elements = system.Split('-');
        (SystemHull hull, _) = FigureTestData.Random(elements, 60, seed);
        var options = new FigureOptions { MaxAboveHullEvPerAtom = 0.3 };
        FigureResult result = FigureTestData.Draw(hull, options);
        var svg = new SvgFigure(result.Svg);

        // No NaN or infinity anywhere in the text (attribute values or content).
        Assert.DoesNotContain("NaN", result.Svg, StringComparison.Ordinal);
        Assert.DoesNotContain("Infinity", result.Svg, StringComparison.Ordinal);
        Assert.DoesNotContain("∞", result.Svg, StringComparison.Ordinal);

        foreach ((double x, double y, string what) in svg.Extents())
        {
            Assert.True(x >= 0 && x <= svg.Width && y >= 0 && y <= svg.Height, $"<{what}> at ({x}, {y}) is outside the view box {svg.Width} x {svg.Height}");
        }

        // Every element that stands for a phase or an edge names it.
        Assert.All(svg.OfKind("phase"), e => Assert.False(string.IsNullOrEmpty((string?)e.Attribute("data-id"))));
        Assert.All(svg.OfKind("label"), e => Assert.False(string.IsNullOrEmpty((string?)e.Attribute("data-id"))));
        Assert.All(svg.OfKind("edge"), e => Assert.False(string.IsNullOrEmpty((string?)e.Attribute("data-from")) || string.IsNullOrEmpty((string?)e.Attribute("data-to"))));

        // Every stable phase is marked and labelled; every tie-line of the hull is drawn once, and nothing else.
        Dictionary<string, XElement> markers = svg.Markers;
        var labelled = svg.OfKind("label").Select(e => (string)e.Attribute("data-id")!).ToHashSet(StringComparer.Ordinal);
        foreach (HullPhase phase in hull.StablePhases)
        {
            Assert.True(markers.ContainsKey(phase.Id), $"stable phase {phase.Id} has no marker");
            Assert.Contains(phase.Id, labelled);
        }

        var drawn = svg.Edges.Select(e => (e.First, e.Second)).ToList();
        Assert.Equal(hull.TieLines.Select(t => (t.First.Id, t.Second.Id)).Order(), drawn.Order());
        Assert.Equal(result.EdgeCount, drawn.Count);

        // Unstable entries within the cut-off are drawn with their energy above hull readable in the title; the rest are not drawn.
        foreach (EntryStability e in hull.Entries.Where(e => !e.IsHullVertex))
        {
            if (e.EnergyAboveHullEvPerAtom <= options.MaxAboveHullEvPerAtom)
            {
                string title = markers[e.Id].Element(SvgFigure.Svg + "title")!.Value;
                Assert.Contains(e.EnergyAboveHullEvPerAtom.ToString("0.000", CultureInfo.InvariantCulture) + " eV/atom above hull", title);
            }
            else
            {
                Assert.False(markers.ContainsKey(e.Id), $"{e.Id} is {e.EnergyAboveHullEvPerAtom} above the hull, past the cut-off, but drawn");
            }
        }

        int hidden = hull.Entries.Count(e => !e.IsHullVertex && e.EnergyAboveHullEvPerAtom > options.MaxAboveHullEvPerAtom);
        Assert.Equal(hidden, result.HiddenAboveCutoffCount);
        Assert.True(hidden > 0 && result.UnstableShownCount > 0, "the generated data should have entries on both sides of the cut-off");

        // Provenance in the metadata.
        XElement meta = svg.Document.Root!.Element(SvgFigure.Svg + "metadata")!.Elements().Single();
        Assert.Equal(FigureMetadataNames.Namespace, meta.Name.NamespaceName);
        Assert.Equal(hull.SystemName, (string)meta.Attribute("system")!);
        Assert.Equal("figure-test", (string)meta.Attribute("dataset")!);
        Assert.Equal("7", (string)meta.Attribute("version")!);
        Assert.Equal(new string('a', 64), (string)meta.Attribute("content-sha256")!);
        Assert.Equal("eV/atom", (string)meta.Attribute("energy-unit")!);
    }

    [Fact]
    public void Formulas_are_drawn_with_real_subscripts()
    {
        (SystemHull hull, _) = FigureTestData.Random(["Co", "Li", "O"], 40, 5);
        var svg = new SvgFigure(FigureTestData.Draw(hull).Svg);
        XElement label = svg.OfKind("label").First(e => e.Elements().Any());
        XElement sub = label.Elements(SvgFigure.Svg + "tspan").First(t => t.Attribute("font-size") is not null);
        Assert.True(SvgFigure.Attr(sub, "dy") > 0, "a subscript drops below the baseline");
        Assert.True(SvgFigure.Attr(sub, "font-size") < SvgFigure.Attr(label, "font-size"), "a subscript is smaller");
        Assert.True(sub.Value.All(c => char.IsAsciiDigit(c) || c == '.'), $"subscript '{sub.Value}' holds only the amount");
    }
}
