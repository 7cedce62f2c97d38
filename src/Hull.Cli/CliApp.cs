using System.CommandLine;
using Grpc.Core;
using Hull.Cli.Client;
using Hull.Cli.Commands;
using Hull.Cli.Input;
using Hull.Cli.Output;

namespace Hull.Cli;

/// <summary>
/// The `hull` command line: builds the command tree, runs the chosen command, and turns every failure into one of
/// the documented <see cref="ExitCodes"/> with a message on stderr.
/// </summary>
public static class CliApp
{
    /// <summary>Runs one command line; <paramref name="stdoutBytes"/> is the stream under <paramref name="stdout"/> when
    /// JSON may be written to it as UTF-8 bytes directly (a redirected standard output), null = through the writer.</summary>
    public static async Task<int> RunAsync(
        string[] args, TextWriter stdout, TextWriter stderr, CancellationToken cancellation = default, TerminalInfo? terminal = null, Stream? stdoutBytes = null)
    {
        terminal ??= TerminalInfo.None;
        var options = new GlobalOptions();
        int exitCode = ExitCodes.Ok;
        RootCommand root = CommandTree.Build(options, (body) => async (parse, token) =>
        {
            var context = new CliContext(parse, stdout, stderr, options, terminal) { Cancellation = token, OutBytes = stdoutBytes };
            try
            {
                exitCode = await body(context, token);
            }
            catch (Exception e)
            {
                exitCode = Report(e, context);
            }
            finally
            {
                context.Close();
            }

            return exitCode;
        });

        ParseResult parse = root.Parse(args);
        if (parse.Errors.Count > 0)
        {
            foreach (var error in parse.Errors) stderr.WriteLine($"hull: {error.Message}");
            stderr.WriteLine("Run 'hull --help' (or 'hull COMMAND --help') for usage.");
            return ExitCodes.Usage;
        }

        if (parse.GetValue(options.Json) && parse.GetValue(options.Csv))
        {
            stderr.WriteLine("hull: choose one of --json and --csv");
            return ExitCodes.Usage;
        }

        int result = await parse.InvokeAsync(new InvocationConfiguration { Output = stdout, Error = stderr }, cancellation);
        return result;
    }

    private static int Report(Exception error, CliContext context)
    {
        switch (error)
        {
            case UsageException usage:
                context.Err.WriteLine($"hull: {usage.Message}");
                return ExitCodes.Usage;
            case InputFileException input:
                context.Err.WriteLine($"hull: {input.Message}");
                return ExitCodes.InputFile;
            case ImportRunner.BatchRefusedException refused:
                context.Err.WriteLine(context.Format == OutputFormat.Json
                    ? RpcFailure.DescribeJson(refused.Cause, context.ServerAddress, refused.Message)
                    : $"hull: {refused.Message}");
                return RpcFailure.ExitCodeOf(refused.Cause);
            case RequestRefusal.RefusedException refused:
                context.Err.WriteLine($"hull: {refused.Message}");
                return RpcFailure.ExitCodeOf(refused.Cause);
            case RpcException { StatusCode: StatusCode.Cancelled } when context.Cancellation.IsCancellationRequested:
                context.Err.WriteLine("hull: cancelled");
                return ExitCodes.InternalError;
            case RpcException rpc:
                context.Err.WriteLine(context.Format == OutputFormat.Json
                    ? RpcFailure.DescribeJson(rpc, context.ServerAddress)
                    : $"hull: {RpcFailure.Describe(rpc, context.ServerAddress)}");
                return RpcFailure.ExitCodeOf(rpc);
            case OperationCanceledException:
                context.Err.WriteLine("hull: cancelled");
                return ExitCodes.InternalError;
            default:
                context.Err.WriteLine($"hull: unexpected failure: {error.Message}");
                return ExitCodes.InternalError;
        }
    }
}

/// <summary>A command line that parsed but makes no sense (e.g. a bad value found only when it is used).</summary>
public sealed class UsageException(string message) : Exception(message);
