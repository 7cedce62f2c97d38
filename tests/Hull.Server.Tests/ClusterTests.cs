using System.Net;
using System.Net.Sockets;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Cluster;
using Hull.Server.Tests.Support;
using Hull.Store.Tests.Backends;

namespace Hull.Server.Tests;

/// <summary>
/// Servers that are members of one cluster (membership in the shared PostgreSQL) answer hull energies through the
/// grain that holds each system's hull; their answers must be the lone server's, byte for byte (the lone server's
/// hull energies are checked against SciPy's linear program in <see cref="LinearProgramReferenceTests"/>), and so
/// must their refusals.
/// </summary>
public sealed class ClusterTests
{
    private static readonly GetHullEnergiesRequest Request =
        new() { Dataset = "cl", Formulas = { "LiO", "Li3O2", "CoO2", "LiCoO3", "Li2CoO3", "Li" } };

    [Fact]
    public async Task Two_members_see_each_other_answer_as_a_lone_server_and_build_each_system_hull_once_between_them()
    {
        string store = PostgresTestCluster.NewSchema("cluster");
        await using var lone = await RunningServer.StartAsync();
        await using var first = await RunningServer.StartAsync(o => Member(o, store));
        await using var second = await RunningServer.StartAsync(o => Member(o, store));
        await CreateAsync(lone);
        await CreateAsync(first);

        Assert.Equal(2, await ActiveMembersAsync(first));
        Assert.Equal(2, await ActiveMembersAsync(second));
        ServerHealth health = await second.Clients.Diagnostics.GetServerHealthAsync(new GetServerHealthRequest(), second.Clients.Call());
        Assert.Equal(("hull-test", 2, "ACTIVE", true, ""), (health.ClusterName, health.ActiveMembers, health.MemberStatus, health.StoreUsable, health.StoreProblem));
        Assert.Equal(second.Server.StoreLocation, health.StoreLocation);
        ServerHealth alone = await lone.Clients.Diagnostics.GetServerHealthAsync(new GetServerHealthRequest(), lone.Clients.Call());
        Assert.Equal(("", 0, "", true, 0L), (alone.ClusterName, alone.ActiveMembers, alone.MemberStatus, alone.StoreUsable, alone.GrainHullBuilds));
        GetHullEnergiesResponse expected = await lone.Clients.Stability.GetHullEnergiesAsync(Request, lone.Clients.Call());
        foreach (RunningServer member in new[] { first, second, first, second })
        {
            Assert.Equal(expected, await member.Clients.Stability.GetHullEnergiesAsync(Request, member.Clients.Call()));
        }

        // Four systems: Li-O, Co-O, Co-Li-O and Li; each built by its grain once in the cluster, wherever it was placed.
        Assert.Equal(4, first.Server.ClusterCounters.GrainHullBuilds + second.Server.ClusterCounters.GrainHullBuilds);
        Assert.Equal(second.Server.ClusterCounters.GrainHullBuilds,
            (await second.Clients.Diagnostics.GetServerHealthAsync(new GetServerHealthRequest(), second.Clients.Call())).GrainHullBuilds);
        Assert.Equal(0, lone.Server.ClusterCounters.GrainHullBuilds);
    }

    [Fact]
    public async Task A_refusal_inside_a_members_grain_reaches_the_caller_as_a_lone_servers_refusal()
    {
        string store = PostgresTestCluster.NewSchema("cluster");
        await using var lone = await RunningServer.StartAsync();
        await using var member = await RunningServer.StartAsync(o => Member(o, store));
        // Total energies without an elemental entry of O: the grain finds it when it builds the Li-O hull.
        foreach (var s in new[] { lone, member })
        {
            await Data.CreateWithAsync(s.Clients, "noref", Data.Total("li", "Li", -1.9), Data.Total("li2o", "Li2O", -14.3));
        }

        var request = new GetHullEnergiesRequest { Dataset = "noref", Formulas = { "Li", "LiO" } };
        RpcException expected = await Assert.ThrowsAsync<RpcException>(() => lone.Clients.Stability.GetHullEnergiesAsync(request, lone.Clients.Call()).ResponseAsync);
        RpcException got = await Assert.ThrowsAsync<RpcException>(() => member.Clients.Stability.GetHullEnergiesAsync(request, member.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.FailedPrecondition, expected.StatusCode);
        Assert.Equal(expected.StatusCode, got.StatusCode);
        Assert.Equal(expected.Status.Detail, got.Status.Detail);
        Assert.Equal(expected.GetRpcStatus(), got.GetRpcStatus());
        Assert.Equal(1, member.Server.ClusterCounters.GrainHullBuilds); // Li's hull; Li-O's was refused, not built
    }

    [Fact]
    public async Task A_limit_refusal_is_the_lone_servers()
    {
        string store = PostgresTestCluster.NewSchema("cluster");
        await using var lone = await RunningServer.StartAsync(o => o with { Limits = o.Limits with { MaxEntriesPerSystem = 3 } });
        await using var member = await RunningServer.StartAsync(o => Member(o, store) with { Limits = o.Limits with { MaxEntriesPerSystem = 3 } });
        await CreateAsync(lone);
        await CreateAsync(member);

        RpcException expected = await Assert.ThrowsAsync<RpcException>(() => lone.Clients.Stability.GetHullEnergiesAsync(Request, lone.Clients.Call()).ResponseAsync);
        RpcException got = await Assert.ThrowsAsync<RpcException>(() => member.Clients.Stability.GetHullEnergiesAsync(Request, member.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.ResourceExhausted, expected.StatusCode);
        Assert.Equal(expected.GetRpcStatus(), got.GetRpcStatus());
    }

    internal static Hull.Server.Hosting.HullServerOptions Member(Hull.Server.Hosting.HullServerOptions options, string store) => options with
    {
        PostgresConnectionString = store,
        Cluster = new ClusterSettings("hull-test", FreePort(), FreePort(), store),
    };

    internal static Task CreateAsync(RunningServer server) =>
        Data.CreateWithAsync(server.Clients, "cl",
            Data.Formation("li", "Li", 0.0), Data.Formation("o", "O", 0.0), Data.Formation("co", "Co", 0.0),
            Data.Formation("li2o", "Li2O", -2.07), Data.Formation("lio2", "LiO2", -0.9), Data.Formation("coo", "CoO", -1.2),
            Data.Formation("licoo2", "LiCoO2", -1.8));

    internal static async Task<int> ActiveMembersAsync(RunningServer server, int expected = 2)
    {
        // Membership settles within a few probe rounds; ask until all are in, or give up after half a minute.
        for (int attempt = 0; ; attempt++)
        {
            int active = server.Server.ClusterStatus!.ActiveMembers;
            if (active >= expected || attempt == 60) return active;
            await Task.Delay(500);
        }
    }

    internal static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}
