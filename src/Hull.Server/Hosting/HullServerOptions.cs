using System.Net;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Hosting;

/// <summary>How to run one server: where the data lives, where to listen, and what to require of callers.</summary>
public sealed record HullServerOptions
{
    /// <summary>Port the server listens on when none is given.</summary>
    public const int DefaultPort = 50551;

    /// <summary>Directory of the dataset store; created on first start.</summary>
    public required string DataDirectory { get; init; }

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
    public int MaxCachedHulls { get; init; } = 512;

    /// <summary>Hulls of the latest versions built in the background once the server listens (see
    /// <see cref="StartupHullWarming"/>); 0, the default for servers started in-process, builds none. The server's
    /// command line defaults to <see cref="DefaultWarmHulls"/>.</summary>
    public int WarmHullsOnStart { get; init; }

    /// <summary>The command line's default for <see cref="WarmHullsOnStart"/>: half the default cache.</summary>
    public const int DefaultWarmHulls = 256;

    /// <summary>How long an import session waits for its next call before it lapses (see <see cref="ImportSessionSettings"/>).</summary>
    public TimeSpan ImportIdleExpiry { get; init; } = ImportSessionSettings.DefaultIdleExpiry;

    /// <summary>Least severe log level written (JSON lines on stderr).</summary>
    public LogLevel MinimumLogLevel { get; init; } = LogLevel.Information;
}
