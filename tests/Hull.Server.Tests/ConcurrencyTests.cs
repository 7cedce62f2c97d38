using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>Many clients importing into different datasets and querying at once get the single-threaded answers.</summary>
public sealed class ConcurrencyTests
{
    private const int Clients = 8;
    private const int Batches = 4;

    [Fact]
    public async Task Concurrent_imports_and_queries_equal_the_single_threaded_results()
    {
        await using var sequential = await RunningServer.StartAsync();
        await using var concurrent = await RunningServer.StartAsync();

        var expected = new List<string>();
        for (int k = 0; k < Clients; k++) expected.Add(await WorkloadAsync(sequential.Clients, k));

        // Each client has its own channel (its own HTTP/2 connection), as separate programs would.
        var channels = Enumerable.Range(0, Clients).Select(_ => new Support.Clients(concurrent.Server.Address)).ToArray();
        try
        {
            string[] actual = await Task.WhenAll(Enumerable.Range(0, Clients).Select(k => Task.Run(() => WorkloadAsync(channels[k], k))));
            Assert.Equal(expected, actual);
        }
        finally
        {
            foreach (var channel in channels) channel.Dispose();
        }
    }

    /// <summary>Client k's work: create a dataset, import batches, query between them; a transcript of every answer.</summary>
    private static async Task<string> WorkloadAsync(Support.Clients c, int k)
    {
        var random = new Random(1000 + k);
        string name = $"client-{k}";
        var transcript = new List<string>();
        await Data.CreateWithAsync(c, name, Data.LiCoO());
        for (int b = 0; b < Batches; b++)
        {
            var batch = Data.Batch(name, DuplicatePolicy.Reject, Enumerable.Range(0, 25).Select(i =>
                Data.Formation($"b{b}-{i}", $"Li{random.Next(1, 6)}Co{random.Next(1, 6)}O{random.Next(1, 11)}", -1.9 + 1.5 * random.NextDouble())).ToArray());
            var imported = await c.Datasets.ImportEntriesAsync(batch, c.Call());
            transcript.Add($"v{imported.DatasetVersion}");

            var stability = await c.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = name, EntryIds = { "LiCoO2", $"b{b}-3" } }, c.Call());
            transcript.Add(stability.ToString());
            var energies = await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = name, Formulas = { "Li3Co2O5" } }, c.Call());
            transcript.Add(energies.ToString());
        }

        using var call = c.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = name, Version = 2 }, c.Call());
        await foreach (var page in call.ResponseStream.ReadAllAsync()) transcript.Add(page.ToString());
        var facets = await c.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = name, ChemicalSystem = "Co-Li-O" }, c.Call());
        transcript.Add(facets.ToString());
        return string.Join("\n", transcript);
    }
}
