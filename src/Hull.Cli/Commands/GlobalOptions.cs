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

    public Option<string> Server { get; } = new("--server")
    {
        Description = $"hull server address (default: ${ServerVariable} or {DefaultServer})",
        Recursive = true,
        DefaultValueFactory = _ => Environment.GetEnvironmentVariable(ServerVariable) is { Length: > 0 } fromEnvironment ? fromEnvironment : DefaultServer,
        CustomParser = result =>
        {
            string text = result.Tokens.Count > 0 ? result.Tokens[0].Value : DefaultServer;
            if (!Uri.TryCreate(text, UriKind.Absolute, out Uri? uri) || uri.Scheme is not ("http" or "https"))
            {
                result.AddError($"--server '{text}' is not an http:// or https:// address, e.g. {DefaultServer}");
            }

            return text;
        },
    };

    public Option<string?> Token { get; } = new("--token")
    {
        Description = $"bearer token for write commands (default: ${TokenVariable})",
        Recursive = true,
        DefaultValueFactory = _ => Environment.GetEnvironmentVariable(TokenVariable) is { Length: > 0 } token ? token : null,
    };

    public Option<string?> CaFile { get; } = new("--ca-file")
    {
        Description = $"PEM certificates to trust for an https:// server besides the system's: a private CA, or the server's self-signed certificate (default: ${CaFileVariable})",
        Recursive = true,
        DefaultValueFactory = _ => Environment.GetEnvironmentVariable(CaFileVariable) is { Length: > 0 } path ? path : null,
    };

    public Option<bool> Json { get; } = new("--json") { Description = "print JSON (the server's messages, .proto field names)", Recursive = true };

    public Option<bool> Csv { get; } = new("--csv") { Description = "print CSV", Recursive = true };

    public Option<bool> Quiet { get; } = new("--quiet", "-q") { Description = "no progress output on stderr", Recursive = true };

    public Option<double> TimeoutSeconds { get; } = new("--timeout")
    {
        Description = string.Create(CultureInfo.InvariantCulture, $"seconds one call may take (default {DefaultTimeoutSeconds})"),
        Recursive = true,
        DefaultValueFactory = _ => DefaultTimeoutSeconds,
        CustomParser = result =>
        {
            string text = result.Tokens.Count > 0 ? result.Tokens[0].Value : string.Empty;
            if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double seconds) || !(seconds > 0) || double.IsInfinity(seconds))
            {
                result.AddError($"--timeout '{text}' is not a positive number of seconds");
                return DefaultTimeoutSeconds;
            }

            return seconds;
        },
    };

    public IEnumerable<Option> All => [Server, Token, CaFile, Json, Csv, Quiet, TimeoutSeconds];
}
