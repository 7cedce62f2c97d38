using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Hosting;

namespace Hull.Server.Services;

/// <summary>The diagnostics service: the limits in force and the hull-cache counters.</summary>
public sealed class DiagnosticsGrpcService(ServiceLimits limits, HullCache cache) : DiagnosticsService.DiagnosticsServiceBase
{
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
