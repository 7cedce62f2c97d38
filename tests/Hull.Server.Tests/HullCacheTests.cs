using Hull.Core.Chemistry;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Hosting;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>Hulls are built once per (dataset, version content, chemical system) and never served stale.</summary>
public sealed class HullCacheTests
{
    [Fact]
    public async Task Sixty_four_concurrent_identical_queries_build_the_hull_once()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        // A few hundred Li-Co-O entries, so that the build takes long enough for the queries to overlap.
        var entries = new List<Entry>(Data.LiCoO());
        var random = new Random(7);
        for (int i = 0; i < 400; i++)
        {
            int li = random.Next(1, 9), co = random.Next(1, 9), o = random.Next(1, 17);
            entries.Add(Data.Formation($"r{i}", $"Li{li}Co{co}O{o}", -1.0 + random.NextDouble()));
        }

        await Data.CreateWithAsync(c, "d", [.. entries]);
        CacheStatistics before = await c.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), c.Call());
        Assert.Equal(0, before.HullBuilds);

        using var start = new ManualResetEventSlim(false);
        Task<GetEntryStabilityResponse>[] queries = Enumerable.Range(0, 64).Select(_ => Task.Run(async () =>
        {
            start.Wait();
            return await c.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "LiCoO2" } }, c.Call());
        })).ToArray();
        start.Set();
        GetEntryStabilityResponse[] answers = await Task.WhenAll(queries);

        CacheStatistics after = await c.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), c.Call());
        Assert.Equal(1, after.HullBuilds);
        Assert.Equal(63, after.HullCacheHits);
        Assert.Equal(1, after.VersionLoads);
        Assert.All(answers, a => Assert.Equal(answers[0], a));
    }

    [Fact]
    public async Task A_new_version_never_serves_the_old_hull()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        await Data.CreateWithAsync(c, "d", Data.LiCoO());
        var query = new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "LiCoO2" } };
        var first = await c.Stability.GetEntryStabilityAsync(query, c.Call());
        Assert.Equal(0.0, first.Results[0].EnergyAboveHullEvPerAtom);

        // A new phase at the same composition, lower in energy: LiCoO2 leaves the hull in version 2.
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("LiCoO2-new", "LiCoO2", -1.9)), c.Call());
        var second = await c.Stability.GetEntryStabilityAsync(query, c.Call());
        Assert.Equal(2, second.Used.Version);
        Assert.Equal(0.1, second.Results[0].EnergyAboveHullEvPerAtom, 9);
        Assert.NotEqual(first.Used.ContentSha256, second.Used.ContentSha256);

        var stats = await c.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), c.Call());
        Assert.Equal(2, stats.HullBuilds);

        // A dataset deleted and recreated under the same name with other content gets its own hull too.
        await c.Datasets.DeleteDatasetAsync(new DeleteDatasetRequest { Name = "d" }, c.Call());
        Entry[] changed = Data.LiCoO().Select(e => e.Id == "LiCoO2" ? Data.Formation("LiCoO2", "LiCoO2", -1.70) : e).ToArray();
        await Data.CreateWithAsync(c, "d", changed);
        var third = await c.Stability.GetEntryStabilityAsync(query, c.Call());
        Assert.Equal(1, third.Used.Version);
        Assert.Equal(0.05, third.Results[0].EnergyAboveHullEvPerAtom, 9);
    }
    [Fact]
    public async Task Eviction_while_other_queries_add_hulls_never_fails_a_query()
    {
        // Eviction ranked a snapshot of the slots that other threads were adding to; a slot added between the
        // snapshot's count and its copy failed a query with an ArgumentException (INTERNAL). Many distinct systems
        // through a cache of two hulls make every call evict while the other threads add.
        using var folder = new TempFolder();
        using var store = Hull.Store.DatasetStore.Open(folder.Path);
        store.CreateDataset("d");
        store.ImportBatch("d", [new Hull.Store.EntryRow("H", "H", 0, "formation_per_atom")], Hull.Store.DuplicatePolicy.Reject, Hull.Store.BatchProvenance.None);
        var cache = new HullCache(store, ServiceLimits.Default, new CacheSettings(MaxCachedHulls: 2));
        VersionSnapshot snapshot = await cache.GetSnapshotAsync(new VersionRef("d", 1, "content"), CancellationToken.None);
        string[] symbols = ElementTable.All.Take(48).Select(e => e.Symbol).ToArray();
        string[][] systems = symbols.SelectMany((a, i) => symbols.Skip(i + 1).Select(b => new[] { a, b }.Order(StringComparer.Ordinal).ToArray())).ToArray();

        using var start = new ManualResetEventSlim(false);
        Task[] workers = Enumerable.Range(0, 8).Select(w => Task.Run(async () =>
        {
            start.Wait();
            var order = new Random(w);
            for (int round = 0; round < 5; round++)
            {
                foreach (string[] system in systems.OrderBy(_ => order.Next()))
                {
                    CachedHull hull = await cache.GetHullAsync(snapshot, system, CancellationToken.None);
                    Assert.Equal(string.Join('-', system), hull.Hull.SystemName);
                }
            }
        })).ToArray();
        start.Set();
        await Task.WhenAll(workers);

        Assert.InRange(cache.CachedHullCount, 1, 2 + 8);
    }
}
