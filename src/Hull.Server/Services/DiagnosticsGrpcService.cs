using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Hosting;

namespace Hull.Server.Services;

/// <summary>The diagnostics service: the limits in force, the hull-cache counters, and the store's and cluster's health.</summary>
public sealed class DiagnosticsGrpcService(ServiceLimits limits, HullCache cache, Store.IDatasetStore store, IServiceProvider services)
    : DiagnosticsService.DiagnosticsServiceBase
{
    public override async Task<ServerHealth> GetServerHealth(GetServerHealthRequest request, ServerCallContext context)
    {
        // The store's check may wait for an import in progress; keep it off the request thread.
        (bool usable, string? problem) = await Task.Run(() => (store.CheckHealth(out string? p), p), context.CancellationToken);
        var health = new ServerHealth { StoreLocation = store.Location, StoreUsable = usable, StoreProblem = problem ?? string.Empty };
        if (Cluster.ClusterStatus.Of(services) is { } cluster)
        {
            health.ClusterName = cluster.ClusterName;
            health.ActiveMembers = cluster.ActiveMembers;
            health.MemberStatus = cluster.ThisMemberStatus;
            health.GrainHullBuilds = cluster.GrainHullBuilds;
        }

        return health;
    }

    public override Task<ServerLimits> GetServerLimits(GetServerLimitsRequest request, ServerCallContext context) =>
        Task.FromResult(new ServerLimits
        {
            MaxComponentsPerSystem = limits.MaxComponentsPerSystem,
            MaxEntriesPerSystem = limits.MaxEntriesPerSystem,
            MaxCompositionsPerRequest = limits.MaxCompositionsPerRequest,
            MaxReceiveMessageBytes = limits.MaxReceiveMessageBytes,
            MaxSendMessageBytes = limits.MaxSendMessageBytes,
        });

    public override Task<CacheStatistics> GetCacheStatistics(GetCacheStatisticsRequest request, ServerCallContext context) =>
        Task.FromResult(new CacheStatistics
        {
            HullBuilds = cache.Counters.HullBuilds,
            HullCacheHits = cache.Counters.HullHits,
            VersionLoads = cache.Counters.VersionLoads,
            DatasetAnalyses = cache.Counters.DatasetAnalyses,
            CachedHulls = cache.CachedHullCount,
        });
}
