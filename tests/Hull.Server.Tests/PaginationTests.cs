using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Errors;
using Hull.Server.Services;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// ListDatasets and ListVersions page over real gRPC: every item once, in order, whatever the page size and
/// whatever is created or deleted between pages; a foreign or broken token is INVALID_ARGUMENT.
/// </summary>
public sealed class PaginationTests
{
    private static async Task<List<string>> AllDatasetNames(Clients c, int pageSize, Func<int, Task>? betweenPages = null)
    {
        var names = new List<string>();
        var request = new ListDatasetsRequest { PageSize = pageSize };
        int page = 0;
        do
        {
            ListDatasetsResponse response = await c.Datasets.ListDatasetsAsync(request, c.Call());
            int served = pageSize == 0 ? PageToken.DefaultPageSize : Math.Min(pageSize, PageToken.MaxPageSize);
            Assert.True(response.Datasets.Count <= served, $"page of {response.Datasets.Count} for page size {pageSize}");
            names.AddRange(response.Datasets.Select(d => d.Name));
            request.PageToken = response.NextPageToken;
            if (betweenPages is not null) await betweenPages(page++);
        }
        while (request.PageToken.Length > 0);
        return names;
    }

    [Fact]
    public async Task Datasets_come_once_each_in_name_order_at_every_page_size()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        string[] names = Enumerable.Range(0, 7).Select(i => $"set-{(char)('g' - i)}").ToArray();
        foreach (string name in names) await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = name }, c.Call());
        string[] expected = names.Order(StringComparer.Ordinal).ToArray();

        foreach (int pageSize in new[] { 1, 2, 3, 7, 8, 0, 5000 })
        {
            Assert.Equal(expected, await AllDatasetNames(c, pageSize));
        }

        // Exactly one full page: no token, so no empty extra page.
        Assert.Empty((await c.Datasets.ListDatasetsAsync(new ListDatasetsRequest { PageSize = 7 }, c.Call())).NextPageToken);
    }

    [Fact]
    public async Task Changes_between_pages_neither_repeat_nor_drop_an_item_that_stayed()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        foreach (string name in new[] { "b", "d", "f", "h" }) await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = name }, c.Call());

        // After the first page ("b", "d"): one dataset before the cursor appears, one after it is deleted.
        var seen = await AllDatasetNames(c, 2, async page =>
        {
            if (page != 0) return;
            await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "a" }, c.Call());
            await c.Datasets.DeleteDatasetAsync(new DeleteDatasetRequest { Name = "f" }, c.Call());
        });
        Assert.Equal(["b", "d", "h"], seen);
    }

    [Fact]
    public async Task Versions_page_oldest_first_and_tokens_stay_with_their_dataset()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        await Data.CreateWithAsync(c, "one", Data.Formation("Li", "Li", 0));
        await Data.CreateWithAsync(c, "two", Data.Formation("Li", "Li", 0));
        for (int i = 0; i < 4; i++)
        {
            await c.Datasets.ImportEntriesAsync(Data.Batch("one", DuplicatePolicy.Replace, Data.Formation("Li", "Li", 0)), c.Call());
        }

        await c.Datasets.DeleteVersionAsync(new DeleteVersionRequest { Dataset = "one", Version = 3 }, c.Call());
        var versions = new List<long>();
        var request = new ListVersionsRequest { Dataset = "one", PageSize = 2 };
        string? firstToken = null;
        do
        {
            ListVersionsResponse response = await c.Datasets.ListVersionsAsync(request, c.Call());
            versions.AddRange(response.Versions.Select(v => v.Version));
            request.PageToken = response.NextPageToken;
            firstToken ??= response.NextPageToken;
        }
        while (request.PageToken.Length > 0);
        Assert.Equal([1L, 2, 4, 5], versions);

        var foreign = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "two", PageToken = firstToken }, c.Call()));
        Assert.Equal(StatusCode.InvalidArgument, foreign.StatusCode);
        Assert.Equal(ErrorReasons.InvalidPageToken.Code, foreign.GetRpcStatus()!.GetDetail<Google.Rpc.ErrorInfo>()!.Reason);

        // A datasets token does not continue a versions list, nor the other way round.
        var crossed = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.ListDatasetsAsync(new ListDatasetsRequest { PageToken = firstToken }, c.Call()));
        Assert.Equal(StatusCode.InvalidArgument, crossed.StatusCode);
    }

    [Theory]
    [InlineData("not a token at all")]
    [InlineData("cDIKZGF0YXNldHMKeA")] // well-formed, but a token format this server never made ("p2")
    [InlineData("====")]
    public async Task Broken_tokens_and_negative_sizes_are_invalid_arguments(string token)
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        var broken = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.ListDatasetsAsync(new ListDatasetsRequest { PageToken = token }, c.Call()));
        Assert.Equal(StatusCode.InvalidArgument, broken.StatusCode);
        Assert.Equal("page_token", Assert.Single(Data.Violations(broken)).Field);

        var negative = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.ListDatasetsAsync(new ListDatasetsRequest { PageSize = -1 }, c.Call()));
        Assert.Equal("page_size", Assert.Single(Data.Violations(negative)).Field);
    }
}
