using System.CommandLine;
using Hull.Server.Hosting;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull serve [server options]`: runs the hull server in this process until Ctrl+C / SIGTERM. Its options are the
/// server's own (<see cref="ServerCommandLine.Options"/>), declared here so that `hull serve --help` lists them all; the
/// values are handed to the server's parser, which checks them exactly as `hull-server` does.
/// </summary>
public static class ServeCommand
{
    public static Command Build()
    {
        var command = new Command("serve", $"run a hull server in this process (the options of hull-server). {ServerCommandLine.ReadyNote}");
        var options = new List<Option<string?>>();
        foreach (ServerOptionSpec spec in ServerCommandLine.Options)
        {
            var option = new Option<string?>(spec.Name) { Description = spec.Description, HelpName = spec.ValueName };
            options.Add(option);
            command.Options.Add(option);
        }

        command.SetAction(async (parse, cancellation) =>
        {
            TextWriter output = parse.InvocationConfiguration.Output;
            TextWriter error = parse.InvocationConfiguration.Error;
            var args = new List<string>();
            foreach (Option<string?> option in options)
            {
                if (parse.GetResult(option) is { Tokens.Count: > 0 } given) args.AddRange([option.Name, given.Tokens[0].Value]);
            }

            HullServerOptions? serverOptions = ServerCommandLine.Parse(args, out string? problem, out _);
            if (serverOptions is null)
            {
                error.WriteLine($"hull serve: {problem}");
                return ExitCodes.Usage;
            }

            HullServer server;
            try
            {
                server = await HullServer.StartAsync(serverOptions, cancellation);
            }
            catch (TlsFileException e)
            {
                error.WriteLine($"hull serve: {e.Message}");
                return ExitCodes.InputFile;
            }
            catch (Exception e) when (HullServer.IsStoreFailure(e))
            {
                error.WriteLine($"hull serve: cannot open the store {serverOptions.StoreDescription}: {e.Message}");
                return ExitCodes.InputFile;
            }
            catch (IOException e)
            {
                error.WriteLine($"hull serve: cannot listen on {serverOptions.BindAddress}:{serverOptions.Port}: {e.Message}");
                return ExitCodes.ServerUnreachable;
            }
            catch (OperationCanceledException)
            {
                error.WriteLine("hull serve: cancelled before the server was listening");
                return ExitCodes.InternalError;
            }

            await using (server)
            {
                output.WriteLine($"hull server listening on {server.Address.ToString().TrimEnd('/')} (data: {server.StoreLocation})");
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
