using System.CommandLine;
using System.Globalization;

namespace Hull.Cli.Commands;

/// <summary>Options every command accepts.</summary>
public sealed class GlobalOptions
{
    /// <summary>Server address when neither --server nor HULL_SERVER is given.</summary>
    public const string DefaultServer = "http://127.0.0.1:50551";

    public const string ServerVariable = "HULL_SERVER";
    public const string TokenVariable = "HULL_TOKEN";
    public const string CaFileVariable = "HULL_CA_FILE";

    /// <summary>Seconds one call may take by default: room for a 10,000-row import batch or a first hull build.</summary>
    public const double DefaultTimeoutSeconds = 120;

    // No option below has a library default: help would print it beside the description's own, and for --token it
    // would print the secret itself. The defaults (variable, then constant) are applied where the values are read.
    public Option<string?> Server { get; } = new("--server")
    {
        Description = $"hull server address (default: ${ServerVariable}, else {DefaultServer})",
        Recursive = true,
        CustomParser = result =>
        {
            string text = result.Tokens.Count > 0 ? result.Tokens[0].Value : DefaultServer;
            if (CheckServer(text) is { } problem) result.AddError($"--server {problem}");
            return text;
        },
    };

    public Option<string?> Token { get; } = new("--token")
    {
        Description = $"bearer token for write commands (default: ${TokenVariable})",
        Recursive = true,
    };

    public Option<string?> CaFile { get; } = new("--ca-file")
    {
        Description = $"PEM certificates to trust for an https:// server besides the system's: a private CA, or the server's self-signed certificate (default: ${CaFileVariable})",
        Recursive = true,
    };

    public Option<bool> Json { get; } = new("--json") { Description = "print JSON (the server's messages, .proto field names)", Recursive = true };

    public Option<bool> Csv { get; } = new("--csv") { Description = "print CSV", Recursive = true };

    public Option<bool> Quiet { get; } = new("--quiet", "-q") { Description = "no progress output on stderr", Recursive = true };

    public Option<double?> TimeoutSeconds { get; } = new("--timeout")
    {
        Description = string.Create(CultureInfo.InvariantCulture, $"seconds one call may take (default {DefaultTimeoutSeconds})"),
        Recursive = true,
        CustomParser = result =>
        {
            string text = result.Tokens.Count > 0 ? result.Tokens[0].Value : string.Empty;
            if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double seconds) || !(seconds > 0) || double.IsInfinity(seconds))
            {
                result.AddError($"--timeout '{text}' is not a positive number of seconds");
                return null;
            }

            return seconds;
        },
    };

    /// <summary>--server, else $HULL_SERVER, else the default; a bad address from the variable is a usage error naming it.</summary>
    public string ServerText(ParseResult parse)
    {
        if (parse.GetValue(Server) is { } given) return given;
        if (Environment.GetEnvironmentVariable(ServerVariable) is not { Length: > 0 } fromEnvironment) return DefaultServer;
        if (CheckServer(fromEnvironment) is { } problem) throw new UsageException($"${ServerVariable} {problem}");
        return fromEnvironment;
    }

    public string? TokenText(ParseResult parse) =>
        parse.GetValue(Token) ?? (Environment.GetEnvironmentVariable(TokenVariable) is { Length: > 0 } token ? token : null);

    public string? CaFileText(ParseResult parse) =>
        parse.GetValue(CaFile) ?? (Environment.GetEnvironmentVariable(CaFileVariable) is { Length: > 0 } path ? path : null);

    public TimeSpan Timeout(ParseResult parse) => TimeSpan.FromSeconds(parse.GetValue(TimeoutSeconds) ?? DefaultTimeoutSeconds);

    private static string? CheckServer(string text) =>
        Uri.TryCreate(text, UriKind.Absolute, out Uri? uri) && uri.Scheme is "http" or "https"
            ? null
            : $"'{text}' is not an http:// or https:// address, e.g. {DefaultServer}";

    public IEnumerable<Option> All => [Server, Token, CaFile, Json, Csv, Quiet, TimeoutSeconds];
}
