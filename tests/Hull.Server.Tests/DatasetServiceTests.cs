using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>The dataset service over real gRPC: lifecycle, imports as versions, duplicates, export, version deletion.</summary>
public sealed class DatasetServiceTests
{
    [Fact]
    public async Task Create_list_describe_delete()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        DatasetSummary created = await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "oxides", Description = "test set" }, c.Call());
        Assert.Equal(0, created.LatestVersion);

        var listed = await c.Datasets.ListDatasetsAsync(new ListDatasetsRequest(), c.Call());
        Assert.Equal(["oxides"], listed.Datasets.Select(d => d.Name));

        await c.Datasets.ImportEntriesAsync(Data.Batch("oxides", DuplicatePolicy.Reject, Data.LiCoO()), c.Call());
        var described = await c.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "oxides" }, c.Call());
        Assert.Equal(1, described.Dataset.LatestVersion);
        Assert.Equal(Data.LiCoO().Length, described.Dataset.EntryCount);
        Assert.Equal("test", Assert.Single(described.Versions).SourceLabel);

        var again = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "oxides" }, c.Call()));
        Assert.Equal(StatusCode.AlreadyExists, again.StatusCode);

        await c.Datasets.DeleteDatasetAsync(new DeleteDatasetRequest { Name = "oxides" }, c.Call());
        var gone = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "oxides" }, c.Call()));
        Assert.Equal(StatusCode.NotFound, gone.StatusCode);
    }

    [Fact]
    public async Task Each_import_is_a_version_and_export_returns_exactly_what_was_stored()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        Entry[] all = Data.LiCoO();
        await Data.CreateWithAsync(c, "d", all[..4]);
        var second = await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, all[4..]), c.Call());
        Assert.Equal(2, second.DatasetVersion);
        Assert.Equal(all.Length - 4, second.InsertedCount);

        List<Entry> v1 = await ExportAsync(c, "d", 1, pageSize: 3);
        List<Entry> v2 = await ExportAsync(c, "d", 0, pageSize: 2);
        Assert.Equal(all[..4].OrderBy(e => e.Id, StringComparer.Ordinal), v1);
        Assert.Equal(all.OrderBy(e => e.Id, StringComparer.Ordinal), v2);
    }

    [Fact]
    public async Task Duplicates_are_rejected_or_replaced_as_the_caller_chooses()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        await Data.CreateWithAsync(c, "d", Data.LiCoO());

        var clash = Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("new-1", "Li2O2", -1.6), Data.Formation("LiCoO2", "LiCoO2", -1.9));
        var refused = await Assert.ThrowsAsync<RpcException>(async () => await c.Datasets.ImportEntriesAsync(clash, c.Call()));
        Assert.Equal(StatusCode.AlreadyExists, refused.StatusCode);
        Assert.Equal("entries[1].id", Assert.Single(Data.Violations(refused)).Field);
        Assert.Single((await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "d" }, c.Call())).Versions);

        clash.DuplicatePolicy = DuplicatePolicy.Replace;
        var replaced = await c.Datasets.ImportEntriesAsync(clash, c.Call());
        Assert.Equal((2L, 1, 1), (replaced.DatasetVersion, replaced.InsertedCount, replaced.ReplacedCount));
        Entry now = (await ExportAsync(c, "d", 2)).Single(e => e.Id == "LiCoO2");
        Entry before = (await ExportAsync(c, "d", 1)).Single(e => e.Id == "LiCoO2");
        Assert.Equal(-1.9, now.EnergyEv);
        Assert.Equal(-1.8, before.EnergyEv);
    }

    [Fact]
    public async Task A_deleted_version_is_gone_and_the_others_read_as_before()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        Entry[] all = Data.LiCoO();
        await Data.CreateWithAsync(c, "d", all[..5]);
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, all[5..]), c.Call());
        var v1Before = await ExportAsync(c, "d", 1);

        await c.Datasets.DeleteVersionAsync(new DeleteVersionRequest { Dataset = "d", Version = 2 }, c.Call());
        var missing = await Assert.ThrowsAsync<RpcException>(async () => await ExportAsync(c, "d", 2));
        Assert.Equal(StatusCode.NotFound, missing.StatusCode);
        Assert.Equal(v1Before, await ExportAsync(c, "d", 1));
        var stability = await c.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "CoO" } }, c.Call());
        Assert.Equal(1, stability.Used.Version);
    }

    internal static async Task<List<Entry>> ExportAsync(Clients c, string dataset, long version, int pageSize = 0)
    {
        var entries = new List<Entry>();
        using var call = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = dataset, Version = version, PageSize = pageSize }, c.Call());
        await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync())
        {
            entries.AddRange(page.Entries);
        }

        return entries;
    }
}
