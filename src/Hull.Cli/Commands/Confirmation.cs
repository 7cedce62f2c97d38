namespace Hull.Cli.Commands;

/// <summary>
/// Asks before a deletion when a person is at the terminal; --yes answers for them. Scripts (no terminal) are not
/// asked: they said what they meant on the command line.
/// </summary>
public static class Confirmation
{
    public const string YesOptionName = "--yes";

    /// <summary>True to go ahead: --yes, no one to ask, or the answer "y"/"yes".</summary>
    public static bool Confirm(CliContext context, bool yes, string question)
    {
        if (yes || !context.Terminal.CanAsk) return true;
        context.Err.Write($"{question} [y/N] ");
        context.Err.Flush();
        string answer = (context.Terminal.Input.ReadLine() ?? string.Empty).Trim();
        return answer.Equals("y", StringComparison.OrdinalIgnoreCase) || answer.Equals("yes", StringComparison.OrdinalIgnoreCase);
    }
}
