using System.Xml.Linq;

namespace Hull.Cli.Tests;

/// <summary>`hull figure` and `--end-members` against a real server: the SVG the server drew lands in the named file.</summary>
public sealed class FigureCommandTests : ServerBackedTests
{

    [Fact]
    public async Task Figure_writes_the_servers_svg_and_end_members_reach_the_stability_calls()
    {
        string data = Path.Combine(Folder, "entries.csv");
        System.IO.File.WriteAllText(data, """
            id,formula,energy_ev,basis,note
            Li,Li,0,formation_per_atom,
            Co,Co,0,formation_per_atom,
            Ni,Ni,0,formation_per_atom,
            O,O,0,formation_per_atom,
            Li2O,Li2O,-2.0,formation_per_atom,
            LiCoO2,LiCoO2,-1.8,formation_per_atom,
            LiNiO2,LiNiO2,-1.6,formation_per_atom,
            mix,LiCo0.5Ni0.5O2,-1.75,formation_per_atom,
            mix-b,LiCo0.5Ni0.5O2,-1.69,formation_per_atom,
            """);
        Assert.Equal(0, (await CliRun.RunAsync("import", "cli-fig", data, "--create", "--server", Server)).ExitCode);

        string svgPath = Path.Combine(Folder, "out.svg");
        var drawn = await CliRun.RunAsync("figure", "cli-fig", "Li-Co-O", "--output", svgPath, "--max-above-hull", "0.5", "--server", Server);
        Assert.True(drawn.ExitCode == 0, drawn.Err);
        Assert.Contains("ternary", drawn.Out);
        XDocument doc = XDocument.Load(svgPath);
        Assert.Equal("Co-Li-O", (string?)doc.Descendants().Single(e => e.Name.LocalName == "figure").Attribute("system"));

        // The default file name comes from the dataset, version and system.
        string previous = Environment.CurrentDirectory;
        Environment.CurrentDirectory = Folder;
        try
        {
            var named = await CliRun.RunAsync("figure", "cli-fig", "--end-members", "LiCoO2,entry:LiNiO2", "--server", Server);
            Assert.True(named.ExitCode == 0, named.Err);
            Assert.True(System.IO.File.Exists(Path.Combine(Folder, "cli-fig-v1-LiCoO2-LiNiO2.svg")), named.Out);
        }
        finally
        {
            Environment.CurrentDirectory = previous;
        }

        var stable = await CliRun.RunAsync("stable", "cli-fig", "--end-members", "LiCoO2,LiNiO2", "--server", Server, "--csv");
        Assert.True(stable.ExitCode == 0, stable.Err);
        Assert.Contains("mix,", stable.Out);
        Assert.DoesNotContain("Li2O", stable.Out);
        var stability = await CliRun.RunAsync("stability", "cli-fig", "mix-b", "--end-members", "LiCoO2,LiNiO2", "--server", Server, "--csv");
        Assert.True(stability.ExitCode == 0, stability.Err);
        Assert.Contains("LiCoO2-LiNiO2", stability.Out);
        var facets = await CliRun.RunAsync("facets", "cli-fig", "--end-members", "LiCoO2,LiNiO2", "--tie-lines", "--server", Server);
        Assert.True(facets.ExitCode == 0, facets.Err);

        var five = await CliRun.RunAsync("figure", "cli-fig", "Li-Co-Ni-Mn-O", "--server", Server);
        Assert.NotEqual(0, five.ExitCode);
        Assert.Contains("up to four", five.Err);
        var empty = await CliRun.RunAsync("stable", "cli-fig", "--end-members", "LiCoO2,,LiNiO2", "--server", Server);
        Assert.Equal(2, empty.ExitCode);
    }
}
