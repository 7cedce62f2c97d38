namespace Hull.Cli.Tests;

/// <summary>`hull demo` runs end to end over real gRPC on the repository's data-demo/.</summary>
public sealed class DemoTests
{
    [Fact]
    public async Task Demo_runs_every_analysis_and_reports()
    {
        string data = CliRun.RepositoryFile("data-demo");
        var run = await CliRun.RunAsync("demo", "--data", data);
        Assert.True(run.ExitCode == 0, run.Err);
        Assert.Contains("Standard gRPC health check: SERVING", run.Out);
        Assert.Contains("A batch with a typo (LiCoQ2) is refused: InvalidArgument, entries[1].formula: unknown element 'Q' at character 5", run.Out);
        Assert.Contains("Dataset cathode-screen: 237 entries at version 3.", run.Out);
        Assert.Contains("hulls of Al-Co-Li-O, Co-Li-Mn-Ni-O", run.Out);
        Assert.Contains("04-rerelaxed-layered.csv -> version 4: 0 inserted, 16 replaced", run.Out);
        Assert.Contains("Version 3 answers exactly as before the replacement: yes", run.Out);
        Assert.Contains("Exported 237 entries", run.Out);
        Assert.Contains("Highest dmu_Al anywhere in the window", run.Out);
        foreach (string section in new[] { "1. Import", "2. Stability", "3. Stable phases", "4. Energy above hull", "5. Ad-hoc", "6. Hull energy", "7. The Li-Co-O hull", "7b. Chemical-potential window", "8. Versions", "9. Export" })
        {
            Assert.Contains(section, run.Out);
        }
    }
}
