namespace Hull.Cli.Tests;

/// <summary>`hull serve` runs a real server until cancelled; `hull health` reaches it.</summary>
public sealed class ServeCommandTests
{
    [Fact]
    public async Task Serve_listens_answers_and_stops_on_cancel()
    {
        string folder = Path.Combine(Path.GetTempPath(), "hull-serve-" + Guid.NewGuid().ToString("N"));
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        using var cancel = new CancellationTokenSource();
        Task<int> serving = CliApp.RunAsync(["serve", "--data-dir", folder, "--port", "0", "--log-level", "Warning"], stdout, stderr, cancel.Token);
        string? address = null;
        for (int i = 0; i < 600 && address is null; i++)
        {
            await Task.Delay(50);
            string text = stdout.ToString();
            int at = text.IndexOf("listening on ", StringComparison.Ordinal);
            if (at >= 0) address = text[(at + "listening on ".Length)..].Split(' ')[0];
            Assert.False(serving.IsCompleted, stderr.ToString());
        }

        Assert.NotNull(address);
        var health = await CliRun.RunAsync("health", "--server", address!);
        Assert.Equal(0, health.ExitCode);
        Assert.Contains("SERVING", health.Out);

        cancel.Cancel();
        Assert.Equal(0, await serving.WaitAsync(TimeSpan.FromSeconds(30)));
        Assert.True(File.Exists(Path.Combine(folder, Hull.Store.DatasetStore.DatabaseFileName)));
        Directory.Delete(folder, recursive: true);
    }
    [Fact]
    public async Task Serve_names_a_missing_or_unusable_tls_file()
    {
        string folder = Path.Combine(Path.GetTempPath(), "hull-serve-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        try
        {
            string garbage = Path.Combine(folder, "garbage.pem");
            await File.WriteAllTextAsync(garbage, "not a certificate\n");
            string missing = Path.Combine(folder, "none.pem");
            foreach ((string file, string expected) in new[]
                     {
                         (garbage, $"hull serve: --tls-cert '{garbage}' is not a usable PEM file"),
                         (missing, $"hull serve: --tls-cert '{missing}': no such file"),
                     })
            {
                var run = await CliRun.RunAsync("serve", "--data-dir", Path.Combine(folder, "data"), "--port", "0", "--tls-cert", file);
                Assert.Equal(ExitCodes.InputFile, run.ExitCode);
                Assert.Contains(expected, run.Err);
            }
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }
}
