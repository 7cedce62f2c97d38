using Grpc.Core;
using Google.Protobuf;
using Hull.Protos.V1;
using Hull.Server.Hosting;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>Each documented limit, at the limit (accepted) and one past it (RESOURCE_EXHAUSTED naming the limit).</summary>
public sealed class LimitTests
{
    [Fact]
    public async Task The_limits_are_reported_with_their_documented_defaults()
    {
        await using var s = await RunningServer.StartAsync();
        ServerLimits limits = await s.Clients.Diagnostics.GetServerLimitsAsync(new GetServerLimitsRequest(), s.Clients.Call());
        Assert.Equal(ServiceLimits.DefaultMaxComponentsPerSystem, limits.MaxComponentsPerSystem);
        Assert.Equal(8, limits.MaxComponentsPerSystem);
        Assert.Equal(50_000, limits.MaxEntriesPerSystem);
        Assert.Equal(1_000, limits.MaxCompositionsPerRequest);
        Assert.Equal(16 * 1024 * 1024, limits.MaxReceiveMessageBytes);
    }

    [Fact]
    public async Task Components_per_system_at_and_past_the_default_limit()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        string[] elements = ["Li", "Co", "Ni", "Mn", "Al", "Mg", "Ti", "O", "F"];
        var entries = elements.Select(e => Data.Formation(e, e, 0)).ToList();
        entries.Add(Data.Formation("eight", "LiCoNiMnAlMgTiO8", -1.0));
        await Data.CreateWithAsync(c, "d", [.. entries]);

        // Eight components: the limit itself is served.
        var atLimit = await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Formulas = { "LiCoNiMnAlMgTiO8" } }, c.Call());
        Assert.Equal(-1.0, atLimit.Results[0].HullEnergyEvPerAtom, 9);

        var past = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Formulas = { "LiCoNiMnAlMgTiO8F" } }, c.Call()));
        Assert.Equal(StatusCode.ResourceExhausted, past.StatusCode);
        Assert.Contains("9 elements; the limit is 8 components per chemical system", past.Status.Detail);

        var import = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("nine", "LiCoNiMnAlMgTiOF", -1)), c.Call()));
        Assert.Equal(StatusCode.ResourceExhausted, import.StatusCode);
        Assert.Equal("entries[0].formula", Assert.Single(Data.Violations(import)).Field);
    }

    [Fact]
    public async Task Entries_per_system_at_and_past_the_limit()
    {
        await using var s = await RunningServer.StartAsync(o => o with { Limits = o.Limits with { MaxEntriesPerSystem = 10 } });
        var c = s.Clients;
        // Li-O holds 10 entries (the limit); Li-Co-O holds 11.
        var entries = new List<Entry> { Data.Formation("Li", "Li", 0), Data.Formation("O", "O", 0), Data.Formation("Co", "Co", 0) };
        for (int i = 0; i < 8; i++) entries.Add(Data.Formation($"Li2O-{i}", "Li2O", -2.0 + 0.01 * i));
        await Data.CreateWithAsync(c, "d", [.. entries]);

        var atLimit = await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Formulas = { "Li2O" } }, c.Call());
        Assert.Equal(-2.0, atLimit.Results[0].HullEnergyEvPerAtom, 9);

        var past = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Stability.GetHullEnergiesAsync(new GetHullEnergiesRequest { Dataset = "d", Formulas = { "LiCoO2" } }, c.Call()));
        Assert.Equal(StatusCode.ResourceExhausted, past.StatusCode);
        Assert.Contains("has 11 entries; the limit is 10 entries per chemical system", past.Status.Detail);

        // The whole-dataset analysis builds the hulls of Li-O (10 entries, at the limit) and Co: served.
        Assert.Equal(11, await AnalysedCount(c));

        // One more Li-O entry puts Li-O past the limit.
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("Li2O2", "Li2O2", -1.6)), c.Call());
        var analysis = await Assert.ThrowsAsync<RpcException>(async () => await AnalysedCount(c));
        Assert.Equal(StatusCode.ResourceExhausted, analysis.StatusCode);
        Assert.Contains("Li-O", analysis.Status.Detail);
    }

    private static async Task<int> AnalysedCount(Clients c)
    {
        int count = 0;
        using var call = c.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = "d" }, c.Call());
        await foreach (var page in call.ResponseStream.ReadAllAsync()) count += page.Results.Count;
        return count;
    }

    [Fact]
    public async Task Compositions_per_request_at_and_past_the_limit()
    {
        await using var s = await RunningServer.StartAsync(o => o with { Limits = o.Limits with { MaxCompositionsPerRequest = 5 } });
        var c = s.Clients;
        await Data.CreateWithAsync(c, "d", Data.LiCoO());
        var five = new GetHullEnergiesRequest { Dataset = "d", Formulas = { "Li2O", "CoO", "LiCoO2", "Li2CoO3", "Co3O4" } };
        Assert.Equal(5, (await c.Stability.GetHullEnergiesAsync(five, c.Call())).Results.Count);

        five.Formulas.Add("LiO");
        var past = await Assert.ThrowsAsync<RpcException>(async () => await c.Stability.GetHullEnergiesAsync(five, c.Call()));
        Assert.Equal(StatusCode.ResourceExhausted, past.StatusCode);
        Assert.Contains("the limit is 5 compositions per request", past.Status.Detail);

        var ids = new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "Li", "Co", "O", "Li2O", "CoO", "Co3O4" } };
        Assert.Equal(StatusCode.ResourceExhausted, (await Assert.ThrowsAsync<RpcException>(async () => await c.Stability.GetEntryStabilityAsync(ids, c.Call()))).StatusCode);
    }

    [Fact]
    public async Task Message_bytes_at_and_past_the_limit()
    {
        const int Limit = 64 * 1024;
        await using var s = await RunningServer.StartAsync(o => o with { Limits = o.Limits with { MaxReceiveMessageBytes = Limit } });
        var c = s.Clients;
        await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, c.Call());

        ImportEntriesRequest exact = PaddedTo(Limit);
        Assert.Equal(Limit, exact.CalculateSize());
        var accepted = await c.Datasets.ImportEntriesAsync(exact, c.Call());
        Assert.Equal(1, accepted.DatasetVersion);

        ImportEntriesRequest over = PaddedTo(Limit + 1);
        Assert.Equal(Limit + 1, over.CalculateSize());
        var e = await Assert.ThrowsAsync<RpcException>(async () => await c.Datasets.ImportEntriesAsync(over, c.Call()));
        Assert.Equal(StatusCode.ResourceExhausted, e.StatusCode);
        Assert.Contains("exceeds the maximum", e.Status.Detail);

        // The server is still there and nothing of the refused message was written.
        var described = await c.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "d" }, c.Call());
        Assert.Equal(1, described.Dataset.LatestVersion);
    }

    /// <summary>An import of one entry whose note pads the serialized request to exactly <paramref name="size"/> bytes.</summary>
    private static ImportEntriesRequest PaddedTo(int size)
    {
        var request = Data.Batch("d", DuplicatePolicy.Replace, Data.Formation("padded", "Li2O", -2.0));
        request.Entries[0].Note = string.Empty;
        int baseSize = request.CalculateSize();
        // Length prefixes grow with the note: adjust until the size is exact.
        int noteLength = size - baseSize;
        while (true)
        {
            request.Entries[0].Note = new string('n', noteLength);
            int now = request.CalculateSize();
            if (now == size) return request;
            noteLength -= now - size;
        }
    }
}
