using Grpc.Core;
using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>
/// The demo's end-member and figure steps: the layered-oxide triangle as a pseudo-ternary hull, then phase diagrams
/// drawn by the server and written into a folder the demo names.
/// </summary>
public sealed class DemoFigures(TextWriter output)
{
    /// <summary>The folder the demo writes figures into when none is given.</summary>
    public const string DefaultFolder = "hull-demo-figures";

    private static readonly string[] LayeredOxides = ["LiCoO2", "LiNiO2", "LiMnO2"];

    public async Task RunEndMembersAsync(HullConnection hull, string dataset, CancellationToken t)
    {
        Heading("7b. The layered-oxide triangle as a pseudo-ternary hull over end-members LiCoO2, LiNiO2, LiMnO2");
        var phases = new GetStablePhasesRequest { Dataset = dataset };
        phases.EndMembers.AddRange(LayeredOxides.Select(f => new EndMember { Formula = f }));
        GetStablePhasesResponse stable = await hull.Stability.GetStablePhasesAsync(phases, hull.Call(t));
        output.WriteLine($"  {stable.Phases.Count} stable phases on the {stable.ChemicalSystem} hull (entries off the triangle, such as delithiated cells, take no part):");
        TableRenderer.WriteAligned(output, CommandTree.PhasesTable(stable.Phases), "  ");

        var ids = new GetEntryStabilityRequest { Dataset = dataset };
        ids.EntryIds.AddRange(["nmc-n04m04c04-A", "nmc-n06m06c00-B", "nmc-n00m01c11-A"]);
        // One end-member named by a stored entry, the others by formula.
        ids.EndMembers.Add(new EndMember { EntryId = "ter-LiCoO2-r3m" });
        ids.EndMembers.AddRange(LayeredOxides.Skip(1).Select(f => new EndMember { Formula = f }));
        GetEntryStabilityResponse byId = await hull.Stability.GetEntryStabilityAsync(ids, hull.Call(t));
        output.WriteLine("  Energy above the pseudo-ternary hull (LiCoO2 named by its entry ter-LiCoO2-r3m):");
        TableRenderer.WriteAligned(output, CommandTree.StabilityTable(byId.Results, byId.Used), "  ");
    }

    public async Task RunFiguresAsync(HullConnection hull, string dataset, string folder, CancellationToken t)
    {
        Heading($"10. Phase diagrams drawn by the server, written to {Path.GetFullPath(folder)}");
        Directory.CreateDirectory(folder);
        var requests = new List<(string File, DrawPhaseDiagramRequest Request)>
        {
            ("binary-Li-O.svg", new DrawPhaseDiagramRequest { Dataset = dataset, ChemicalSystem = "Li-O" }),
            ("ternary-Li-Co-O.svg", new DrawPhaseDiagramRequest { Dataset = dataset, ChemicalSystem = "Li-Co-O" }),
            ("pseudo-ternary-layered-oxides.svg", WithEndMembers(new DrawPhaseDiagramRequest { Dataset = dataset, MaxAboveHullEvPerAtom = 0.05 })),
            ("quaternary-Li-Co-Ni-O.svg", new DrawPhaseDiagramRequest { Dataset = dataset, ChemicalSystem = "Li-Co-Ni-O", ViewAzimuthDegrees = 200, ViewElevationDegrees = -30 }),
        };
        Table? table = null;
        foreach ((string file, DrawPhaseDiagramRequest request) in requests)
        {
            DrawPhaseDiagramResponse response = await hull.Figures.DrawPhaseDiagramAsync(request, hull.Call(t));
            string path = Path.Combine(folder, file);
            await File.WriteAllTextAsync(path, response.Svg, t);
            Table row = FigureCommand.SummaryTable(response, path);
            table = table is null ? row : table.Add(row.Rows[0]);
        }

        TableRenderer.WriteAligned(output, table!, "  ");

        // Five components have no readable projection: the server says so and what to do instead.
        try
        {
            await hull.Figures.DrawPhaseDiagramAsync(new DrawPhaseDiagramRequest { Dataset = dataset, ChemicalSystem = "Li-Co-Ni-Mn-O" }, hull.Call(t));
            output.WriteLine("  unexpected: a five-component figure was drawn");
        }
        catch (RpcException e)
        {
            output.WriteLine($"  Li-Co-Ni-Mn-O is refused: {e.StatusCode}: {RpcFailure.ViolationsOf(e).FirstOrDefault()?.Description ?? e.Status.Detail}");
        }
    }

    private static DrawPhaseDiagramRequest WithEndMembers(DrawPhaseDiagramRequest request)
    {
        request.EndMembers.AddRange(LayeredOxides.Select(f => new EndMember { Formula = f }));
        return request;
    }

    private void Heading(string text)
    {
        output.WriteLine();
        output.WriteLine(text);
        output.WriteLine(new string('=', Math.Min(text.Length, 100)));
    }
}
