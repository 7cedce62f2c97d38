using System.Diagnostics;
using System.Globalization;

namespace Hull.ServiceBench;

/// <summary>
/// The real server as a separate child process (`dotnet Hull.Server.dll --port 0 --data-dir DIR`), so that the
/// server and the load generator are two processes on one machine, as in a deployment.
/// </summary>
public sealed class ServerProcess : IDisposable
{
    private const string ListeningPrefix = "hull server listening on ";
    private static readonly TimeSpan StartTimeout = TimeSpan.FromSeconds(60);
    private static readonly TimeSpan StopTimeout = TimeSpan.FromSeconds(10);

    // The last stderr lines (JSON logs), shown when the server dies unexpectedly.
    private readonly Queue<string> _lastErrors = new();
    private readonly List<string> _warmingLines = [];
    private readonly Process _process;

    private ServerProcess(Process process) => _process = process;

    /// <summary>The address the server printed, e.g. http://127.0.0.1:40123.</summary>
    public Uri Address { get; private set; } = new("http://127.0.0.1:0");

    public int ProcessId => _process.Id;

    public bool HasExited => _process.HasExited;

    /// <summary>Starts the server on a free loopback port and waits for its "listening" line.</summary>
    public static Task<ServerProcess> StartAsync(string serverDll, string dataDirectory, IEnumerable<string>? extraArgs = null) =>
        StartWithArgumentsAsync(serverDll, new[] { "--data-dir", dataDirectory, "--port", "0", "--host", "127.0.0.1" }.Concat(extraArgs ?? []));

    /// <summary>Starts the server with exactly these arguments (its store and port among them) and waits for its "listening" line.</summary>
    public static async Task<ServerProcess> StartWithArgumentsAsync(string serverDll, IEnumerable<string> arguments)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (string arg in arguments.Prepend(serverDll))
        {
            start.ArgumentList.Add(arg);
        }

        Process process = Process.Start(start) ?? throw new InvalidOperationException("could not start the server process");
        var server = new ServerProcess(process);
        process.ErrorDataReceived += (_, e) => server.KeepErrorLine(e.Data);
        process.BeginErrorReadLine();
        using var timeout = new CancellationTokenSource(StartTimeout);
        while (true)
        {
            string? line = await process.StandardOutput.ReadLineAsync(timeout.Token);
            if (line is null)
            {
                process.WaitForExit(5000);
                throw new InvalidOperationException(
                    $"the server exited before listening (exit code {(process.HasExited ? process.ExitCode : -1)}):{Environment.NewLine}{server.LastErrors()}");
            }

            if (line.StartsWith(ListeningPrefix, StringComparison.Ordinal))
            {
                server.Address = new Uri(line[ListeningPrefix.Length..].Split(' ')[0]);
                // Keep draining stdout so that the server never blocks on a full pipe.
                _ = Task.Run(async () => { while (await process.StandardOutput.ReadLineAsync() is not null) { } });
                return server;
            }
        }
    }

    /// <summary>User + system CPU seconds the server has used so far.</summary>
    public double CpuSeconds() => ProcFiles.ProcessCpuSeconds(_process.Id);

    /// <summary>Peak resident memory so far (VmHWM), MiB.</summary>
    public double PeakResidentMiB() => ProcFiles.StatusKilobytes(_process.Id, "VmHWM") / 1024.0;

    /// <summary>Resident memory now (VmRSS), MiB.</summary>
    public double ResidentMiB() => ProcFiles.StatusKilobytes(_process.Id, "VmRSS") / 1024.0;

    /// <summary>SIGTERM, then SIGKILL if the server has not stopped in time.</summary>
    public void Stop()
    {
        if (_process.HasExited) return;
        using (Process? kill = Process.Start("kill", ["-TERM", _process.Id.ToString(CultureInfo.InvariantCulture)]))
        {
            kill?.WaitForExit();
        }

        if (!_process.WaitForExit(StopTimeout)) _process.Kill(entireProcessTree: true);
        _process.WaitForExit();
    }

    public string LastErrors()
    {
        lock (_lastErrors) return string.Join(Environment.NewLine, _lastErrors);
    }

    public void Dispose()
    {
        Stop();
        _process.Dispose();
    }

    /// <summary>The server's log lines that say how long its startup warming and its warm-up before ready took.</summary>
    public IReadOnlyList<string> WarmingLines
    {
        get
        {
            lock (_warmingLines) return [.. _warmingLines];
        }
    }

    private void KeepErrorLine(string? line)
    {
        if (line is null) return;
        if (line.Contains("startup warming", StringComparison.Ordinal) || line.Contains("ready after", StringComparison.Ordinal))
        {
            lock (_warmingLines) _warmingLines.Add(line);
        }

        lock (_lastErrors)
        {
            _lastErrors.Enqueue(line);
            while (_lastErrors.Count > 20) _lastErrors.Dequeue();
        }
    }
}
