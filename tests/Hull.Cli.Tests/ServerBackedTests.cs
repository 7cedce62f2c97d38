using Hull.Server.Hosting;

namespace Hull.Cli.Tests;

/// <summary>A test class with its own real server on a loopback port and a folder for its files, both gone after it.</summary>
public abstract class ServerBackedTests : IAsyncLifetime
{
    private HullServer _server = null!;

    protected HullServer HullServer => _server;

    /// <summary>The server's address for --server.</summary>
    protected string Server => _server.Address.ToString();

    /// <summary>The server's data folder, also the place for the test's files.</summary>
    protected string Folder { get; private set; } = null!;

    public virtual async Task InitializeAsync()
    {
        (_server, string folder) = await CliRun.StartServerAsync();
        Folder = folder;
    }

    public async Task DisposeAsync()
    {
        await _server.StopAsync();
        Directory.Delete(Folder, recursive: true);
    }

    /// <summary>Writes <paramref name="text"/> to a file of the test folder and returns its path.</summary>
    protected string File(string name, string text)
    {
        string path = Path.Combine(Folder, name);
        System.IO.File.WriteAllText(path, text);
        return path;
    }
}
