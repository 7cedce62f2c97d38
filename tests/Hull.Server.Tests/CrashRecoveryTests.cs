using System.Text.RegularExpressions;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using DatasetStore = Hull.Store.DatasetStore;
using Microsoft.Data.Sqlite;

namespace Hull.Server.Tests;

/// <summary>
/// A 100,000-entry import in 100 batches, with the server process SIGKILLed at random moments at least five times:
/// after every restart each committed batch is there whole, no batch is there in part, and the database passes
/// SQLite's PRAGMA integrity_check.
/// </summary>
public sealed partial class CrashRecoveryTests
{
    private const int Batches = 100;
    private const int EntriesPerBatch = 1000;
    private const int Kills = 5;

    [Fact]
    public async Task Every_committed_batch_survives_sigkill_and_no_batch_is_half_there()
    {
        using var folder = new TempFolder("hull-crash");
        var random = new Random(424242);
        int kills = 0;
        int restarts = 0;
        int committed = 0;
        while (true)
        {
            using ChildServer server = await ChildServer.StartAsync(folder.Path);
            using var c = new Clients(server.Address);
            if (restarts == 0)
            {
                await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "big" }, c.Call());
            }
            else
            {
                committed = await VerifyAsync(c, atLeast: committed);
            }

            restarts++;
            if (committed == Batches) break;

            Task? killer = null;
            if (kills < Kills)
            {
                int delayMs = random.Next(30, 700);
                killer = Task.Run(async () =>
                {
                    await Task.Delay(delayMs);
                    server.Kill();
                });
            }

            for (int b = committed; b < Batches; b++)
            {
                try
                {
                    var response = await c.Datasets.ImportEntriesAsync(BatchOf(b), c.Call());
                    Assert.Equal(b + 1, response.DatasetVersion);
                    committed = b + 1;
                }
                catch (RpcException) when (server.HasExited || killer is not null)
                {
                    break;
                }
            }

            if (killer is not null)
            {
                await killer;
                kills++;
                Assert.Equal("ok", IntegrityCheck(folder.Path));
            }
        }

        Assert.True(kills >= Kills, $"only {kills} kills happened");
        Assert.Equal(Batches, committed);
        Assert.Equal("ok", IntegrityCheck(folder.Path));
    }

    /// <summary>Checks that the versions and entries are whole batches 0..m-1 and returns m.</summary>
    private static async Task<int> VerifyAsync(Clients c, int atLeast)
    {
        var versions = (await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "big", PageSize = 1000 }, c.Call())).Versions;
        int m = versions.Count;
        Assert.True(m >= atLeast, $"{m} versions after restart, but {atLeast} batches were acknowledged");
        for (int v = 0; v < m; v++)
        {
            Assert.Equal(v + 1, versions[v].Version);
            Assert.Equal($"batch-{v:000}", versions[v].SourceLabel);
            Assert.Equal(EntriesPerBatch, versions[v].BatchEntryCount);
            Assert.Equal((v + 1L) * EntriesPerBatch, versions[v].EntryCount);
        }

        var perBatch = new int[Batches];
        int total = 0;
        if (m > 0)
        {
            using var call = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = "big", PageSize = DatasetStore.MaxPageSize }, c.Call(TimeSpan.FromMinutes(2)));
            await foreach (var page in call.ResponseStream.ReadAllAsync())
            {
                foreach (Entry e in page.Entries)
                {
                    Match match = IdPattern().Match(e.Id);
                    Assert.True(match.Success, e.Id);
                    perBatch[int.Parse(match.Groups[1].Value)]++;
                    total++;
                }
            }
        }

        Assert.Equal(m * EntriesPerBatch, total);
        for (int b = 0; b < Batches; b++) Assert.Equal(b < m ? EntriesPerBatch : 0, perBatch[b]);
        return m;
    }

    private static ImportEntriesRequest BatchOf(int b)
    {
        var request = new ImportEntriesRequest { Dataset = "big", DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = $"batch-{b:000}" };
        for (int j = 0; j < EntriesPerBatch; j++)
        {
            request.Entries.Add(Data.Formation($"b{b:000}-{j:0000}", $"Li{1 + j % 7}Co{1 + b % 5}O{2 + j % 11}", -1.0 - 0.001 * j));
        }

        return request;
    }

    private static string IntegrityCheck(string dataDirectory)
    {
        string path = Path.Combine(dataDirectory, DatasetStore.DatabaseFileName);
        using var connection = new SqliteConnection(new SqliteConnectionStringBuilder { DataSource = path, Pooling = false }.ToString());
        connection.Open();
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA integrity_check";
        return (string)command.ExecuteScalar()!;
    }

    [GeneratedRegex(@"^b(\d{3})-\d{4}$")]
    private static partial Regex IdPattern();
}
