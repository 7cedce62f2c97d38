using Microsoft.Extensions.Diagnostics.HealthChecks;

namespace Hull.Server.Cluster;

/// <summary>A cluster member is healthy only while the membership holds it as active (not joining, leaving or dead).</summary>
internal sealed class ClusterHealthCheck(IServiceProvider services) : IHealthCheck
{
    public Task<HealthCheckResult> CheckHealthAsync(HealthCheckContext context, CancellationToken cancellationToken = default)
    {
        ClusterStatus? status = ClusterStatus.Of(services);
        string text = status is null ? "no cluster" : $"{status.ActiveMembers} active members; this one {status.ThisMemberStatus}";
        return Task.FromResult(status?.ThisMemberStatus == ClusterStatus.Active ? HealthCheckResult.Healthy(text) : HealthCheckResult.Unhealthy(text));
    }
}
