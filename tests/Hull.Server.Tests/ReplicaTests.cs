using System.Globalization;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using Hull.Store.Tests.Backends;
using Xunit.Abstractions;

namespace Hull.Server.Tests;

/// <summary>
/// Several server processes on one PostgreSQL store: any of them answers any query exactly as one server on SQLite
/// does after the same imports; imports through two replicas at once number versions without gaps or repeats; and a
/// replica SIGKILLed in the middle of imports leaves no half version, while an import session it held can be
/// finished through another replica.
/// </summary>
public sealed class ReplicaTests(ITestOutputHelper output)
{
    private static readonly string[] Elements = ["Li", "Co", "Ni", "Mn", "O"];

    [Fact]
    public async Task Any_replica_answers_any_query_as_one_server_on_sqlite_does()
    {
        string store = PostgresTestCluster.NewSchema("replicas");
        ChildServer[] replicas = await Task.WhenAll(Enumerable.Range(0, 3).Select(_ => ChildServer.StartOnPostgresAsync(store)));
        try
        {
            await using RunningServer single = await RunningServer.StartAsync();
            Clients[] clients = [.. replicas.Select(r => new Clients(r.Address))];

            // The same imports, the replicated ones spread over the replicas.
            await clients[0].Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "oxides" }, clients[0].Call());
            await single.Clients.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "oxides" }, single.Clients.Call());
            for (int b = 0; b < 3; b++)
            {
                ImportEntriesRequest batch = Batch(b);
                await clients[b % 3].Datasets.ImportEntriesAsync(batch, clients[b % 3].Call());
                await single.Clients.Datasets.ImportEntriesAsync(batch, single.Clients.Call());
            }

            foreach (string system in new[] { "Li-Co-O", "Li-Ni-Mn-O", "Co-O", "" })
            {
                var request = new GetStablePhasesRequest { Dataset = "oxides", ChemicalSystem = system };
                GetStablePhasesResponse expected = await single.Clients.Stability.GetStablePhasesAsync(request, single.Clients.Call());
                foreach (Clients c in clients) Assert.Equal(expected, await c.Stability.GetStablePhasesAsync(request, c.Call()));
            }

            var assess = new AssessCandidatesRequest { Dataset = "oxides" };
            for (int i = 0; i < 20; i++)
            {
                assess.Candidates.Add(new Candidate { Label = $"c{i}", Formula = $"Li{1 + i % 3}Ni{1 + i % 2}Mn{1 + i % 4}O{3 + i % 5}", EnergyEv = -1.1 - i * 0.03, Basis = EnergyBasis.FormationPerAtom });
            }
            AssessCandidatesResponse assessed = await single.Clients.Stability.AssessCandidatesAsync(assess, single.Clients.Call());
            foreach (Clients c in clients) Assert.Equal(assessed, await c.Stability.AssessCandidatesAsync(assess, c.Call()));

            var entries = new GetEntryStabilityRequest { Dataset = "oxides", Version = 2 };
            entries.EntryIds.AddRange(["b0-e005", "b1-e017", "LiCoO2"]);
            GetEntryStabilityResponse stability = await single.Clients.Stability.GetEntryStabilityAsync(entries, single.Clients.Call());
            foreach (Clients c in clients) Assert.Equal(stability, await c.Stability.GetEntryStabilityAsync(entries, c.Call()));

            ListVersionsResponse versions = await single.Clients.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "oxides" }, single.Clients.Call());
            foreach (Clients c in clients)
            {
                ListVersionsResponse replicated = await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "oxides" }, c.Call());
                Assert.Equal(versions.Versions.Select(v => (v.Version, v.EntryCount, v.SourceLabel)), replicated.Versions.Select(v => (v.Version, v.EntryCount, v.SourceLabel)));
            }

            // A dataset deleted and made again through one replica is the new one on every replica, whatever they remembered
            // of its version 1 (asked here first, so that each replica remembers it).
            var again = new GetStablePhasesRequest { Dataset = "oxides", ChemicalSystem = "Li-Co-O", Version = 1 };
            GetStablePhasesResponse old = await single.Clients.Stability.GetStablePhasesAsync(again, single.Clients.Call());
            foreach (Clients c in clients) Assert.Equal(old, await c.Stability.GetStablePhasesAsync(again, c.Call()));
            await clients[1].Datasets.DeleteDatasetAsync(new DeleteDatasetRequest { Name = "oxides" }, clients[1].Call());
            await clients[1].Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "oxides" }, clients[1].Call());
            await clients[1].Datasets.ImportEntriesAsync(Batch(7), clients[1].Call());
            GetStablePhasesResponse fresh = await clients[1].Stability.GetStablePhasesAsync(again, clients[1].Call());
            foreach (Clients c in clients) Assert.Equal(fresh, await c.Stability.GetStablePhasesAsync(again, c.Call()));
            Assert.NotEqual(old.Used.ContentSha256, fresh.Used.ContentSha256);
            foreach (Clients c in clients) c.Dispose();
        }
        finally
        {
            foreach (ChildServer r in replicas) r.Dispose();
        }
    }

    [Fact]
    public async Task Imports_through_two_replicas_at_once_number_whole_versions_without_gaps_or_repeats()
    {
        const int BatchesPerReplica = 15;
        string store = PostgresTestCluster.NewSchema("replicas");
        ChildServer[] replicas = await Task.WhenAll(Enumerable.Range(0, 2).Select(_ => ChildServer.StartOnPostgresAsync(store)));
        try
        {
            Clients[] clients = [.. replicas.Select(r => new Clients(r.Address))];
            await clients[0].Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "shared" }, clients[0].Call());
            // Pure-element total energies first: every later batch takes its references from them, on whatever base.
            await clients[0].Datasets.ImportEntriesAsync(References("shared"), clients[0].Call());

            var given = new List<(long Version, string Label)>[2];
            await Task.WhenAll(Enumerable.Range(0, 2).Select(async r =>
            {
                given[r] = [];
                for (int b = 0; b < BatchesPerReplica; b++)
                {
                    ImportEntriesRequest batch = TotalBatch("shared", $"r{r}-b{b:D2}", 40);
                    ImportEntriesResponse response = await clients[r].Datasets.ImportEntriesAsync(batch, clients[r].Call());
                    given[r].Add((response.DatasetVersion, batch.SourceLabel));
                }
            }));

            ListVersionsResponse versions = await clients[1].Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "shared", PageSize = 1000 }, clients[1].Call());
            int total = 1 + 2 * BatchesPerReplica;
            Assert.Equal(Enumerable.Range(1, total).Select(v => (long)v), versions.Versions.Select(v => v.Version));
            var byVersion = given.SelectMany(g => g).ToDictionary(g => g.Version, g => g.Label);
            Assert.Equal(2 * BatchesPerReplica, byVersion.Count);
            long expectedEntries = Elements.Length;
            foreach (DatasetVersion v in versions.Versions.Skip(1))
            {
                expectedEntries += 40;
                Assert.Equal((byVersion[v.Version], 40, expectedEntries), (v.SourceLabel, v.BatchEntryCount, v.EntryCount));
            }

            // Both replicas analyse the latest version alike.
            var request = new GetStablePhasesRequest { Dataset = "shared" };
            Assert.Equal(await clients[0].Stability.GetStablePhasesAsync(request, clients[0].Call()), await clients[1].Stability.GetStablePhasesAsync(request, clients[1].Call()));
            foreach (Clients c in clients) c.Dispose();
        }
        finally
        {
            foreach (ChildServer r in replicas) r.Dispose();
        }
    }

    [Fact]
    public async Task A_replica_killed_mid_import_leaves_no_half_version_and_its_session_can_be_finished_elsewhere()
    {
        const int Entries = 4000;
        string store = PostgresTestCluster.NewSchema("replicas");
        using ChildServer survivor = await ChildServer.StartOnPostgresAsync(store);
        using var s = new Clients(survivor.Address);
        await s.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "big" }, s.Call());
        var random = new Random(2026);
        int kills = 0;
        long acknowledged = 0;
        for (int round = 0; round < 4; round++)
        {
            using ChildServer victim = await ChildServer.StartOnPostgresAsync(store);
            using var v = new Clients(victim.Address);

            // A session begun and partly staged on the victim, finished on the survivor after the kill.
            ImportSession session = await v.Datasets.BeginImportAsync(new BeginImportRequest { Dataset = "big", DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = $"session-{round}" }, v.Call());
            await v.Datasets.StageEntriesAsync(Stage(session.SessionId, $"s{round}-a", 300), v.Call());

            int delay = random.Next(20, 400);
            Task killer = Task.Run(async () =>
            {
                await Task.Delay(delay);
                victim.Kill();
            });
            for (int b = 0; ; b++)
            {
                try
                {
                    ImportEntriesResponse response = await v.Datasets.ImportEntriesAsync(FormationBatch("big", $"k{round}-b{b:D3}", Entries), v.Call());
                    acknowledged = Math.Max(acknowledged, response.DatasetVersion);
                }
                catch (RpcException)
                {
                    break;
                }
            }
            await killer;
            Assert.True(victim.HasExited);
            kills++;

            // Every version the survivor lists is whole: a batch of the victim's, or a session's.
            await CheckWholeAsync(s, Entries, atLeast: acknowledged);

            await s.Datasets.StageEntriesAsync(Stage(session.SessionId, $"s{round}-b", 200), s.Call());
            ImportEntriesResponse committed = await s.Datasets.CommitImportAsync(new CommitImportRequest { SessionId = session.SessionId }, s.Call());
            acknowledged = committed.DatasetVersion;
            await CheckWholeAsync(s, Entries, atLeast: acknowledged);
        }
        output.WriteLine($"{kills} replicas killed mid-import; {acknowledged} versions");
    }

    /// <summary>Each version is the one before plus one whole batch (its label says how big); returns the count.</summary>
    private static async Task CheckWholeAsync(Clients c, int batchEntries, long atLeast)
    {
        ListVersionsResponse versions = await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "big", PageSize = 1000 }, c.Call());
        Assert.True(versions.Versions.Count >= atLeast, $"{versions.Versions.Count} versions, but version {atLeast} was acknowledged");
        long entries = 0;
        for (int i = 0; i < versions.Versions.Count; i++)
        {
            DatasetVersion v = versions.Versions[i];
            Assert.Equal(i + 1, v.Version);
            int size = v.SourceLabel.StartsWith("session-", StringComparison.Ordinal) ? 500 : batchEntries;
            Assert.Equal(size, v.BatchEntryCount);
            entries += size;
            Assert.Equal(entries, v.EntryCount);
        }

        if (versions.Versions.Count == 0) return;
        long exported = 0;
        using var call = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = "big", PageSize = 10_000 }, c.Call(TimeSpan.FromMinutes(2)));
        await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync()) exported += page.Entries.Count;
        Assert.Equal(entries, exported);
    }

    private static ImportEntriesRequest Batch(int b)
    {
        var request = new ImportEntriesRequest { Dataset = "oxides", DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = $"batch {b}" };
        if (b == 0) request.Entries.AddRange(Data.LiCoO());
        if (b == 0) request.Entries.AddRange(new[] { Data.Formation("Ni", "Ni", 0), Data.Formation("Mn", "Mn", 0) });
        var random = new Random(b);
        for (int i = 0; i < 30; i++)
        {
            string formula = $"Li{random.Next(0, 3)}Co{random.Next(0, 2)}Ni{random.Next(0, 3)}Mn{random.Next(0, 2)}O{random.Next(1, 5)}";
            request.Entries.Add(Data.Formation($"b{b}-e{i:D3}", formula.Replace("Li0", "").Replace("Co0", "").Replace("Ni0", "").Replace("Mn0", ""),
                -0.4 - random.NextDouble() * 1.6));
        }
        return request;
    }

    private static ImportEntriesRequest References(string dataset)
    {
        var request = new ImportEntriesRequest { Dataset = dataset, DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = "references" };
        for (int i = 0; i < Elements.Length; i++) request.Entries.Add(Data.Total($"ref-{Elements[i]}", Elements[i], -2.0 - i));
        return request;
    }

    private static ImportEntriesRequest TotalBatch(string dataset, string label, int count)
    {
        var request = new ImportEntriesRequest { Dataset = dataset, DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = label };
        for (int i = 0; i < count; i++)
        {
            request.Entries.Add(Data.Total($"{label}-e{i:D3}", $"Li{1 + i % 3}Ni{1 + i % 2}O{2 + i % 4}", -20.0 - i * 0.01));
        }
        return request;
    }

    private static ImportEntriesRequest FormationBatch(string dataset, string label, int count)
    {
        var request = new ImportEntriesRequest { Dataset = dataset, DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = label };
        for (int i = 0; i < count; i++)
        {
            request.Entries.Add(Data.Formation($"{label}-e{i.ToString("D5", CultureInfo.InvariantCulture)}", $"Li{1 + i % 7}Co{1 + i % 5}O{2 + i % 11}", -1.0 - 0.0001 * i));
        }
        return request;
    }

    private static StageEntriesRequest Stage(string sessionId, string prefix, int count)
    {
        var request = new StageEntriesRequest { SessionId = sessionId };
        for (int i = 0; i < count; i++) request.Entries.Add(Data.Formation($"{prefix}-e{i:D4}", $"Co{1 + i % 3}O{1 + i % 4}", -1.1 - 0.001 * i));
        return request;
    }
}
