using Hull.Server.Hosting;
using Hull.Store;

// hull-server: parse options, open the store, listen, and run until SIGTERM / Ctrl+C.
// Exit codes: 0 stopped normally, 2 bad options (a missing or unusable TLS file too), 3 the store cannot be opened,
// 4 the address cannot be bound.
HullServerOptions? options = ServerCommandLine.Parse(args, out string? error, out bool help);
if (help)
{
    Console.WriteLine(ServerCommandLine.Usage);
    return 0;
}

if (options is null)
{
    Console.Error.WriteLine($"hull-server: {error}");
    return 2;
}

HullServer server;
try
{
    server = await HullServer.StartAsync(options);
}
catch (TlsFileException e)
{
    Console.Error.WriteLine($"hull-server: {e.Message}");
    return 2;
}
catch (StoreException e)
{
    Console.Error.WriteLine($"hull-server: cannot open the store {options.StoreDescription}: {e.Message}");
    return 3;
}
catch (Exception e) when (e is IOException or UnauthorizedAccessException)
{
    Console.Error.WriteLine($"hull-server: cannot start on {options.BindAddress}:{options.Port}: {e.Message}");
    return e is UnauthorizedAccessException ? 3 : 4;
}

Console.WriteLine($"hull server listening on {server.Address.ToString().TrimEnd('/')} (data: {server.StoreLocation})");
Console.Out.Flush();
await server.WaitForShutdownAsync();
await server.StopAsync();
return 0;
