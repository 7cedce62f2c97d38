using System.Globalization;
using System.Xml.Linq;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// DrawWindowFigure over gRPC: the polygon drawn for a section of a four-element window, read back from the SVG through
/// the plot box and ranges it records, equals what SliceStabilityWindow answers at the same potentials; bad axes and
/// sections name their field.
/// </summary>
public sealed class WindowFigureServiceTests : IAsyncLifetime
{
    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        await Data.CreateWithAsync(C, "q", [.. Data.LiCoO(), Data.Formation("Al", "Al", 0), Data.Formation("LiAlO2", "LiAlO2", -2.3),
            Data.Formation("Al2O3", "Al2O3", -2.4), Data.Formation("Li2CoAlO4", "Li2CoAlO4", -2.15)]);
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    [Fact]
    public async Task A_section_at_a_vertex_draws_what_the_slice_call_answers()
    {
        var compound = new CompoundRef { EntryId = "Li2CoAlO4" };
        StabilityWindow whole = (await C.Windows.GetStabilityWindowAsync(new GetStabilityWindowRequest { Dataset = "q", Compound = compound }, C.Call())).Window;
        Assert.Equal(["Al", "Co", "Li", "O"], whole.Elements);
        Assert.Equal(3, whole.Dimension);
        foreach (WindowVertex vertex in whole.Vertices)
        {
            var at = new FixedPotential { Element = "Al", ChemicalPotentialEv = vertex.ChemicalPotentialsEv[0] };
            DrawWindowFigureResponse figure = await C.Windows.DrawWindowFigureAsync(
                new DrawWindowFigureRequest { Dataset = "q", Compound = compound, XElement = "Li", YElement = "Co", Section = { at } }, C.Call());
            SliceStabilityWindowResponse slice = await C.Windows.SliceStabilityWindowAsync(
                new SliceStabilityWindowRequest { Dataset = "q", Compound = compound, FixedPotentials = { at } }, C.Call());
            Assert.Equal("O", figure.DependentElement);
            Assert.Equal(slice.Slice.Dimension, figure.DrawnDimension);
            Assert.Equal(slice.Slice.Vertices.Count, figure.DrawnVertices.Count);

            // The drawn polygon (or, for a segment or a point, the vertex markers) read back in eV.
            XDocument svg = XDocument.Parse(figure.Svg);
            XElement meta = svg.Descendants().Single(e => e.Name.LocalName == "figure");
            double[] Numbers(string text) => text.Split([' ', ',', 'M', 'L', 'Z'], StringSplitOptions.RemoveEmptyEntries).Select(t => double.Parse(t, CultureInfo.InvariantCulture)).ToArray();
            double[] plot = Numbers((string)meta.Attribute("plot")!), xr = Numbers((string)meta.Attribute("x-range")!), yr = Numbers((string)meta.Attribute("y-range")!);
            (double, double) ToEv(double px, double py) => (xr[0] + ((px - plot[0]) / plot[2] * (xr[1] - xr[0])), yr[0] + ((plot[1] + plot[3] - py) / plot[3] * (yr[1] - yr[0])));
            XElement? polygon = svg.Descendants().SingleOrDefault(e => (string?)e.Attribute("data-kind") == "window" && e.Name.LocalName == "path" && (string?)e.Attribute("data-dimension") == "2");
            (double X, double Y)[] drawn = polygon is not null
                ? Numbers((string)polygon.Attribute("d")!).Chunk(2).Select(p => ToEv(p[0], p[1])).ToArray()
                : svg.Descendants().Where(e => (string?)e.Attribute("data-kind") == "window-vertex")
                    .Select(e => ToEv(double.Parse((string)e.Attribute("cx")!, CultureInfo.InvariantCulture), double.Parse((string)e.Attribute("cy")!, CultureInfo.InvariantCulture))).ToArray();
            double tx = 0.051 / plot[2] * (xr[1] - xr[0]), ty = 0.051 / plot[3] * (yr[1] - yr[0]);
            Assert.Equal(slice.Slice.Vertices.Count, drawn.Length);
            foreach (WindowVertex v in slice.Slice.Vertices)
            {
                Assert.Single(drawn, p => Math.Abs(p.X - v.ChemicalPotentialsEv[2]) <= tx && Math.Abs(p.Y - v.ChemicalPotentialsEv[1]) <= ty);
                Assert.Single(figure.DrawnVertices, d => d.ChemicalPotentialsEv.Zip(v.ChemicalPotentialsEv).All(t => Math.Abs(t.First - t.Second) <= 1e-12));
            }
        }
    }

    [Fact]
    public async Task Default_axes_and_section_are_said()
    {
        DrawWindowFigureResponse figure = await C.Windows.DrawWindowFigureAsync(
            new DrawWindowFigureRequest { Dataset = "q", Compound = new CompoundRef { Formula = "Li2CoAlO4" } }, C.Call());
        Assert.Equal(("Al", "Co"), (figure.XElement, figure.YElement));
        Assert.True(figure.SectionChosenByDefault);
        Assert.Equal("Li", Assert.Single(figure.Section).Element);
        Assert.Equal(2, figure.DrawnDimension);
        Assert.Contains("content-sha256=", figure.Svg, StringComparison.Ordinal);
    }

    public static TheoryData<string, string, string> BadFigures() => new()
    {
        { "one-axis", "y_element", "name both axes" },
        { "axis-outside", "x_element", "Mg is not an element of Al-Co-Li-O" },
        { "same-axis", "y_element", "choose two different elements" },
        { "section-on-ternary", "section[0]", "takes no section potentials" },
        { "section-count", "section", "fixes all but one" },
        { "section-on-axis", "section[0]", "is an axis of the map" },
    };

    [Theory]
    [MemberData(nameof(BadFigures))]
    public async Task Bad_figure_requests_name_their_field(string question, string field, string text)
    {
        var request = new DrawWindowFigureRequest { Dataset = "q", Compound = new CompoundRef { EntryId = "Li2CoAlO4" } };
        switch (question)
        {
            case "one-axis": request.XElement = "Li"; break;
            case "axis-outside": (request.XElement, request.YElement) = ("Mg", "Li"); break;
            case "same-axis": (request.XElement, request.YElement) = ("Li", "Li"); break;
            case "section-on-ternary":
                request.Compound = new CompoundRef { EntryId = "LiCoO2" };
                request.Section.Add(new FixedPotential { Element = "O", ChemicalPotentialEv = -1 });
                break;
            case "section-count":
                (request.XElement, request.YElement) = ("Li", "Co");
                request.Section.Add(new FixedPotential { Element = "Al", ChemicalPotentialEv = -1 });
                request.Section.Add(new FixedPotential { Element = "O", ChemicalPotentialEv = -1 });
                break;
            default:
                (request.XElement, request.YElement) = ("Li", "Co");
                request.Section.Add(new FixedPotential { Element = "Li", ChemicalPotentialEv = -1 });
                break;
        }

        RpcException e = await Assert.ThrowsAsync<RpcException>(() => C.Windows.DrawWindowFigureAsync(request, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        Assert.Contains(text, e.Status.Detail);
        Assert.Equal(field, Assert.Single(Data.Violations(e)).Field);
    }
}
