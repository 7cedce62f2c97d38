using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.Hosting;

namespace Hull.Server.Cluster;

/// <summary>Makes a server one member (silo) of a cluster; the gRPC front is unchanged.</summary>
internal static class ClusterHosting
{
    public static void Join(WebApplicationBuilder builder, ClusterSettings cluster)
    {
        builder.UseOrleans(silo =>
        {
            // One machine, one member: the peers' port and the next one (the port clients of the cluster would use).
            silo.UseLocalhostClustering(siloPort: cluster.PeerPort, gatewayPort: cluster.PeerPort + 1,
                serviceId: cluster.ClusterName, clusterId: cluster.ClusterName);
        });
    }
}
