using Microsoft.Extensions.DependencyInjection;

namespace Hull.Server.Cluster;

/// <summary>This member's view of the cluster: how many members are active, and this member's own state.</summary>
/// <param name="ActiveMembers">Members the membership table holds as active, this one included when it is.</param>
/// <param name="ThisMemberStatus">This member's state in the table (e.g. Joining, Active, ShuttingDown, Dead).</param>
public sealed record ClusterStatus(int ActiveMembers, string ThisMemberStatus)
{
    /// <summary>The status read from a member's services; null for a server without a cluster.</summary>
    internal static ClusterStatus? Of(IServiceProvider services)
    {
        if (services.GetService<IClusterMembershipService>() is not { } membership) return null;
        SiloAddress self = services.GetRequiredService<ILocalSiloDetails>().SiloAddress;
        ClusterMembershipSnapshot snapshot = membership.CurrentSnapshot;
        SiloStatus status = snapshot.Members.TryGetValue(self, out ClusterMember? me) ? me.Status : SiloStatus.None;
        return new ClusterStatus(snapshot.Members.Values.Count(m => m.Status == SiloStatus.Active), status.ToString());
    }
}
