namespace Hull.Cli.Tests;

/// <summary>Malformed option values, help, the program's version, and deletion confirmations.</summary>
public sealed class ArgumentMessageTests
{
    [Theory]
    [InlineData("--version", "abc", "stability", "d", "x", "--version", "abc")]
    [InlineData("--batch-size", "abc", "import", "d", "x.csv", "--batch-size", "abc")]
    [InlineData("--batch-size", "0", "import", "d", "x.csv", "--batch-size", "0")]
    [InlineData("--max-above-hull", "abc", "analyze", "d", "--max-above-hull", "abc")]
    [InlineData("--page-size", "many", "datasets", "list", "--page-size", "many")]
    [InlineData("--on-duplicate", "maybe", "import", "d", "x.csv", "--on-duplicate", "maybe")]
    [InlineData("--basis", "per_mole", "assess", "d", "Li", "-1", "--basis", "per_mole")]
    [InlineData("--timeout", "soon", "health", "--timeout", "soon")]
    [InlineData("VERSION", "abc", "versions", "delete", "d", "abc")]
    [InlineData("ENERGY", "abc", "assess", "d", "Li", "abc")]
    [InlineData("--port", "abc", "serve", "--port", "abc")]
    public async Task A_malformed_value_exits_2_naming_the_option_and_the_value(string option, string value, params string[] args)
    {
        var run = await CliRun.RunAsync(args);

        Assert.Equal(ExitCodes.Usage, run.ExitCode);
        Assert.Contains(option, run.Err);
        Assert.Contains($"'{value}'", run.Err);
        Assert.DoesNotContain("System.", run.Err);
        Assert.DoesNotContain("Exception", run.Err);
    }

    [Fact]
    public async Task Serve_help_lists_the_server_options_and_no_help_line_shows_a_default_twice()
    {
        var serve = await CliRun.RunAsync("serve", "--help");
        Assert.Equal(0, serve.ExitCode);
        foreach (string option in new[] { "--data-dir", "--port", "--tls-cert", "--write-token", "--import-expiry-seconds", "--log-level" })
        {
            Assert.Contains(option, serve.Out);
        }
        Assert.DoesNotContain("--server-help", serve.Out);

        foreach (string[] args in new[] { new[] { "--help" }, ["import", "--help"], ["serve", "--help"], ["stability", "--help"], ["datasets", "list", "--help"] })
        {
            var help = await CliRun.RunAsync(args);
            foreach (string line in help.Out.Split('\n'))
            {
                int defaults = line.Split("default", StringSplitOptions.None).Length - 1;
                Assert.True(defaults <= 1, $"{string.Join(' ', args)}: '{line}'");
            }
        }
    }

    [Fact]
    public async Task The_root_version_flag_prints_the_program_version_and_subcommands_keep_the_dataset_version()
    {
        var version = await CliRun.RunAsync("--version");
        Assert.Equal(0, version.ExitCode);
        Assert.Matches(@"^\d+\.\d+\.\d+", version.Out.Trim());

        var dataset = await CliRun.RunAsync("stability", "d", "x", "--version", "2", "--server", $"http://127.0.0.1:{CliRun.ClosedPort()}");
        Assert.Equal(ExitCodes.ServerUnreachable, dataset.ExitCode);
    }
}
