using System.Net;
using System.Net.Sockets;
using Hull.Server.Hosting;
using Microsoft.Extensions.Logging;

namespace Hull.Cli.Tests;

/// <summary>Runs `hull` in this process with captured output, and real servers for it to talk to.</summary>
public static class CliRun
{
    public sealed record Result(int ExitCode, string Out, string Err);

    public static async Task<Result> RunAsync(params string[] args)
    {
        var stdout = new StringWriter();
        var stderr = new StringWriter();
        int code = await CliApp.RunAsync(args, stdout, stderr);
        return new Result(code, stdout.ToString(), stderr.ToString());
    }

    public static async Task<(HullServer Server, string Folder)> StartServerAsync(string? token = null)
    {
        string folder = Path.Combine(Path.GetTempPath(), "hull-cli-server-" + Guid.NewGuid().ToString("N"));
        var server = await HullServer.StartAsync(new HullServerOptions { DataDirectory = folder, Port = 0, WriteToken = token, MinimumLogLevel = LogLevel.Warning });
        return (server, folder);
    }

    /// <summary>A loopback port with nothing listening (bound, then released).</summary>
    public static int ClosedPort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        int port = ((IPEndPoint)listener.LocalEndpoint).Port;
        listener.Stop();
        return port;
    }

    public static string RepositoryFile(params string[] parts)
    {
        for (DirectoryInfo? dir = new(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
        {
            string candidate = Path.Combine([dir.FullName, .. parts]);
            if (File.Exists(candidate) || Directory.Exists(candidate)) return candidate;
        }

        throw new FileNotFoundException(string.Join('/', parts));
    }
}
