using System.CommandLine;
using System.Text;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull figure`: asks the server to draw a phase diagram and writes the SVG it returns to a file. The drawing is
/// the server's; this command only names the file.
/// </summary>
public static class FigureCommand
{
    public static Command Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var system = new Argument<string>("system")
        {
            Description = "2 to 4 elements, e.g. Li-Co-O (omit with --end-members)",
            Arity = ArgumentArity.ZeroOrOne,
            DefaultValueFactory = _ => string.Empty,
        };
        var version = CommandTree.VersionOption();
        var endMembers = EndMemberOption.Create();
        var cutoff = ValueOptions.OptionalNumber("--max-above-hull", "leave out entries further above the hull than this, eV/atom (default 0.2)", "an energy in eV/atom");
        var azimuth = ValueOptions.OptionalNumber("--azimuth", "quaternary view: turn about the vertical, degrees (default 25)", "an angle in degrees");
        var elevation = ValueOptions.OptionalNumber("--elevation", "quaternary view: tilt towards the viewer, degrees (default 20)", "an angle in degrees");
        var output = new Option<string?>("--output", "-o") { Description = "SVG file to write (default: DATASET-vVERSION-SYSTEM.svg in the current folder)" };
        var command = new Command("figure", "draw the phase diagram of a binary, ternary or quaternary hull (elements or end-members) as SVG")
        {
            dataset, system, version, endMembers, cutoff, azimuth, elevation, output,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new DrawPhaseDiagramRequest { Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system)! };
            request.EndMembers.AddRange(EndMemberOption.Parse(c.Get(endMembers)));
            if (c.Get(cutoff) is double max) request.MaxAboveHullEvPerAtom = max;
            if (c.Get(azimuth) is double a) request.ViewAzimuthDegrees = a;
            if (c.Get(elevation) is double e) request.ViewElevationDegrees = e;
            DrawPhaseDiagramResponse response = await c.Server.Figures.DrawPhaseDiagramAsync(request, c.Server.Call(t));
            string path = c.Get(output) ?? DefaultFileName(response);
            await File.WriteAllTextAsync(path, response.Svg, new UTF8Encoding(false), t);
            if (c.Format == OutputFormat.Json) c.Err.WriteLine($"wrote {path}");
            c.Emit(Summary(response, path), () => SummaryTable(response, path),
                $"{VersionText.Of(response.Used)}, system {response.ChemicalSystem}");
            return ExitCodes.Ok;
        }));
        return command;
    }

    /// <summary>DATASET-vVERSION-SYSTEM.svg with anything but letters, digits, '-', '.' and '_' replaced by '_'.</summary>
    public static string DefaultFileName(DrawPhaseDiagramResponse response)
    {
        string raw = $"{response.Used.Dataset}-v{response.Used.Version}-{response.ChemicalSystem}.svg";
        return string.Concat(raw.Select(ch => char.IsAsciiLetterOrDigit(ch) || ch is '-' or '.' or '_' ? ch : '_'));
    }

    /// <summary>The response without the SVG text (which went to the file named in the table, or on stderr with --json).</summary>
    private static DrawPhaseDiagramResponse Summary(DrawPhaseDiagramResponse response, string path)
    {
        DrawPhaseDiagramResponse copy = response.Clone();
        copy.Svg = string.Empty;
        return copy;
    }

    internal static Table SummaryTable(DrawPhaseDiagramResponse r, string path) =>
        new Table("file", "kind", "system", "stable_phases", "tie_lines", "unstable_shown", "hidden_above_cutoff", "cutoff_ev_per_atom")
            .Add(path, KindName(r.Kind), r.ChemicalSystem, r.StablePhaseCount, r.EdgeCount, r.UnstableShownCount, r.HiddenAboveCutoffCount, r.MaxAboveHullEvPerAtom);

    private static string KindName(FigureKind kind) => kind switch
    {
        FigureKind.Binary => "binary",
        FigureKind.Ternary => "ternary",
        FigureKind.Quaternary => "quaternary",
        _ => "unknown",
    };
}
