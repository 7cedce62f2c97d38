using System.Xml.Linq;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>The figure service over gRPC: each kind drawn from the stored data, and the refusals it documents.</summary>
public sealed class FigureServiceTests
{
    private static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    [Fact]
    public async Task Draws_binary_ternary_pseudo_ternary_and_quaternary_figures()
    {
        await using var s = await RunningServer.StartAsync();
        Entry[] entries =
        [
            .. Data.LiCoO(), Data.Formation("Ni", "Ni", 0), Data.Formation("NiO", "NiO", -1.1), Data.Formation("LiNiO2", "LiNiO2", -1.6),
            Data.Formation("LiCo0.5Ni0.5O2", "LiCo0.5Ni0.5O2", -1.72), Data.Formation("Li2Ni0.5Co0.5O3", "Li2Ni0.5Co0.5O3", -1.3),
        ];
        await Data.CreateWithAsync(s.Clients, "fig", entries);

        var binary = await s.Clients.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "O-Co" }, s.Clients.Call());
        Assert.Equal(FigureKind.Binary, binary.Kind);
        Assert.Equal("Co-O", binary.ChemicalSystem);
        AssertFigure(binary, "Co-O");

        var ternary = await s.Clients.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "Li-Co-O", MaxAboveHullEvPerAtom = 0.01 }, s.Clients.Call());
        Assert.Equal(FigureKind.Ternary, ternary.Kind);
        // LiCoO2-b lies 0.05 eV/atom above the hull: past the 0.01 cut-off.
        Assert.True(ternary.HiddenAboveCutoffCount >= 1);
        Assert.Equal(0.01, ternary.MaxAboveHullEvPerAtom);
        XDocument doc = AssertFigure(ternary, "Co-Li-O");
        Assert.DoesNotContain(doc.Descendants(), e => (string?)e.Attribute("data-id") == "LiCoO2-b");

        // The stable phases and tie-lines match what the stability service answers for the same hull.
        var facets = await s.Clients.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = "fig", ChemicalSystem = "Li-Co-O" }, s.Clients.Call());
        Assert.Equal(facets.TieLines.Count, ternary.EdgeCount);
        Assert.Equal(facets.StablePhases.Count, ternary.StablePhaseCount);
        var drawnEdges = doc.Descendants().Where(e => (string?)e.Attribute("data-kind") == "edge")
            .Select(e => ((string)e.Attribute("data-from")!, (string)e.Attribute("data-to")!)).Order().ToArray();
        Assert.Equal(facets.TieLines.Select(t => (t.FirstPhaseId, t.SecondPhaseId)).Order().ToArray(), drawnEdges);

        var pseudo = new DrawPhaseDiagramRequest { Dataset = "fig" };
        pseudo.EndMembers.Add(new EndMember { Formula = "LiCoO2" });
        pseudo.EndMembers.Add(new EndMember { Formula = "LiNiO2" });
        var pseudoBinary = await s.Clients.Figures.DrawPhaseDiagramAsync(pseudo, s.Clients.Call());
        Assert.Equal(FigureKind.Binary, pseudoBinary.Kind);
        Assert.Equal(["LiCoO2", "LiNiO2"], pseudoBinary.Components);
        XDocument pseudoDoc = AssertFigure(pseudoBinary, "LiCoO2-LiNiO2");
        Assert.Equal("true", (string?)pseudoDoc.Descendants().Single(e => e.Name.LocalName == "figure").Attribute("over-end-members"));

        var quaternary = await s.Clients.Figures.DrawPhaseDiagramAsync(
            new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "Li-Co-Ni-O", ViewAzimuthDegrees = 40, ViewElevationDegrees = -10 }, s.Clients.Call());
        Assert.Equal(FigureKind.Quaternary, quaternary.Kind);
        Assert.Contains("azimuth 40°, elevation -10°", quaternary.Svg, StringComparison.Ordinal);
        AssertFigure(quaternary, "Co-Li-Ni-O");
    }

    [Fact]
    public async Task Refuses_five_components_bad_options_and_mixed_requests()
    {
        await using var s = await RunningServer.StartAsync();
        await Data.CreateWithAsync(s.Clients, "fig", Data.LiCoO());
        var five = await Assert.ThrowsAsync<RpcException>(() =>
            s.Clients.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "Li-Co-Ni-Mn-O" }, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, five.StatusCode);
        Assert.Equal("chemical_system", Data.Violations(five).Single().Field);
        Assert.Contains("choose a sub-system of up to four elements, or up to four end-members", five.Status.Detail, StringComparison.Ordinal);

        var cutoff = await Assert.ThrowsAsync<RpcException>(() =>
            s.Clients.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "Li-O", MaxAboveHullEvPerAtom = -1 }, s.Clients.Call()).ResponseAsync);
        Assert.Equal("max_above_hull_ev_per_atom", Data.Violations(cutoff).Single().Field);

        var view = await Assert.ThrowsAsync<RpcException>(() =>
            s.Clients.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "Li-Co-O", ViewElevationDegrees = 120 }, s.Clients.Call()).ResponseAsync);
        Assert.Equal("view_elevation_degrees", Data.Violations(view).Single().Field);

        var mixed = new DrawPhaseDiagramRequest { Dataset = "fig", ChemicalSystem = "Li-Co-O" };
        mixed.EndMembers.Add(new EndMember { Formula = "LiCoO2" });
        mixed.EndMembers.Add(new EndMember { Formula = "Li2O" });
        var both = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Figures.DrawPhaseDiagramAsync(mixed, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, both.StatusCode);

        var missing = await Assert.ThrowsAsync<RpcException>(() =>
            s.Clients.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = "nope", ChemicalSystem = "Li-O" }, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.NotFound, missing.StatusCode);
    }

    private static XDocument AssertFigure(DrawPhaseDiagramResponse response, string system)
    {
        XDocument doc = XDocument.Parse(response.Svg);
        Assert.Equal(Svg + "svg", doc.Root!.Name);
        XElement meta = doc.Descendants().Single(e => e.Name.LocalName == "figure");
        Assert.Equal(system, (string?)meta.Attribute("system"));
        Assert.Equal(response.Used.Dataset, (string?)meta.Attribute("dataset"));
        Assert.Equal(response.Used.Version.ToString(System.Globalization.CultureInfo.InvariantCulture), (string?)meta.Attribute("version"));
        Assert.Equal(response.Used.ContentSha256, (string?)meta.Attribute("content-sha256"));
        Assert.True(response.StablePhaseCount >= 2);
        Assert.Equal(response.StablePhaseCount, doc.Descendants().Count(e => (string?)e.Attribute("data-kind") == "phase" && e.Name.LocalName == "path"));
        return doc;
    }
}
