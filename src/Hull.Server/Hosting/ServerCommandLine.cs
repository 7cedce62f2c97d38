using System.Globalization;
using System.Net;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Hosting;

/// <summary>
/// The server's command line: options of the form "--name value" (or "--name=value"). Unknown options and bad
/// values are errors that name the option.
/// </summary>
public static class ServerCommandLine
{
    /// <summary>Environment variable read for the write token when --write-token is not given (keeps it out of ps).</summary>
    public const string WriteTokenVariable = "HULL_WRITE_TOKEN";

    /// <summary>Environment variable read for the PostgreSQL connection when neither --postgres nor --data-dir is given (keeps a password out of ps).</summary>
    public const string PostgresVariable = "HULL_POSTGRES";

    /// <summary>Every option, in the order help lists them: the one list that the usage text and `hull serve` are built from.</summary>
    public static IReadOnlyList<ServerOptionSpec> Options { get; } =
    [
        new("--data-dir", "DIR", "dataset store directory, created on first start (default: ./hull-data)"),
        new("--postgres", "CONNECTION", "keep datasets in this PostgreSQL database instead (Npgsql connection string, e.g. " +
            "'Host=db;Database=hull;Username=hull'; default: $HULL_POSTGRES when --data-dir is not given); servers sharing it answer alike"),
        new("--host", "ADDRESS", "address to bind (default: 127.0.0.1, loopback only)"),
        new("--port", "N", "TCP port (default: 50551; 0 picks a free port and prints it)"),
        new("--tls-cert", "FILE", "serve TLS with this PEM certificate (or PKCS#12 file)"),
        new("--tls-key", "FILE", "PEM private key for --tls-cert"),
        new("--write-token", "TOKEN", "bearer token required by write methods (default: $HULL_WRITE_TOKEN; none = open)"),
        new("--max-components-per-system", "N", "default 8"),
        new("--max-entries-per-system", "N", "default 50000"),
        new("--max-compositions-per-request", "N", "default 1000"),
        new("--max-message-bytes", "N", "largest request message (default 16777216)"),
        new("--max-cached-hulls", "N", $"chemical-system hulls kept in memory before the least recently used is dropped (default {HullServerOptions.DefaultMaxCachedHulls})"),
        new("--import-expiry-seconds", "N", "an import session not named by any call this long is removed with its staged rows (default 600)"),
        new("--warm-hulls", "N", $"once the port is bound, build up to N hulls of the datasets' latest versions in the background (default {HullServerOptions.DefaultWarmHulls}; 0 = none)"),
        new("--warm-before-ready", "SECONDS", "wait up to this long for that warming and a few of the server's own queries before saying it listens " +
            $"(default {HullServerOptions.DefaultWarmBeforeReady.TotalSeconds:0}; 0 = say so at once)"),
        new("--log-level", "LEVEL", "Trace, Debug, Information, Warning, Error (default Information)"),
        new("--cluster", "NAME", "join the cluster of this name, sharing hull work with its other members (needs --postgres, the shared store)"),
        new("--peer-port", "N", $"with --cluster: port the members talk on (default {DefaultPeerPort})"),
        new("--gateway-port", "N", $"with --cluster: port the cluster's own clients use (default {DefaultGatewayPort})"),
        new("--peer-host", "ADDRESS", "with --cluster: address the other members reach this one at (default: 127.0.0.1)"),
        new("--cluster-postgres", "CONNECTION", "with --cluster: PostgreSQL database of the membership tables (default: the --postgres store's)"),
    ];

    /// <summary>The peers' port when --peer-port is not given.</summary>
    public const int DefaultPeerPort = 50651;

    /// <summary>The cluster clients' port when --gateway-port is not given.</summary>
    public const int DefaultGatewayPort = 50751;

    /// <summary>What the server prints once ready, and where its logs go.</summary>
    public const string ReadyNote = "Prints \"hull server listening on <address>\" on stdout once ready; logs are JSON lines on stderr.";

    public static string Usage { get; } = BuildUsage();

    private static string BuildUsage()
    {
        var text = new System.Text.StringBuilder("usage: hull-server [options]\n\n");
        foreach (ServerOptionSpec option in Options)
        {
            text.Append("  ").Append($"{option.Name} {option.ValueName}".PadRight(34)).Append(option.Description).Append('\n');
        }
        text.Append("  ").Append("--help".PadRight(34)).Append("show this text\n\n").Append(ReadyNote);
        return text.ToString();
    }

    /// <summary>The options, or null with <paramref name="error"/> set; <paramref name="help"/> when --help was given.</summary>
    public static HullServerOptions? Parse(IReadOnlyList<string> args, out string? error, out bool help)
    {
        error = null;
        help = false;
        var values = new Dictionary<string, string>(StringComparer.Ordinal);
        string[] known = [.. Options.Select(o => o.Name)];
        for (int i = 0; i < args.Count; i++)
        {
            string arg = args[i];
            if (arg is "--help" or "-h")
            {
                help = true;
                return null;
            }

            string name = arg;
            string? value = null;
            int equals = arg.IndexOf('=');
            if (arg.StartsWith("--", StringComparison.Ordinal) && equals > 0)
            {
                name = arg[..equals];
                value = arg[(equals + 1)..];
            }

            if (!known.Contains(name))
            {
                error = $"unknown option '{arg}' (see --help)";
                return null;
            }

            if (value is null)
            {
                if (i + 1 >= args.Count)
                {
                    error = $"option {name} needs a value";
                    return null;
                }

                value = args[++i];
            }

            values[name] = value;
        }

        try
        {
            ServiceLimits limits = ServiceLimits.Default with
            {
                MaxComponentsPerSystem = PositiveInt(values, "--max-components-per-system", ServiceLimits.DefaultMaxComponentsPerSystem),
                MaxEntriesPerSystem = PositiveInt(values, "--max-entries-per-system", ServiceLimits.DefaultMaxEntriesPerSystem),
                MaxCompositionsPerRequest = PositiveInt(values, "--max-compositions-per-request", ServiceLimits.DefaultMaxCompositionsPerRequest),
                MaxReceiveMessageBytes = PositiveInt(values, "--max-message-bytes", ServiceLimits.DefaultMaxReceiveMessageBytes),
            };
            int port = values.TryGetValue("--port", out string? portText) ? ParseInt(portText, "--port") : HullServerOptions.DefaultPort;
            if (port is < 0 or > 65535) throw new FormatException($"--port {port} is outside 0..65535");
            IPAddress host = IPAddress.Loopback;
            if (values.TryGetValue("--host", out string? hostText))
            {
                host = Address(hostText, "--host");
            }

            LogLevel level = LogLevel.Information;
            if (values.TryGetValue("--log-level", out string? levelText) && !Enum.TryParse(levelText, ignoreCase: true, out level))
            {
                throw new FormatException($"--log-level '{levelText}' is not one of Trace, Debug, Information, Warning, Error");
            }

            string? token = values.GetValueOrDefault("--write-token") ?? Environment.GetEnvironmentVariable(WriteTokenVariable);
            if (token is not null && token.Trim().Length == 0) throw new FormatException("the write token is empty");
            int warmHulls = values.TryGetValue("--warm-hulls", out string? warmText) ? ParseInt(warmText, "--warm-hulls") : HullServerOptions.DefaultWarmHulls;
            if (warmHulls < 0) throw new FormatException($"--warm-hulls must be 0 or more, not {warmHulls}");
            int warmBeforeReady = values.TryGetValue("--warm-before-ready", out string? readyText)
                ? ParseInt(readyText, "--warm-before-ready") : (int)HullServerOptions.DefaultWarmBeforeReady.TotalSeconds;
            if (warmBeforeReady < 0) throw new FormatException($"--warm-before-ready must be 0 or more seconds, not {warmBeforeReady}");
            string? postgres = values.GetValueOrDefault("--postgres");
            if (postgres is not null && values.ContainsKey("--data-dir")) throw new FormatException("give --data-dir or --postgres, not both");
            if (postgres is null && !values.ContainsKey("--data-dir"))
            {
                // An empty variable counts as unset.
                string? fromVariable = Environment.GetEnvironmentVariable(PostgresVariable);
                if (!string.IsNullOrWhiteSpace(fromVariable)) postgres = fromVariable;
            }
            if (postgres is not null && Hull.Store.Postgres.PostgresDatasetStore.CheckConnectionString(postgres) is { } badConnection)
            {
                throw new FormatException($"--postgres: {badConnection}");
            }
            Cluster.ClusterSettings? cluster = ParseCluster(values, postgres, host);
            int expirySeconds = PositiveInt(values, "--import-expiry-seconds", (int)ImportSessionSettings.DefaultIdleExpiry.TotalSeconds);
            return new HullServerOptions
            {
                ImportIdleExpiry = TimeSpan.FromSeconds(expirySeconds),
                DataDirectory = values.GetValueOrDefault("--data-dir") ?? Path.Combine(Environment.CurrentDirectory, "hull-data"),
                PostgresConnectionString = string.IsNullOrWhiteSpace(postgres) ? null : postgres,
                BindAddress = host,
                Port = port,
                TlsCertificatePath = values.GetValueOrDefault("--tls-cert"),
                TlsKeyPath = values.GetValueOrDefault("--tls-key"),
                WriteToken = token?.Trim(),
                Limits = limits,
                MinimumLogLevel = level,
                WarmHullsOnStart = warmHulls,
                Cluster = cluster,
                WarmBeforeReady = TimeSpan.FromSeconds(warmBeforeReady),
                MaxCachedHulls = PositiveInt(values, "--max-cached-hulls", HullServerOptions.DefaultMaxCachedHulls),
            };
        }
        catch (FormatException e)
        {
            error = e.Message;
            return null;
        }
    }

    private static Cluster.ClusterSettings? ParseCluster(Dictionary<string, string> values, string? postgres, IPAddress host)
    {
        string[] clusterOnly = ["--peer-port", "--gateway-port", "--peer-host", "--cluster-postgres"];
        if (!values.TryGetValue("--cluster", out string? name))
        {
            string? stray = clusterOnly.FirstOrDefault(values.ContainsKey);
            return stray is null ? null : throw new FormatException($"{stray} needs --cluster");
        }

        if (name.Trim().Length == 0) throw new FormatException("--cluster needs a name");
        // Any member may answer for any system's hull, from its own store: they must all read the same one.
        if (postgres is null) throw new FormatException("--cluster needs --postgres: the members of a cluster share one store");
        int peerPort = Port(values, "--peer-port", DefaultPeerPort);
        int gatewayPort = Port(values, "--gateway-port", DefaultGatewayPort);
        if (peerPort == gatewayPort) throw new FormatException($"--peer-port and --gateway-port are both {peerPort}; give them different ports");
        IPAddress peerHost = values.TryGetValue("--peer-host", out string? peerText) ? Address(peerText, "--peer-host")
            : IPAddress.Any.Equals(host) || IPAddress.IPv6Any.Equals(host) ? IPAddress.Loopback : host;
        if (IPAddress.Any.Equals(peerHost) || IPAddress.IPv6Any.Equals(peerHost))
        {
            throw new FormatException($"--peer-host {peerText} is not an address others can reach; give this machine's address");
        }

        string membership = values.GetValueOrDefault("--cluster-postgres") ?? postgres;
        if (Hull.Store.Postgres.PostgresDatasetStore.CheckConnectionString(membership) is { } bad) throw new FormatException($"--cluster-postgres: {bad}");
        return new Cluster.ClusterSettings(name.Trim(), peerPort, gatewayPort, membership) { PeerAddress = peerHost };
    }

    private static int Port(Dictionary<string, string> values, string name, int fallback)
    {
        int port = values.TryGetValue(name, out string? text) ? ParseInt(text, name) : fallback;
        return port is >= 1 and <= 65535 ? port : throw new FormatException($"{name} {port} is outside 1..65535");
    }

    private static IPAddress Address(string text, string name) =>
        text == "localhost" ? IPAddress.Loopback
        : IPAddress.TryParse(text, out IPAddress? parsed) ? parsed
        : throw new FormatException($"{name} '{text}' is not an IP address (e.g. 127.0.0.1, ::1, 0.0.0.0)");

    private static int PositiveInt(Dictionary<string, string> values, string name, int fallback)
    {
        if (!values.TryGetValue(name, out string? text)) return fallback;
        int value = ParseInt(text, name);
        if (value < 1) throw new FormatException($"{name} must be at least 1, not {value}");
        return value;
    }

    private static int ParseInt(string text, string name) =>
        int.TryParse(text, NumberStyles.Integer, CultureInfo.InvariantCulture, out int value)
            ? value
            : throw new FormatException($"{name} '{text}' is not a whole number");
}
