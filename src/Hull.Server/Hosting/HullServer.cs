using System.Security.Cryptography;
using System.Security.Cryptography.X509Certificates;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Security;
using Hull.Server.Services;
using Hull.Store;
using Hull.Store.Postgres;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Server.Kestrel.Core;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Console;

namespace Hull.Server.Hosting;

/// <summary>
/// A running hull server: Kestrel on HTTP/2 (plain or TLS) serving the dataset, stability and diagnostics services,
/// standard gRPC health checking and server reflection, over one dataset store. Used by the server executable, the
/// CLI's demo and the tests alike.
/// </summary>
public sealed class HullServer : IAsyncDisposable
{
    private readonly WebApplication _app;
    private readonly IDatasetStore _store;
    private int _stopped;

    private HullServer(WebApplication app, IDatasetStore store, Uri address)
    {
        _app = app;
        _store = store;
        Address = address;
    }

    /// <summary>The address clients use, e.g. http://127.0.0.1:50551.</summary>
    public Uri Address { get; }

    /// <summary>The port actually bound (useful with port 0).</summary>
    public int Port => Address.Port;

    /// <summary>Where the store keeps its data (see <see cref="IDatasetStore.Location"/>).</summary>
    public string StoreLocation => _store.Location;

    /// <summary>
    /// Whether a failure of <see cref="StartAsync"/> means the store cannot be opened, so that a host (such as the
    /// client's `hull serve`) can say so without referencing the store itself.
    /// </summary>
    public static bool IsStoreFailure(Exception error) => error is StoreException;

    /// <summary>The store the server runs on (for in-process callers such as tests).</summary>
    public IDatasetStore Store => _store;

    /// <summary>The hull cache (for in-process callers such as tests).</summary>
    public HullCache Cache => _app.Services.GetRequiredService<HullCache>();

    /// <summary>Stability-sampling calls under way and how past ones ended (for in-process callers such as tests).</summary>
    public Services.SamplingActivity Sampling => _app.Services.GetRequiredService<Services.SamplingActivity>();

    /// <summary>This server's counters as a cluster member (for in-process callers such as tests).</summary>
    public Cluster.ClusterCounters ClusterCounters => _app.Services.GetRequiredService<Cluster.ClusterCounters>();

    /// <summary>This server's view of its cluster; null without one.</summary>
    public Cluster.ClusterStatus? ClusterStatus => Cluster.ClusterStatus.Of(_app.Services);

    /// <summary>
    /// Opens the store and starts listening; returns once the port is bound and, with
    /// <see cref="HullServerOptions.WarmBeforeReady"/>, once the server has warmed up (or that time has passed).
    /// </summary>
    /// <exception cref="StoreException">The store cannot be opened (corrupt, newer schema, database unreachable).</exception>
    /// <exception cref="IOException">The port cannot be bound.</exception>
    /// <exception cref="TlsFileException">A TLS file is missing or unusable.</exception>
    public static async Task<HullServer> StartAsync(HullServerOptions options, CancellationToken cancellation = default)
    {
        ArgumentNullException.ThrowIfNull(options);
        X509Certificate2? certificate = LoadCertificate(options);
        IDatasetStore store = options.PostgresConnectionString is { } postgres
            ? PostgresDatasetStore.Open(postgres)
            : DatasetStore.Open(options.DataDirectory);
        try
        {
            WebApplication app = Build(options, store, certificate);
            await app.StartAsync(cancellation);
            string bound = app.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses.First();
            var server = new HullServer(app, store, new Uri(bound));
            if (options.WarmBeforeReady > TimeSpan.Zero)
            {
                await ReadinessWarmUp.RunAsync(server.Address, certificate, app.Services, options.WarmBeforeReady, cancellation);
            }

            return server;
        }
        catch
        {
            store.Dispose();
            throw;
        }
    }

    /// <summary>Completes when the host is asked to stop (SIGTERM, Ctrl+C, or <see cref="StopAsync"/>).</summary>
    public Task WaitForShutdownAsync(CancellationToken cancellation = default) => _app.WaitForShutdownAsync(cancellation);

    /// <summary>Stops listening, lets calls in flight finish briefly, and closes the store.</summary>
    public async Task StopAsync()
    {
        if (Interlocked.Exchange(ref _stopped, 1) != 0) return;
        try
        {
            using var grace = new CancellationTokenSource(TimeSpan.FromSeconds(5));
            await _app.StopAsync(grace.Token);
        }
        finally
        {
            await _app.DisposeAsync();
            _store.Dispose();
        }
    }

    public async ValueTask DisposeAsync() => await StopAsync();

    private static WebApplication Build(HullServerOptions options, IDatasetStore store, X509Certificate2? certificate)
    {
        WebApplicationBuilder builder = WebApplication.CreateSlimBuilder(new WebApplicationOptions
        {
            Args = [],
            ContentRootPath = AppContext.BaseDirectory,
        });

        builder.Logging.ClearProviders();
        builder.Logging.AddJsonConsole(json =>
        {
            json.UseUtcTimestamp = true;
            json.TimestampFormat = "yyyy-MM-ddTHH:mm:ss.fffZ";
        });
        // Logs go to stderr so that stdout carries only what the server prints for people and scripts.
        builder.Services.Configure<ConsoleLoggerOptions>(console => console.LogToStandardErrorThreshold = LogLevel.Trace);
        builder.Logging.SetMinimumLevel(options.MinimumLogLevel);
        builder.Logging.AddFilter("Microsoft.AspNetCore", LogLevel.Warning);
        builder.Logging.AddFilter("Grpc", LogLevel.Warning);
        builder.Logging.AddFilter("Microsoft.Extensions.Diagnostics.HealthChecks", LogLevel.Warning);

        builder.WebHost.ConfigureKestrel(kestrel =>
        {
            kestrel.AddServerHeader = false;
            kestrel.Listen(options.BindAddress, options.Port, listen =>
            {
                listen.Protocols = HttpProtocols.Http2;
                if (certificate is not null) listen.UseHttps(certificate);
            });
        });

        ServiceLimits limits = options.Limits;
        builder.Services.AddSingleton(store);
        builder.Services.AddSingleton(limits);
        builder.Services.AddSingleton(new WriteTokenSetting(options.WriteToken));
        builder.Services.AddSingleton(new CacheSettings(options.MaxCachedHulls));
        builder.Services.AddSingleton<VersionResolver>();
        builder.Services.AddSingleton<HullCache>();
        builder.Services.AddSingleton<Cluster.ClusterCounters>();
        if (options.Cluster is { } cluster)
        {
            Cluster.ClusterHosting.Join(builder, cluster);
        }

        builder.Services.AddSingleton<CompoundResolution>();
        builder.Services.AddSingleton<ImportGate>();
        builder.Services.AddSingleton<Corrections.CorrectedVersionWriter>();
        builder.Services.AddSingleton<Defects.DefectStudyCache>();
        builder.Services.AddSingleton<Services.SamplingActivity>();
        builder.Services.AddSingleton(new ImportSessionSettings(options.ImportIdleExpiry));
        builder.Services.AddHostedService<ImportSessionSweeper>();
        // Never more than half the cache, so that warming cannot evict what queries need.
        builder.Services.AddSingleton(new StartupWarmingSettings(Math.Min(options.WarmHullsOnStart, options.MaxCachedHulls / 2)));
        builder.Services.AddSingleton<StartupWarmingProgress>();
        builder.Services.AddHostedService<StartupHullWarming>();
        builder.Services.AddGrpc(grpc =>
        {
            grpc.MaxReceiveMessageSize = limits.MaxReceiveMessageBytes;
            grpc.MaxSendMessageSize = limits.MaxSendMessageBytes;
            grpc.EnableDetailedErrors = false;
            // Outermost first: errors (including refused tokens) are translated and logged in one place.
            grpc.Interceptors.Add<ErrorTranslationInterceptor>();
            grpc.Interceptors.Add<WriteTokenInterceptor>();
        });
        IHealthChecksBuilder health = builder.Services.AddGrpcHealthChecks().AddCheck<StoreHealthCheck>("store");
        if (options.Cluster is not null) health.AddCheck<Cluster.ClusterHealthCheck>("cluster");
        builder.Services.AddGrpcReflection();

        WebApplication app = builder.Build();
        app.MapGrpcService<DatasetGrpcService>();
        app.MapGrpcService<StabilityGrpcService>();
        app.MapGrpcService<DiagnosticsGrpcService>();
        app.MapGrpcService<FigureGrpcService>();
        app.MapGrpcService<UncertaintyGrpcService>();
        app.MapGrpcService<WindowGrpcService>();
        app.MapGrpcService<DefectGrpcService>();
        app.MapGrpcService<ElectrochemistryGrpcService>();
        app.MapGrpcService<CurationGrpcService>();
        app.MapGrpcService<ThermoGrpcService>();
        app.MapGrpcService<CorrectionGrpcService>();
        app.MapGrpcHealthChecksService();
        app.MapGrpcReflectionService();
        return app;
    }

    /// <exception cref="TlsFileException">A TLS file is missing or not a usable certificate with its private key.</exception>
    private static X509Certificate2? LoadCertificate(HullServerOptions options)
    {
        string? cert = options.TlsCertificatePath, key = options.TlsKeyPath;
        if (cert is null)
        {
            if (key is not null) throw new TlsFileException($"--tls-key '{key}' needs --tls-cert as well");
            return null;
        }

        foreach ((string option, string? path) in new[] { ("--tls-cert", cert), ("--tls-key", key) })
        {
            if (path is not null && !File.Exists(path)) throw new TlsFileException($"{option} '{path}': no such file");
        }

        bool pem = key is not null || cert.EndsWith(".pem", StringComparison.OrdinalIgnoreCase);
        X509Certificate2 certificate;
        try
        {
            certificate = key is not null ? X509Certificate2.CreateFromPemFile(cert, key)
                : pem ? X509Certificate2.CreateFromPemFile(cert)
                : X509CertificateLoader.LoadPkcs12FromFile(cert, password: null);
        }
        catch (Exception e) when (e is CryptographicException or IOException or UnauthorizedAccessException or ArgumentException)
        {
            string what = key is not null ? $"--tls-cert '{cert}' with --tls-key '{key}' is not a usable PEM certificate and private key"
                : pem ? $"--tls-cert '{cert}' is not a usable PEM file holding a certificate and its private key (or give the key with --tls-key)"
                : $"--tls-cert '{cert}' is not a usable PKCS#12 file without a password (a PEM certificate needs a name ending in .pem, or --tls-key)";
            throw new TlsFileException($"{what}: {e.Message}", e);
        }

        if (!certificate.HasPrivateKey)
        {
            certificate.Dispose();
            throw new TlsFileException($"--tls-cert '{cert}' holds no private key; give it with --tls-key");
        }

        return certificate;
    }
}
