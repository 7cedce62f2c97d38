using Hull.Server.Hosting;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Tests.Support;

/// <summary>A real server (Kestrel on a free loopback port, SQLite in a temp folder) in this process.</summary>
public sealed class RunningServer : IAsyncDisposable
{
    private readonly TempFolder _folder;

    private RunningServer(TempFolder folder, HullServer server, string? token)
    {
        _folder = folder;
        Server = server;
        Clients = new Clients(server.Address, token);
    }

    public HullServer Server { get; }

    public Clients Clients { get; }

    public string DataDirectory => _folder.Path;

    public static async Task<RunningServer> StartAsync(Func<HullServerOptions, HullServerOptions>? configure = null, string? clientToken = null)
    {
        var folder = new TempFolder();
        var options = new HullServerOptions { DataDirectory = folder.Path, Port = 0, MinimumLogLevel = LogLevel.Warning };
        if (configure is not null) options = configure(options);
        HullServer server = await HullServer.StartAsync(options);
        return new RunningServer(folder, server, clientToken ?? options.WriteToken);
    }

    public async ValueTask DisposeAsync()
    {
        Clients.Dispose();
        await Server.StopAsync();
        _folder.Dispose();
    }
}
