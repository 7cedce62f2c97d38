using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Demo;

/// <summary>The demo's window step: the layered cathode's chemical-potential window, its aluminium-dopant limit and its window figure.</summary>
internal static class WindowDemoStep
{
    public const string Cathode = "ter-LiCoO2-r3m";

    public static async Task RunAsync(HullConnection hull, TextWriter output, string dataset, string figuresFolder, CancellationToken t)
    {
        output.WriteLine();
        const string title = "7c. Chemical-potential window of layered LiCoO2, and how much Al it tolerates";
        output.WriteLine(title);
        output.WriteLine(new string('=', title.Length));
        var compound = new CompoundRef { EntryId = Cathode };
        GetStabilityWindowResponse window = await hull.Windows.GetStabilityWindowAsync(
            new GetStabilityWindowRequest { Dataset = dataset, Compound = compound }, hull.Call(t));
        foreach (string line in WindowCommands.Caption(window.Used, window.Window).Split('\n')) output.WriteLine("  " + line);
        TableRenderer.WriteAligned(output, WindowCommands.VerticesTable(window.Window.Elements, window.Window.Vertices), "  ");

        var dopants = new GetDopantLimitsRequest { Dataset = dataset, Compound = compound };
        dopants.Dopants.Add("Al");
        GetDopantLimitsResponse limits = await hull.Windows.GetDopantLimitsAsync(dopants, hull.Call(t));
        DopantLimit al = limits.Limits[0];
        var perVertex = new Table(["host_vertex", .. window.Window.Elements.Select(e => $"dmu_{e}_ev"), "max_dmu_Al_ev", "limited_by"]);
        foreach (HostVertexDopantLimit v in al.PerHostVertex)
        {
            perVertex.Add([v.HostVertex + 1, .. limits.Host.Vertices[v.HostVertex].ChemicalPotentialsEv.Select(x => (object?)x),
                v.MaxDopantPotentialEv, v.LimitingPhaseIds.Count > 0 ? string.Join(" ", v.LimitingPhaseIds) : "Al at its reference"]);
        }

        TableRenderer.WriteAligned(output, perVertex, "  ");
        output.WriteLine($"  Highest dmu_Al anywhere in the window: {al.OverallMaxEv:0.####} eV, limited by {string.Join(" ", al.OverallLimitingPhaseIds)} " +
                         $"({al.ExtendedVertices.Count} vertices of the extended Li-Co-O-Al polytope, {al.DopantPhaseCount} Al phases took part).");
        output.WriteLine("  These are 0 K bounds from computed energies; they do not say how to dope a cathode safely.");

        // The window drawn on the Li and Co potentials (Δμ_O follows from LiCoO2's formation energy).
        DrawWindowFigureResponse figure = await hull.Windows.DrawWindowFigureAsync(
            new DrawWindowFigureRequest { Dataset = dataset, Compound = compound, XElement = "Li", YElement = "Co" }, hull.Call(t));
        Directory.CreateDirectory(figuresFolder);
        string path = Path.Combine(figuresFolder, $"window-{Cathode}.svg");
        await File.WriteAllTextAsync(path, figure.Svg, t);
        output.WriteLine($"  Window figure ({figure.DrawnVertices.Count} vertices, lines of {figure.DrawnLineIds.Count} limits drawn): {Path.GetFullPath(path)}");
    }
}
