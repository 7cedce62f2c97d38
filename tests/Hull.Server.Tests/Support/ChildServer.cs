using System.Diagnostics;
using Hull.Server.Hosting;

namespace Hull.Server.Tests.Support;

/// <summary>The server executable run as a child process (`dotnet Hull.Server.dll ...`), so that it can be SIGKILLed.</summary>
public sealed class ChildServer : IDisposable
{
    private static readonly TimeSpan StartTimeout = TimeSpan.FromSeconds(60);
    private readonly Process _process;

    private ChildServer(Process process, Uri address)
    {
        _process = process;
        Address = address;
    }

    public Uri Address { get; }

    public bool HasExited => _process.HasExited;

    /// <summary>What the server has written to stderr so far (its JSON log lines).</summary>
    public IReadOnlyCollection<string> ErrorLines { get; private init; } = [];

    private static ProcessStartInfo StartInfo(string dataDirectory, string[] extraArguments) =>
        StartInfo(["--data-dir", dataDirectory, .. extraArguments]);

    private static ProcessStartInfo StartInfo(string[] arguments)
    {
        string serverDll = typeof(HullServer).Assembly.Location;
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (string arg in new[] { serverDll, "--port", "0", "--log-level", "Warning" }.Concat(arguments))
        {
            start.ArgumentList.Add(arg);
        }

        return start;
    }

    /// <summary>Runs a server that is expected to refuse to start; its exit code and both outputs (killed after the start timeout).</summary>
    public static async Task<(int ExitCode, string Out, string Err)> RunToExitAsync(string dataDirectory, params string[] extraArguments)
    {
        using var process = Process.Start(StartInfo(dataDirectory, extraArguments)) ?? throw new InvalidOperationException("could not start the server process");
        Task<string> output = process.StandardOutput.ReadToEndAsync();
        Task<string> error = process.StandardError.ReadToEndAsync();
        using var timeout = new CancellationTokenSource(StartTimeout);
        try
        {
            await process.WaitForExitAsync(timeout.Token);
        }
        catch (OperationCanceledException)
        {
            process.Kill();
            throw new InvalidOperationException($"the server did not exit within {StartTimeout}: {await output}");
        }

        return (process.ExitCode, await output, await error);
    }

    public static Task<ChildServer> StartAsync(string dataDirectory, params string[] extraArguments) =>
        StartAsync(StartInfo(dataDirectory, extraArguments));

    /// <summary>A server on a PostgreSQL store (one replica of several, when they share the connection).</summary>
    public static Task<ChildServer> StartOnPostgresAsync(string connectionString, params string[] extraArguments) =>
        StartAsync(StartInfo(["--postgres", connectionString, .. extraArguments]));

    private static async Task<ChildServer> StartAsync(ProcessStartInfo start)
    {
        var process = Process.Start(start) ?? throw new InvalidOperationException("could not start the server process");
        var errors = new System.Collections.Concurrent.ConcurrentQueue<string>();
        process.ErrorDataReceived += (_, line) =>
        {
            if (line.Data is { } text) errors.Enqueue(text);
        };
        process.BeginErrorReadLine();
        using var timeout = new CancellationTokenSource(StartTimeout);
        while (true)
        {
            string? line = await process.StandardOutput.ReadLineAsync(timeout.Token);
            if (line is null) throw new InvalidOperationException($"the server exited before listening (exit code {(process.WaitForExit(5000) ? process.ExitCode : -1)})");
            const string Prefix = "hull server listening on ";
            if (line.StartsWith(Prefix, StringComparison.Ordinal))
            {
                string address = line[Prefix.Length..].Split(' ')[0];
                return new ChildServer(process, new Uri(address)) { ErrorLines = errors };
            }
        }
    }

    /// <summary>SIGKILL: no shutdown code runs, exactly like a power cut for the process.</summary>
    public void Kill()
    {
        if (!_process.HasExited) _process.Kill(entireProcessTree: false);
        _process.WaitForExit();
    }

    /// <summary>SIGTERM-like graceful stop where possible; kills if it does not stop in time.</summary>
    public void Stop()
    {
        if (_process.HasExited) return;
        Process.Start("kill", ["-TERM", _process.Id.ToString(System.Globalization.CultureInfo.InvariantCulture)])?.WaitForExit();
        if (!_process.WaitForExit(10_000)) Kill();
    }

    public void Dispose()
    {
        Stop();
        _process.Dispose();
    }
}
