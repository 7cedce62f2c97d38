using Microsoft.AspNetCore.Builder;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Hosting;
using Npgsql;
using Orleans.Configuration;

namespace Hull.Server.Cluster;

/// <summary>Makes a server one member (silo) of a cluster; the gRPC front is unchanged.</summary>
internal static class ClusterHosting
{
    /// <summary>The longest a part of a request waits for its system's grain when the caller gave no deadline.</summary>
    public static readonly TimeSpan GrainCallTimeout = TimeSpan.FromMinutes(10);

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
            silo.Configure<SiloMessagingOptions>(o =>
            {
                // The caller's deadline or cancel ends a grain call (it reaches the grain); this only bounds a call
                // whose caller set none. Orleans' default of 30 s made a loaded member's queued parts time out and be
                // answered again by the receiving member, building their hulls twice.
                o.ResponseTimeout = GrainCallTimeout;
            });
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
