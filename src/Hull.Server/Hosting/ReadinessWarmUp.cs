using System.Diagnostics;
using System.Security.Cryptography.X509Certificates;
using Grpc.Net.Client;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Store;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Hosting;

/// <summary>
/// Before a server says it listens: waits for the startup hull warming, then sends a few stability questions of its
/// own through its port (entries by id and ad-hoc compositions of the first dataset's latest version), so that the
/// first callers find the version loaded, the hulls built and the request path compiled instead of waiting on all
/// three. Bounded by a time budget; a failure or an empty store only ends it early (the server is ready regardless).
/// </summary>
public static class ReadinessWarmUp
{
    // Enough calls per kind for the runtime to promote the hot methods (it does so after 30 calls).
    private const int CallsPerKind = 64;
    private const int Concurrency = 4;

    public static async Task RunAsync(Uri address, X509Certificate2? certificate, IServiceProvider services, TimeSpan budget, CancellationToken cancellation)
    {
        ILogger log = services.GetRequiredService<ILoggerFactory>().CreateLogger(typeof(ReadinessWarmUp));
        long start = Stopwatch.GetTimestamp();
        using var timeout = CancellationTokenSource.CreateLinkedTokenSource(cancellation);
        timeout.CancelAfter(budget);
        int answered = 0;
        try
        {
            await services.GetRequiredService<StartupWarmingProgress>().Finished.WaitAsync(timeout.Token);
            (string Dataset, PhaseEntry[] Entries)? sample = await SampleAsync(services, timeout.Token);
            if (sample is { } s)
            {
                using GrpcChannel channel = Loopback(address, certificate);
                var stability = new StabilityService.StabilityServiceClient(channel);
                answered = await AskAsync(stability, s.Dataset, s.Entries, timeout.Token);
            }

            log.LogInformation("ready after warming: {Answered} own questions answered in {Seconds:F2} s", answered, Stopwatch.GetElapsedTime(start).TotalSeconds);
        }
        catch (OperationCanceledException) when (!cancellation.IsCancellationRequested)
        {
            log.LogInformation("ready after the warm-up budget of {Seconds:F1} s ({Answered} own questions answered)", budget.TotalSeconds, answered);
        }
        catch (Exception e) when (e is Grpc.Core.RpcException or StoreException or HttpRequestException or System.Data.Common.DbException)
        {
            log.LogWarning(e, "warm-up before ready stopped early; the server is ready");
        }
    }

    /// <summary>The first dataset (by name) with a latest version, and entries spread evenly over it.</summary>
    private static async Task<(string, PhaseEntry[])?> SampleAsync(IServiceProvider services, CancellationToken cancellation)
    {
        IDatasetStore store = services.GetRequiredService<IDatasetStore>();
        Hull.Store.DatasetSummary? dataset = store.ListDatasets().Where(d => d.LatestVersion != IDatasetStore.NoVersion).OrderBy(d => d.Name, StringComparer.Ordinal).FirstOrDefault();
        if (dataset is null) return null;
        VersionResolver versions = services.GetRequiredService<VersionResolver>();
        VersionSnapshot snapshot = await services.GetRequiredService<HullCache>().GetSnapshotAsync(versions.Resolve(dataset.Name, 0), cancellation);
        if (snapshot.Entries.Count == 0) return null;
        int step = Math.Max(1, snapshot.Entries.Count / CallsPerKind);
        return (dataset.Name, Enumerable.Range(0, Math.Min(CallsPerKind, snapshot.Entries.Count)).Select(i => snapshot.Entries[i * step % snapshot.Entries.Count]).ToArray());
    }

    /// <summary>Each sampled entry asked for by id and as an ad-hoc composition, a few calls at a time; the answers.</summary>
    private static async Task<int> AskAsync(StabilityService.StabilityServiceClient stability, string dataset, PhaseEntry[] entries, CancellationToken cancellation)
    {
        int answered = 0;
        async Task Worker(int first)
        {
            for (int i = first; i < entries.Length; i += Concurrency)
            {
                var byId = new GetEntryStabilityRequest { Dataset = dataset, EntryIds = { entries[i].Id } };
                await stability.GetEntryStabilityAsync(byId, cancellationToken: cancellation);
                var candidate = new AssessCandidatesRequest
                {
                    Dataset = dataset,
                    Candidates = { new Candidate { Formula = entries[i].Composition.Formula, EnergyEv = 0, Basis = Protos.V1.EnergyBasis.FormationPerAtom } },
                };
                await stability.AssessCandidatesAsync(candidate, cancellationToken: cancellation);
                Interlocked.Add(ref answered, 2);
            }
        }

        await Task.WhenAll(Enumerable.Range(0, Concurrency).Select(Worker));
        return answered;
    }

    /// <summary>A channel to the server's own port (loopback when it binds every address), trusting only its own certificate.</summary>
    private static GrpcChannel Loopback(Uri address, X509Certificate2? certificate)
    {
        var target = new UriBuilder(address);
        if (target.Host is "0.0.0.0") target.Host = "127.0.0.1";
        if (target.Host is "[::]" or "::") target.Host = "[::1]";
        var handler = new SocketsHttpHandler();
        if (certificate is not null)
        {
            string own = certificate.GetCertHashString();
            handler.SslOptions.RemoteCertificateValidationCallback = (_, presented, _, _) =>
                presented is not null && string.Equals(presented.GetCertHashString(), own, StringComparison.OrdinalIgnoreCase);
        }

        return GrpcChannel.ForAddress(target.Uri, new GrpcChannelOptions { HttpHandler = handler, DisposeHttpClient = true });
    }
}
