using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using Hull.Store.Tests.Backends;

namespace Hull.Server.Tests;

/// <summary>
/// A caller's deadline reaches the grain it asked: the grain's wait for a hull still being built ends with the
/// call, counted by the member that holds it, and the build goes on to serve the next caller.
/// </summary>
public sealed class ClusterCancellationTests
{
    [Fact]
    public async Task A_deadline_that_passes_while_a_grain_waits_for_its_hull_ends_the_grain_call_and_the_next_caller_gets_the_hull()
    {
        string store = PostgresTestCluster.NewSchema("cluster");
        await using var member = await RunningServer.StartAsync(o => ClusterTests.Member(o, store));
        var c = member.Clients;
        // A five-element system whose hull build is held until the deadline below has passed.
        string[] elements = ["Li", "Mn", "Ni", "Co", "O"];
        var random = new Random(11);
        var entries = new List<Entry>(elements.Select(e => Data.Formation(e.ToLowerInvariant(), e, 0.0)));
        for (int i = 0; i < 2_000; i++)
        {
            string formula = string.Concat(elements.Select(e => e + random.Next(1, 30)));
            entries.Add(Data.Formation($"r{i}", formula, -2.0 + 0.5 * random.NextDouble()));
        }

        await Data.CreateWithAsync(c, "slow", [.. entries]);
        // The version loaded first (through a small system's grain), so that the deadline falls in the build.
        await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "slow", Formulas = { "LiO" } }, c.Call());
        using var release = new ManualResetEventSlim();
        member.Server.Cache.BeforeHullBuild = () => release.Wait(TimeSpan.FromMinutes(5));
        var query = new GetHullEnergiesRequest { Dataset = "slow", Formulas = { "LiMnNiCoO4" } };
        RpcException e = await Assert.ThrowsAsync<RpcException>(() => c.Stability.GetHullEnergiesAsync(query, c.Call(TimeSpan.FromMilliseconds(300))).ResponseAsync);
        Assert.Equal(StatusCode.DeadlineExceeded, e.StatusCode);
        for (int attempt = 0; member.Server.ClusterCounters.GrainCallsCancelled == 0 && attempt < 100; attempt++) await Task.Delay(100);
        Assert.Equal(1, member.Server.ClusterCounters.GrainCallsCancelled);

        // The held build goes on once released and serves the next caller.
        release.Set();
        GetHullEnergiesResponse answered = await c.Stability.GetHullEnergiesAsync(query, c.Call());
        Assert.Equal("Co-Li-Mn-Ni-O", answered.Results[0].ChemicalSystem);
        Assert.Equal(1, member.Server.ClusterCounters.GrainCallsCancelled);
    }
}
