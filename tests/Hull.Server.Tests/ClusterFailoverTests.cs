using System.Diagnostics;
using System.Globalization;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using Hull.Store.Tests.Backends;
using Xunit.Abstractions;

namespace Hull.Server.Tests;

/// <summary>
/// Three member processes of one cluster; one is SIGKILLed while clients stream hull-energy queries at all three.
/// With the client retry policy the README states (UNAVAILABLE: retry on another member, up to three times, half a
/// second apart), no query fails, and every answer is the one a lone server on SQLite gives after the same import
/// (that server's hull energies are checked against SciPy's linear program in <see cref="LinearProgramReferenceTests"/>).
/// </summary>
public sealed class ClusterFailoverTests(ITestOutputHelper output)
{
    private const int Retries = 3;
    private static readonly TimeSpan RetryPause = TimeSpan.FromSeconds(0.5);
    private static readonly string[] Elements = ["Li", "Co", "Ni", "Mn", "O"];

    [Fact]
    public async Task A_member_killed_during_a_stream_of_queries_costs_no_answer_and_changes_none()
    {
        var clock = Stopwatch.StartNew();
        string store = PostgresTestCluster.NewSchema("failover");
        ChildServer[] members = await Task.WhenAll(Enumerable.Range(0, 3).Select(_ =>
            ChildServer.StartOnPostgresAsync(store, "--cluster", "failover", "--peer-port", Free(), "--gateway-port", Free())));
        try
        {
            await using RunningServer lone = await RunningServer.StartAsync();
            Clients[] clients = [.. members.Select(m => new Clients(m.Address))];
            foreach (Clients c in new[] { clients[0], lone.Clients })
            {
                await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "oxides" }, c.Call());
                await c.Datasets.ImportEntriesAsync(Entries(), c.Call());
            }

            GetHullEnergiesRequest[] queries = [.. Enumerable.Range(0, 60).Select(Query)];
            GetHullEnergiesResponse[] expected = await Task.WhenAll(queries.Select(q => lone.Clients.Stability.GetHullEnergiesAsync(q, lone.Clients.Call()).ResponseAsync));
            output.WriteLine($"started and filled in {clock.Elapsed.TotalSeconds:F1} s");

            const int Victim = 1;
            int answered = 0, retried = 0;
            var killed = new TaskCompletionSource();
            var answers = new GetHullEnergiesResponse[queries.Length];
            async Task StreamAsync(int worker)
            {
                for (int q = worker; q < queries.Length; q += 3)
                {
                    (answers[q], int retries) = await WithRetryAsync(clients, (q + worker) % 3, queries[q]);
                    Interlocked.Add(ref retried, retries);
                    if (Interlocked.Increment(ref answered) == 15)
                    {
                        members[Victim].Kill();
                        output.WriteLine($"member {Victim} killed at {clock.Elapsed.TotalSeconds:F1} s");
                        killed.SetResult();
                    }
                }
            }

            await Task.WhenAll(Enumerable.Range(0, 3).Select(StreamAsync));
            output.WriteLine($"{queries.Length} queries answered, {retried} retries, done at {clock.Elapsed.TotalSeconds:F1} s");
            foreach (int live in new[] { 0, 2 })
            {
                output.WriteLine($"member {live} answered {members[live].ErrorLines.Count(l => l.Contains("Answering system", StringComparison.Ordinal))} parts itself");
            }

            Assert.True(killed.Task.IsCompleted);
            Assert.True(members[Victim].HasExited);
            for (int q = 0; q < queries.Length; q++) Assert.Equal(expected[q], answers[q]);
            // After the loss, the live members still answer every system.
            foreach (int live in new[] { 0, 2 })
            {
                Assert.Equal(expected[0], await clients[live].Stability.GetHullEnergiesAsync(queries[0], clients[live].Call()));
            }

            // The membership sees the loss: the survivors count two active members (once they have declared it dead).
            ServerHealth health = new();
            for (int attempt = 0; attempt < 60 && health.ActiveMembers != 2; attempt++)
            {
                if (attempt > 0) await Task.Delay(500);
                health = await clients[0].Diagnostics.GetServerHealthAsync(new GetServerHealthRequest(), clients[0].Call());
            }

            Assert.Equal((2, "ACTIVE", "failover"), (health.ActiveMembers, health.MemberStatus, health.ClusterName));
            foreach (Clients c in clients) c.Dispose();
        }
        finally
        {
            foreach (ChildServer m in members) m.Dispose();
        }
    }

    /// <summary>The README's client retry policy: on UNAVAILABLE, the next member, up to <see cref="Retries"/> times.</summary>
    private static async Task<(GetHullEnergiesResponse Answer, int Retries)> WithRetryAsync(Clients[] members, int start, GetHullEnergiesRequest query)
    {
        for (int attempt = 0; ; attempt++)
        {
            Clients member = members[(start + attempt) % members.Length];
            try
            {
                return (await member.Stability.GetHullEnergiesAsync(query, member.Call(TimeSpan.FromSeconds(90))), attempt);
            }
            catch (RpcException e) when (e.StatusCode == StatusCode.Unavailable && attempt < Retries)
            {
                await Task.Delay(RetryPause);
            }
        }
    }

    // Up to 12 formulas over the 31 chemical systems of five elements, so that grains sit on every member.
    private static GetHullEnergiesRequest Query(int seed)
    {
        var random = new Random(seed);
        var query = new GetHullEnergiesRequest { Dataset = "oxides" };
        for (int i = 0; i < 12; i++)
        {
            string formula = string.Concat(Elements.Select(e => random.Next(3) == 0 ? string.Empty : e + random.Next(1, 4).ToString(CultureInfo.InvariantCulture)));
            query.Formulas.Add(formula.Length == 0 ? "O" : formula);
        }
        return query;
    }

    private static ImportEntriesRequest Entries()
    {
        var request = new ImportEntriesRequest { Dataset = "oxides", DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = "failover" };
        foreach (string e in Elements) request.Entries.Add(Data.Formation(e.ToLowerInvariant(), e, 0));
        var random = new Random(20);
        for (int i = 0; i < 120; i++)
        {
            string formula = string.Concat(Elements.Select(e => random.Next(2) == 0 ? string.Empty : e + random.Next(1, 4).ToString(CultureInfo.InvariantCulture)));
            if (formula.Length == 0 || !formula.Contains('O', StringComparison.Ordinal)) formula += "O2";
            request.Entries.Add(Data.Formation($"e{i:D3}", formula, -0.3 - random.NextDouble() * 1.7));
        }
        return request;
    }

    private static string Free() => ClusterTests.FreePort().ToString(CultureInfo.InvariantCulture);
}
