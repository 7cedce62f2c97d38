namespace Hull.Cli.Commands;

/// <summary>
/// Whether the streams are a person's terminal: progress is redrawn in place only on one, and destructive commands
/// ask before acting only when someone can answer.
/// </summary>
/// <param name="ErrorIsTerminal">stderr is a terminal.</param>
/// <param name="InputIsTerminal">stdin is a terminal, so a question can be answered.</param>
/// <param name="Input">Where answers are read from.</param>
public sealed record TerminalInfo(bool ErrorIsTerminal, bool InputIsTerminal, TextReader Input)
{
    /// <summary>No terminal: a script, a pipe, a test.</summary>
    public static TerminalInfo None { get; } = new(false, false, TextReader.Null);

    /// <summary>The process's own console streams.</summary>
    public static TerminalInfo OfConsole() => new(!Console.IsErrorRedirected, !Console.IsInputRedirected, Console.In);

    /// <summary>Someone is there to answer a question.</summary>
    public bool CanAsk => ErrorIsTerminal && InputIsTerminal;
}
