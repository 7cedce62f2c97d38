using System.Text.RegularExpressions;
using Microsoft.Extensions.DependencyInjection;

namespace Hull.Server.Cluster;

/// <summary>This member's view of the cluster: how many members are active, and this member's own state.</summary>
/// <param name="ClusterName">The cluster's name.</param>
/// <param name="ActiveMembers">Members the membership table holds as active, this one included when it is.</param>
/// <param name="ThisMemberStatus">This member's state in the table: JOINING, ACTIVE, SHUTTING_DOWN, STOPPING, DEAD, ...</param>
/// <param name="GrainHullBuilds">System hulls this member built as the cluster's holder of them.</param>
public sealed partial record ClusterStatus(string ClusterName, int ActiveMembers, string ThisMemberStatus, long GrainHullBuilds)
{
    /// <summary>The state a member is in while it takes part in the cluster.</summary>
    public const string Active = "ACTIVE";

    /// <summary>The status read from a member's services; null for a server without a cluster.</summary>
    internal static ClusterStatus? Of(IServiceProvider services)
    {
        if (services.GetService<ClusterSettings>() is not { } settings || services.GetService<IClusterMembershipService>() is not { } membership) return null;
        SiloAddress self = services.GetRequiredService<ILocalSiloDetails>().SiloAddress;
        ClusterMembershipSnapshot snapshot = membership.CurrentSnapshot;
        SiloStatus status = snapshot.Members.TryGetValue(self, out ClusterMember? me) ? me.Status : SiloStatus.None;
        return new ClusterStatus(settings.ClusterName, snapshot.Members.Values.Count(m => m.Status == SiloStatus.Active),
            WordBoundary().Replace(status.ToString(), "_").ToUpperInvariant(), services.GetRequiredService<ClusterCounters>().GrainHullBuilds);
    }

    // ShuttingDown -> Shutting_Down: the wire's states are upper snake case.
    [GeneratedRegex("(?<=[a-z])(?=[A-Z])")]
    private static partial Regex WordBoundary();
}
