using System.CommandLine;
using Hull.Cli.Client;
using Hull.Cli.Output;

namespace Hull.Cli.Commands;

/// <summary>What a command's action needs: the parsed values, the output streams and format, and the server.</summary>
public sealed class CliContext(ParseResult parse, TextWriter stdout, TextWriter stderr, GlobalOptions options, TerminalInfo terminal)
{
    private HullConnection? _connection;

    public ParseResult Parse { get; } = parse;

    public TextWriter Out { get; } = stdout;

    public TextWriter Err { get; } = stderr;

    /// <summary>The stream under <see cref="Out"/> for JSON as UTF-8 bytes (a redirected standard output); null = none.</summary>
    public Stream? OutBytes { get; init; }

    public TerminalInfo Terminal { get; } = terminal;

    /// <summary>The command's cancellation (Ctrl+C), to tell a cancel from a server's own Cancelled answer.</summary>
    public CancellationToken Cancellation { get; init; }

    public OutputFormat Format { get; } = parse.GetValue(options.Json) ? OutputFormat.Json
        : parse.GetValue(options.Csv) ? OutputFormat.Csv
        : OutputFormat.Table;

    public bool Quiet => Parse.GetValue(options.Quiet);

    public Uri ServerAddress => new(options.ServerText(Parse));

    public T? Get<T>(Option<T> option) => Parse.GetValue(option);

    public T? Get<T>(Argument<T> argument) => Parse.GetValue(argument);

    /// <summary>The connection to --server, opened on first use.</summary>
    public HullConnection Server => _connection ??= new HullConnection(
        ServerAddress, options.TokenText(Parse), options.Timeout(Parse), Trust());

    /// <summary>The --ca-file certificates, or null; only an https:// server has certificates to check.</summary>
    private ServerTrust? Trust()
    {
        string? path = options.CaFileText(Parse);
        if (path is null) return null;
        if (ServerAddress.Scheme != Uri.UriSchemeHttps)
        {
            throw new UsageException($"--ca-file applies to https:// servers; {ServerAddress} is plain http");
        }
        return ServerTrust.Load(path);
    }

    /// <summary>Prints a table in the chosen text format, or the message as JSON.</summary>
    public void Emit(Google.Protobuf.IMessage message, Func<Table> table, string? caption = null)
    {
        if (Format == OutputFormat.Json)
        {
            if (OutBytes is null)
            {
                ProtoJson.WriteLine(Out, message);
                return;
            }

            // A large answer's JSON (10 MB for 10,000 entries) as the bytes it is written in, not decoded to text and
            // encoded again; what Out holds goes first.
            Out.Flush();
            ProtoJson.WriteLine(OutBytes, message);
            return;
        }

        if (caption is not null && Format == OutputFormat.Table) Out.WriteLine(caption);
        TableRenderer.Write(Out, table(), Format);
    }

    public void Close() => _connection?.Dispose();
}
