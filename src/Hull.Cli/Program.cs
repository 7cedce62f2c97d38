using Hull.Cli;
using Hull.Cli.Commands;

using var cancel = new CancellationTokenSource();
Console.CancelKeyPress += (_, e) =>
{
    e.Cancel = true;
    cancel.Cancel();
};
return await CliApp.RunAsync(args, Console.Out, Console.Error, cancel.Token, TerminalInfo.OfConsole());
