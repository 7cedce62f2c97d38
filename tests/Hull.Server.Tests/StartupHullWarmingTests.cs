using Hull.Protos.V1;
using Hull.Server.Hosting;
using Hull.Server.Tests.Support;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Tests;

/// <summary>A server started on a store with data builds the latest versions' hulls in the background, so that the
/// first queries find them cached, with every entry's answer on its own system's hull made; with warming off (the
/// in-process default) it builds none until asked.</summary>
public sealed class StartupHullWarmingTests
{
    [Fact]
    public async Task A_restarted_server_builds_every_system_of_the_latest_version_before_any_query()
    {
        using var folder = new TempFolder();
        await using (HullServer first = await HullServer.StartAsync(Options(folder, warmHulls: 0)))
        {
            using var c = new Clients(first.Address, token: null);
            // Li-Co-O, Li-O, Co-O and the elements: each entry's own chemical system is one hull.
            await Data.CreateWithAsync(c, "d", Data.LiCoO());
            await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("Fe2O3", "Fe2O3", -1.7), Data.Formation("Fe", "Fe", 0.0)), c.Call());
            Assert.Equal(0, first.Cache.Counters.HullBuilds);
        }

        var stored = Data.LiCoO().Append(Data.Formation("Fe2O3", "Fe2O3", -1.7)).Append(Data.Formation("Fe", "Fe", 0.0)).ToArray();
        int systems = stored.Select(e => string.Join('-', Hull.Core.Chemistry.Composition.Parse(e.Formula).Elements)).Distinct().Count();
        await using HullServer second = await HullServer.StartAsync(Options(folder, warmHulls: 64));
        var deadline = DateTime.UtcNow.AddSeconds(60);
        while (second.Cache.Counters.EntryAnswersMade < stored.Length && DateTime.UtcNow < deadline) await Task.Delay(20);
        Assert.Equal(systems, second.Cache.Counters.HullBuilds);
        Assert.Equal(1, second.Cache.Counters.VersionLoads);
        Assert.Equal(stored.Length, second.Cache.Counters.EntryAnswersMade);

        using var client = new Clients(second.Address, token: null);
        var answer = await client.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "LiCoO2", "Fe2O3" } }, client.Call());
        Assert.Equal(2, answer.Used.Version);
        Assert.Equal(systems, second.Cache.Counters.HullBuilds);
        Assert.Equal(2, second.Cache.Counters.HullHits);
        // Both answers were made by the warming, not by the question.
        Assert.Equal(stored.Length, second.Cache.Counters.EntryAnswersMade);
    }

    [Fact]
    public async Task A_server_that_warms_before_ready_has_built_the_hulls_and_answered_its_own_questions_when_it_starts()
    {
        using TempFolder folder = await LiCoOStoreAsync();

        int systems = Data.LiCoO().Select(e => string.Join('-', Hull.Core.Chemistry.Composition.Parse(e.Formula).Elements)).Distinct().Count();
        // A budget no machine needs: StartAsync returns when the warming and the own questions are done.
        HullServerOptions options = Options(folder, warmHulls: 64) with { WarmBeforeReady = TimeSpan.FromMinutes(5) };
        await using HullServer ready = await HullServer.StartAsync(options);
        Assert.Equal(systems, ready.Cache.Counters.HullBuilds);
        Assert.Equal(1, ready.Cache.Counters.VersionLoads);
        // Its own questions (every entry by id and as a composition) found the hulls built.
        Assert.True(ready.Cache.Counters.HullHits >= 2 * Data.LiCoO().Length, $"{ready.Cache.Counters.HullHits} hull cache hits");
    }

    [Fact]
    public async Task Warming_stops_at_its_budget_and_is_off_by_default_in_process()
    {
        using TempFolder folder = await LiCoOStoreAsync();

        await using (HullServer budget = await HullServer.StartAsync(Options(folder, warmHulls: 2)))
        {
            var deadline = DateTime.UtcNow.AddSeconds(60);
            while (budget.Cache.Counters.HullBuilds < 2 && DateTime.UtcNow < deadline) await Task.Delay(20);
            await Task.Delay(300);
            Assert.Equal(2, budget.Cache.Counters.HullBuilds);
        }

        await using HullServer off = await HullServer.StartAsync(new HullServerOptions { DataDirectory = folder.Path, Port = 0, MinimumLogLevel = LogLevel.Warning });
        await Task.Delay(300);
        Assert.Equal(0, off.Cache.Counters.HullBuilds);
    }

    /// <summary>A store with the LiCoO2 set as dataset "d", written by a server that has stopped.</summary>
    private static async Task<TempFolder> LiCoOStoreAsync()
    {
        var folder = new TempFolder();
        await using HullServer first = await HullServer.StartAsync(Options(folder, warmHulls: 0));
        using var c = new Clients(first.Address, token: null);
        await Data.CreateWithAsync(c, "d", Data.LiCoO());
        return folder;
    }

    private static HullServerOptions Options(TempFolder folder, int warmHulls) =>
        new() { DataDirectory = folder.Path, Port = 0, MinimumLogLevel = LogLevel.Warning, WarmHullsOnStart = warmHulls };
}
