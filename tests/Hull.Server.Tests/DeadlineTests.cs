using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>Deadlines are honoured: the caller gets DEADLINE_EXCEEDED, and the server carries on serving.</summary>
public sealed class DeadlineTests
{
    [Fact]
    public async Task A_query_past_its_deadline_ends_with_deadline_exceeded_and_the_build_serves_the_next_caller()
    {
        await using var s = await RunningServer.StartAsync();
        var c = s.Clients;
        var entries = new List<Entry>(Data.LiCoO());
        var random = new Random(3);
        for (int i = 0; i < 2000; i++)
        {
            entries.Add(Data.Formation($"r{i}", $"Li{random.Next(1, 20)}Co{random.Next(1, 20)}O{random.Next(1, 40)}", -1.5 + random.NextDouble()));
        }

        await Data.CreateWithAsync(c, "d", [.. entries]);
        var query = new AnalyzeDatasetRequest { Dataset = "d" };
        var e = await Assert.ThrowsAsync<RpcException>(async () =>
        {
            using var call = c.Stability.AnalyzeDataset(query, c.Call(TimeSpan.FromMilliseconds(1)));
            await foreach (var _ in call.ResponseStream.ReadAllAsync())
            {
            }
        });
        Assert.Equal(StatusCode.DeadlineExceeded, e.StatusCode);

        int count = 0;
        using (var call = c.Stability.AnalyzeDataset(query, c.Call()))
        {
            await foreach (var page in call.ResponseStream.ReadAllAsync()) count += page.Results.Count;
        }

        Assert.Equal(entries.Count, count);
    }
}
