using System.Globalization;
using System.Text;
using Hull.Protos.V1;
using Hull.Server.Hosting;
using Hull.Store;
using Microsoft.Extensions.Logging;

namespace Hull.Cli.Tests;

/// <summary>
/// One import is one version or nothing: a 30,005-entry file imported in 61 batches, interrupted by SIGKILL of the
/// client, SIGKILL of the server, or a cancel, leaves no version and no entry, and its staged rows are removed
/// (at once on a cancel, when the session lapses otherwise).
/// </summary>
public sealed class ImportInterruptionTests : IDisposable
{
    private const int Entries = 30_005;
    private const string ExpirySeconds = "2";
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(90);
    private readonly string _folder = Path.Combine(Path.GetTempPath(), "hull-import-interruption-" + Guid.NewGuid().ToString("N"));

    public ImportInterruptionTests() => Directory.CreateDirectory(_folder);

    public void Dispose()
    {
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        Directory.Delete(_folder, recursive: true);
    }

    [Fact]
    public async Task An_uninterrupted_import_of_30005_entries_in_61_batches_is_one_version()
    {
        await using HullServer server = await StartInProcessAsync();
        var run = await CliRun.RunAsync("import", "big", BigFile(), "--create", "--batch-size", "500", "--server", server.Address.ToString());

        Assert.Equal(0, run.ExitCode);
        var versions = server.Store.ListVersions("big");
        Assert.Equal((1L, Entries, (long)Entries), (versions.Single().Version, versions.Single().BatchEntryCount, versions.Single().EntryCount));
        Assert.Equal(Entries, server.Store.GetEntries("big").Count);
        Assert.Equal(0, server.Store.CountStagedRows());
        // Not a terminal: one plain progress line per tenth, no carriage returns.
        Assert.DoesNotContain('\r', run.Err);
        Assert.InRange(run.Err.Split('\n').Count(l => l.Contains("entries (", StringComparison.Ordinal)), 10, 11);
        Assert.Contains($"[##############################] {Entries}/{Entries} entries (100%)", run.Err);
    }

    [Fact]
    public async Task Sigkill_of_the_client_mid_import_leaves_no_version_and_the_lapsed_rows_are_removed()
    {
        await using HullServer server = await StartInProcessAsync();
        server.Store.CreateDataset("big");
        using ChildProcess client = ChildProcess.Start(typeof(CliApp).Assembly.Location,
            "import", "big", BigFile(), "--batch-size", "500", "--server", server.Address.ToString());

        await client.WaitForLineAsync(l => PastThird(l), Patience);
        client.Kill();

        Assert.Empty(server.Store.ListVersions("big"));
        Assert.Equal(0, CountRows(((DatasetStore)server.Store).DatabasePath, "entries"));
        long staged = server.Store.CountStagedRows();
        Assert.InRange(staged, 9_000, Entries - 1);
        await WaitUntilAsync(() => server.Store.CountStagedRows() == 0, "the lapsed session's rows to be removed");
        Assert.Empty(server.Store.ListVersions("big"));
        Assert.Empty(server.Store.ListImports("big"));
    }

    [Fact]
    public async Task Sigkill_of_the_server_mid_import_leaves_no_version_after_restart_and_the_client_says_nothing_was_committed()
    {
        string data = Path.Combine(_folder, "data");
        string file = BigFile();
        string serverDll = typeof(HullServer).Assembly.Location;
        var output = new StringWriter();
        var errors = new StringWriter();
        int exit;
        using (ChildProcess server = ChildProcess.Start(serverDll, "--data-dir", data, "--port", "0", "--import-expiry-seconds", ExpirySeconds, "--log-level", "Warning"))
        {
            string listening = await server.WaitForLineAsync(l => l.StartsWith("hull server listening on ", StringComparison.Ordinal), Patience);
            string address = listening["hull server listening on ".Length..].Split(' ')[0];
            var progress = new ProgressWatch();
            Task<int> import = CliApp.RunAsync(["import", "big", file, "--create", "--batch-size", "500", "--server", address], output, progress);
            await WaitUntilAsync(() => progress.Text.Split('\n').Any(PastThird), "30% of the import");
            server.Kill();
            exit = await import;
            errors.Write(progress.Text);
        }

        Assert.Equal(ExitCodes.ServerUnreachable, exit);
        Assert.Contains("the import was not committed", errors.ToString());

        using (ChildProcess restarted = ChildProcess.Start(serverDll, "--data-dir", data, "--port", "0", "--import-expiry-seconds", ExpirySeconds, "--log-level", "Warning"))
        {
            await restarted.WaitForLineAsync(l => l.StartsWith("hull server listening on ", StringComparison.Ordinal), Patience);
            using DatasetStore store = DatasetStore.Open(data);
            Assert.Empty(store.ListVersions("big"));
            Assert.Equal(0, CountRows(store.DatabasePath, "entries"));
            // The session was written to disk and outlives the crash until it lapses; then the restarted server removes it.
            await WaitUntilAsync(() => store.CountStagedRows() == 0, "the restarted server to remove the lapsed rows");
            Assert.Empty(store.ListImports("big"));
            Assert.Equal("ok", IntegrityCheck(store.DatabasePath));
        }
    }

    [Fact]
    public async Task A_cancelled_import_drops_its_session_at_once()
    {
        // A long expiry: only the client's own cancel can explain the rows going.
        await using HullServer server = await HullServer.StartAsync(new HullServerOptions
        {
            DataDirectory = Path.Combine(_folder, "data"), Port = 0, MinimumLogLevel = LogLevel.Warning, ImportIdleExpiry = TimeSpan.FromHours(1),
        });
        using var cancel = new CancellationTokenSource();
        var progress = new ProgressWatch();
        Task<int> import = CliApp.RunAsync(
            ["import", "big", BigFile(), "--create", "--batch-size", "500", "--server", server.Address.ToString()], new StringWriter(), progress, cancel.Token);
        await WaitUntilAsync(() => progress.Text.Split('\n').Any(PastThird), "30% of the import");
        cancel.Cancel();

        Assert.NotEqual(0, await import);
        Assert.Contains("hull: cancelled", progress.Text);
        Assert.Equal(0, CountRows(((DatasetStore)server.Store).DatabasePath, "entries"));
        Assert.Empty(server.Store.ListVersions("big"));
        Assert.Equal(0, server.Store.CountStagedRows());
        Assert.Empty(server.Store.ListImports("big"));
    }

    private Task<HullServer> StartInProcessAsync() => HullServer.StartAsync(new HullServerOptions
    {
        DataDirectory = Path.Combine(_folder, "data"), Port = 0, MinimumLogLevel = LogLevel.Warning,
        ImportIdleExpiry = TimeSpan.FromSeconds(int.Parse(ExpirySeconds, CultureInfo.InvariantCulture)),
    });

    /// <summary>30,005 invented binary and ternary oxide rows with distinct ids.</summary>
    private string BigFile()
    {
        string path = Path.Combine(_folder, "big.csv");
        if (File.Exists(path)) return path;
        var text = new StringBuilder("id,formula,energy_ev,basis,note\n");
        for (int i = 0; i < Entries; i++)
        {
            text.Append(CultureInfo.InvariantCulture, $"e{i:D5},Mg{1 + i % 5}Ti{1 + i % 3}O{2 + i % 7},{-1.0 - (i % 97) * 0.01:R},formation_per_atom,\n");
        }
        File.WriteAllText(path, text.ToString());
        return path;
    }

    /// <summary>A progress line saying that at least 30 % of the entries were sent: "big.csv [###...] 9500/30005 entries (31%)".</summary>
    private static bool PastThird(string line)
    {
        int slash = line.IndexOf($"/{Entries} entries", StringComparison.Ordinal);
        if (slash < 0) return false;
        int start = line.LastIndexOf(' ', slash) + 1;
        return int.TryParse(line.AsSpan(start, slash - start), CultureInfo.InvariantCulture, out int done) && done >= Entries * 3 / 10;
    }

    private static async Task WaitUntilAsync(Func<bool> condition, string what)
    {
        var clock = System.Diagnostics.Stopwatch.StartNew();
        while (!condition())
        {
            if (clock.Elapsed > Patience) throw new TimeoutException($"waited {Patience} for {what}");
            await Task.Delay(20);
        }
    }

    private static string IntegrityCheck(string path) => (string)Scalar(path, "PRAGMA integrity_check");

    /// <summary>Every row of a table, whatever version or session it belongs to: what is on disk.</summary>
    private static long CountRows(string path, string table) => (long)Scalar(path, $"SELECT count(*) FROM {table}");

    private static object Scalar(string path, string sql)
    {
        using var connection = new Microsoft.Data.Sqlite.SqliteConnection(new Microsoft.Data.Sqlite.SqliteConnectionStringBuilder { DataSource = path, Pooling = false }.ToString());
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        return command.ExecuteScalar()!;
    }

    /// <summary>A stderr that another thread may read while the CLI writes to it.</summary>
    private sealed class ProgressWatch : TextWriter
    {
        private readonly StringBuilder _text = new();

        public override Encoding Encoding => Encoding.UTF8;

        public string Text
        {
            get { lock (_text) return _text.ToString(); }
        }

        public override void Write(char value)
        {
            lock (_text) _text.Append(value);
        }

        public override void Write(string? value)
        {
            lock (_text) _text.Append(value);
        }
    }
}
