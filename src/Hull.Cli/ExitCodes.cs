namespace Hull.Cli;

/// <summary>
/// The exit codes of `hull`, stable for scripts. Anything not listed here is never returned.
/// </summary>
public static class ExitCodes
{
    /// <summary>Done.</summary>
    public const int Ok = 0;

    /// <summary>A bug in the client or an unexpected local failure (the message says what).</summary>
    public const int InternalError = 1;

    /// <summary>Bad command line: unknown command or option, missing or malformed argument.</summary>
    public const int Usage = 2;

    /// <summary>An input file is missing, unreadable, or not in the documented layout (the message names file, line, column).</summary>
    public const int InputFile = 3;

    /// <summary>The server could not be reached (nothing listening, wrong address, TLS mismatch, untrusted certificate).</summary>
    public const int ServerUnreachable = 4;

    /// <summary>The server refused the request: invalid argument, failed precondition, already exists, limit exceeded.</summary>
    public const int Rejected = 5;

    /// <summary>The dataset, version or entry does not exist.</summary>
    public const int NotFound = 6;

    /// <summary>The server wants a write token (missing) or refused the one given.</summary>
    public const int NotAuthorized = 7;

    /// <summary>The call did not finish within --timeout.</summary>
    public const int TimedOut = 8;

    /// <summary>The server failed (internal error, unimplemented, data loss).</summary>
    public const int ServerError = 9;

    /// <summary>A deletion asked for confirmation on the terminal and was not confirmed; nothing was changed.</summary>
    public const int NotConfirmed = 10;
}
