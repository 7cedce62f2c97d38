using Hull.Cli;
using Hull.Cli.Commands;

using var cancel = new CancellationTokenSource();
Console.CancelKeyPress += (_, e) =>
{
    e.Cancel = true;
    cancel.Cancel();
};

// Redirected output (a file or a pipe) takes JSON as the UTF-8 bytes it is written in.
Stream? stdoutBytes = Console.IsOutputRedirected ? Console.OpenStandardOutput() : null;
return await CliApp.RunAsync(args, Console.Out, Console.Error, cancel.Token, TerminalInfo.OfConsole(), stdoutBytes);
