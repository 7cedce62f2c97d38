using System.Net;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Hosting;

/// <summary>How to run one server: where the data lives, where to listen, and what to require of callers.</summary>
public sealed record HullServerOptions
{
    /// <summary>Port the server listens on when none is given.</summary>
    public const int DefaultPort = 50551;

    /// <summary>Directory of the dataset store (SQLite); created on first start. Unused with <see cref="PostgresConnectionString"/>.</summary>
    public required string DataDirectory { get; init; }

    /// <summary>
    /// Keep the datasets in this PostgreSQL database (an Npgsql connection string) instead of <see cref="DataDirectory"/>:
    /// any number of servers on it answer alike (see README, "Running several servers"). Null: SQLite.
    /// </summary>
    public string? PostgresConnectionString { get; init; }

    /// <summary>Where the store is, for messages: the data directory, or the PostgreSQL database (never its password).</summary>
    public string StoreDescription => PostgresConnectionString is null
        ? $"'{DataDirectory}'"
        : Hull.Store.Postgres.PostgresDatasetStore.Describe(PostgresConnectionString);

    /// <summary>Address to bind; loopback unless a deployment asks for more.</summary>
    public IPAddress BindAddress { get; init; } = IPAddress.Loopback;

    /// <summary>TCP port; 0 picks a free one (see <see cref="HullServer.Port"/>).</summary>
    public int Port { get; init; } = DefaultPort;

    /// <summary>PEM certificate (or PKCS#12 file) for TLS; plain HTTP/2 when null.</summary>
    public string? TlsCertificatePath { get; init; }

    /// <summary>PEM private key for <see cref="TlsCertificatePath"/>; null when the certificate file holds it.</summary>
    public string? TlsKeyPath { get; init; }

    /// <summary>Bearer token that write methods require; null lets anyone write (loopback use).</summary>
    public string? WriteToken { get; init; }

    public ServiceLimits Limits { get; init; } = ServiceLimits.Default;

    /// <summary>Hulls kept in the cache before the least recently used are dropped.</summary>
    public int MaxCachedHulls { get; init; } = DefaultMaxCachedHulls;

    /// <summary>The hull cache's size when --max-cached-hulls is not given.</summary>
    public const int DefaultMaxCachedHulls = 512;

    /// <summary>Hulls of the latest versions built in the background once the server listens (see
    /// <see cref="StartupHullWarming"/>); 0, the default for servers started in-process, builds none. The server's
    /// command line defaults to <see cref="DefaultWarmHulls"/>.</summary>
    public int WarmHullsOnStart { get; init; }

    /// <summary>The command line's default for <see cref="WarmHullsOnStart"/>: half the default cache.</summary>
    public const int DefaultWarmHulls = 256;

    /// <summary>
    /// How long the server waits, once the port is bound and before it says it listens, for the startup warming to
    /// finish and a few of its own queries to run (see <see cref="ReadinessWarmUp"/>); zero, the default for servers
    /// started in-process, says it listens at once. The command line defaults to <see cref="DefaultWarmBeforeReady"/>.
    /// </summary>
    public TimeSpan WarmBeforeReady { get; init; }

    /// <summary>
    /// The command line's default for <see cref="WarmBeforeReady"/>: an upper bound, well above the 1–9 s the warming
    /// of a 1e4-entry dataset took on a quiet and on a very busy machine (bench/SERVICE.md); the server is ready as
    /// soon as the warming is done.
    /// </summary>
    public static readonly TimeSpan DefaultWarmBeforeReady = TimeSpan.FromSeconds(30);

    /// <summary>How long an import session waits for its next call before it lapses (see <see cref="ImportSessionSettings"/>).</summary>
    public TimeSpan ImportIdleExpiry { get; init; } = ImportSessionSettings.DefaultIdleExpiry;

    /// <summary>Join a cluster of servers that share hull work (see README, "Running a cluster"); null, the default:
    /// the server works alone.</summary>
    public Cluster.ClusterSettings? Cluster { get; init; }

    /// <summary>Least severe log level written (JSON lines on stderr).</summary>
    public LogLevel MinimumLogLevel { get; init; } = LogLevel.Information;
}
