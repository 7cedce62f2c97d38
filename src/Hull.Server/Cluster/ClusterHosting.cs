using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Npgsql;
using Orleans.Configuration;

namespace Hull.Server.Cluster;

/// <summary>Makes a server one member (silo) of a cluster; the gRPC front is unchanged.</summary>
internal static class ClusterHosting
{
    public static void Join(WebApplicationBuilder builder, ClusterSettings cluster)
    {
        builder.Services.AddSingleton(cluster);
        builder.Services.AddSingleton(_ => NpgsqlDataSource.Create(cluster.MembershipConnectionString));
        builder.UseOrleans(silo =>
        {
            silo.Configure<ClusterOptions>(o =>
            {
                o.ClusterId = cluster.ClusterName;
                o.ServiceId = cluster.ClusterName;
            });
            silo.ConfigureEndpoints(cluster.PeerAddress, cluster.PeerPort, cluster.GatewayPort, listenOnAnyHostAddress: false);
            silo.Services.AddSingleton<IMembershipTable>(services =>
                new PostgresMembershipTable(services.GetRequiredService<NpgsqlDataSource>(), cluster.ClusterName));
            silo.Configure<ClusterMembershipOptions>(o =>
            {
                // A member that stops answering is declared dead after about three missed probes of two seconds, so
                // that its systems move to the others within seconds rather than the default half minute.
                o.ProbeTimeout = TimeSpan.FromSeconds(2);
                o.NumMissedProbesLimit = 3;
            });
        });
    }
}
