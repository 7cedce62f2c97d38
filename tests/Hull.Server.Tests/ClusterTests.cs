using System.Net;
using System.Net.Sockets;
using Hull.Protos.V1;
using Hull.Server.Cluster;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// A server that is a cluster member answers hull energies through the grain that holds each system's hull; its
/// answers must be the lone server's, byte for byte (the lone server's hull energies are checked against SciPy's
/// linear program in <see cref="LinearProgramReferenceTests"/>).
/// </summary>
public sealed class ClusterTests
{
    [Fact]
    public async Task A_one_member_cluster_answers_as_a_lone_server_and_builds_each_system_hull_once()
    {
        await using var lone = await RunningServer.StartAsync();
        await using var member = await RunningServer.StartAsync(o => o with { Cluster = new ClusterSettings("hull-test", FreePort()) });
        foreach (var s in new[] { lone, member })
        {
            await Data.CreateWithAsync(s.Clients, "cl",
                Data.Formation("li", "Li", 0.0), Data.Formation("o", "O", 0.0), Data.Formation("co", "Co", 0.0),
                Data.Formation("li2o", "Li2O", -2.07), Data.Formation("lio2", "LiO2", -0.9), Data.Formation("coo", "CoO", -1.2),
                Data.Formation("licoo2", "LiCoO2", -1.8));
        }

        var request = new GetHullEnergiesRequest { Dataset = "cl", Formulas = { "LiO", "Li3O2", "CoO2", "LiCoO3", "Li2CoO3", "Li" } };
        GetHullEnergiesResponse expected = await lone.Clients.Stability.GetHullEnergiesAsync(request, lone.Clients.Call());
        GetHullEnergiesResponse first = await member.Clients.Stability.GetHullEnergiesAsync(request, member.Clients.Call());
        GetHullEnergiesResponse again = await member.Clients.Stability.GetHullEnergiesAsync(request, member.Clients.Call());

        Assert.Equal(expected, first);
        Assert.Equal(expected, again);
        // Four systems: Li-O, Co-O, Co-Li-O and Li; each built by its grain once, the second request built none.
        Assert.Equal(4, member.Server.ClusterCounters.GrainHullBuilds);
        Assert.Equal(0, lone.Server.ClusterCounters.GrainHullBuilds);
    }

    private static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}
