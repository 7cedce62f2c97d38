using Hull.Store;
using Microsoft.Extensions.Diagnostics.HealthChecks;

namespace Hull.Server.Hosting;

/// <summary>Healthy only when the store can read and write its database right now.</summary>
public sealed class StoreHealthCheck(IDatasetStore store) : IHealthCheck
{
    public async Task<HealthCheckResult> CheckHealthAsync(HealthCheckContext context, CancellationToken cancellationToken = default)
    {
        // The store's check may wait for an import in progress; keep it off the request thread.
        (bool healthy, string? problem) = await Task.Run(() => (store.CheckHealth(out string? p), p), cancellationToken);
        return healthy ? HealthCheckResult.Healthy($"store usable: {store.Location}") : HealthCheckResult.Unhealthy(problem ?? "store not usable");
    }
}
