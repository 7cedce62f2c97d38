using System.CommandLine;
using Hull.Server.Hosting;

namespace Hull.Cli.Commands;

/// <summary>`hull serve [server options]`: runs the hull server in this process until Ctrl+C / SIGTERM.</summary>
public static class ServeCommand
{
    public static Command Build()
    {
        var command = new Command("serve", "run a hull server in this process (options as for hull-server: --data-dir, --port, --host, --tls-cert, --tls-key, --write-token, limits; see `hull serve --server-help`)")
        {
            TreatUnmatchedTokensAsErrors = false,
        };
        var serverHelp = new Option<bool>("--server-help") { Description = "list the server options" };
        command.Options.Add(serverHelp);
        command.SetAction(async (parse, cancellation) =>
        {
            TextWriter output = parse.InvocationConfiguration.Output;
            TextWriter error = parse.InvocationConfiguration.Error;
            if (parse.GetValue(serverHelp))
            {
                output.WriteLine(ServerCommandLine.Usage);
                return ExitCodes.Ok;
            }

            HullServerOptions? options = ServerCommandLine.Parse(parse.UnmatchedTokens, out string? problem, out bool help);
            if (help)
            {
                output.WriteLine(ServerCommandLine.Usage);
                return ExitCodes.Ok;
            }

            if (options is null)
            {
                error.WriteLine($"hull serve: {problem}");
                return ExitCodes.Usage;
            }

            HullServer server;
            try
            {
                server = await HullServer.StartAsync(options, cancellation);
            }
            catch (Exception e) when (HullServer.IsStoreFailure(e))
            {
                error.WriteLine($"hull serve: cannot open the store in '{options.DataDirectory}': {e.Message}");
                return ExitCodes.InputFile;
            }
            catch (IOException e)
            {
                error.WriteLine($"hull serve: cannot listen on {options.BindAddress}:{options.Port}: {e.Message}");
                return ExitCodes.ServerUnreachable;
            }

            await using (server)
            {
                output.WriteLine($"hull server listening on {server.Address.ToString().TrimEnd('/')} (data: {server.DataDirectory})");
                output.Flush();
                try
                {
                    await server.WaitForShutdownAsync(cancellation);
                }
                catch (OperationCanceledException)
                {
                    // Ctrl+C: stop below.
                }
            }

            return ExitCodes.Ok;
        });
        return command;
    }
}
