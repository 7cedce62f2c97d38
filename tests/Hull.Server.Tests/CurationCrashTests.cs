using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using DatasetStore = Hull.Store.DatasetStore;

namespace Hull.Server.Tests;

/// <summary>
/// CurateVersion with the server process SIGKILLed at random moments: after every restart each version past the
/// source is a whole curated version with its record (never one without the other, never part of the rows), and
/// once the killed sessions lapse (the default 10 minutes, read with a clock moved on) nothing is left staged.
/// </summary>
public sealed class CurationCrashTests
{
    private const int Batches = 20;
    private const int EntriesPerBatch = 1000;
    private const int Kills = 4;

    // Every tenth entry is flagged, so the recipe keeps nine in ten.
    private const int Kept = Batches * EntriesPerBatch * 9 / 10;
    private const string Recipe = """{"recipe_schema": 1, "steps": [{"kind": "drop_flagged"}]}""";

    [Fact]
    public async Task A_killed_curation_leaves_no_version_and_no_record_and_a_finished_one_both()
    {
        using var folder = new TempFolder("hull-curation-crash");
        var random = new Random(20261204);
        int interrupted = 0;
        for (int round = 0; round <= Kills; round++)
        {
            using ChildServer server = await ChildServer.StartAsync(folder.Path);
            using var c = new Clients(server.Address);
            if (round == 0)
            {
                await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "big" }, c.Call());
                for (int b = 0; b < Batches; b++) await c.Datasets.ImportEntriesAsync(BatchOf(b), c.Call());
            }
            else
            {
                await VerifyAsync(c);
            }

            Task? killer = null;
            if (round < Kills)
            {
                int delayMs = random.Next(0, 1500);
                killer = Task.Run(async () =>
                {
                    await Task.Delay(delayMs);
                    server.Kill();
                });
            }

            try
            {
                CurateVersionResponse done = await c.Curation.CurateVersionAsync(
                    new CurateVersionRequest { Dataset = "big", SourceVersion = Batches, RecipeJson = Recipe }, c.Call(TimeSpan.FromMinutes(2)));
                Assert.Equal(Kept, done.EntryCount);
            }
            catch (RpcException) when (killer is not null)
            {
                interrupted++;
            }

            if (killer is not null) await killer;
            else await VerifyAsync(c);
        }

        Assert.True(interrupted >= 1, "no kill interrupted a curation");
        // Once the killed sessions lapse (read with a clock past the default expiry), the sweep removes them with their
        // rows, and every record has its version.
        using DatasetStore store = DatasetStore.Open(folder.Path, new LaterClock(TimeSpan.FromMinutes(11)));
        store.RemoveExpiredImports();
        Assert.Equal(0, store.CountStagedRows());
        Assert.Equal(store.ListVersions("big").Select(v => v.Version).Where(v => v > Batches), store.ListCurationRecords("big").Keys.Order());
    }

    /// <summary>Versions 1..Batches are the imports; each later one holds exactly the kept rows and has its record.</summary>
    private static async Task VerifyAsync(Clients c)
    {
        var versions = (await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "big", PageSize = 1000 }, c.Call())).Versions;
        Assert.Equal(Enumerable.Range(1, Batches).Select(v => (long)v), versions.Take(Batches).Select(v => v.Version));
        foreach (DatasetVersion derived in versions.Skip(Batches))
        {
            Assert.Equal(Kept, derived.EntryCount);
            Assert.NotNull(derived.Curation);
            Assert.Equal(Batches, derived.Curation.SourceVersion);
            int count = 0;
            using var call = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = "big", Version = derived.Version, PageSize = 10_000 }, c.Call());
            await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync())
            {
                Assert.DoesNotContain(page.Entries, e => e.Note == "flagged");
                count += page.Entries.Count;
            }
            Assert.Equal(Kept, count);
        }
    }

    private static ImportEntriesRequest BatchOf(int b)
    {
        var request = new ImportEntriesRequest { Dataset = "big", DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = $"batch-{b:000}" };
        for (int j = 0; j < EntriesPerBatch; j++)
        {
            Entry entry = Data.Formation($"b{b:000}-{j:0000}", $"Li{1 + j % 7}Co{1 + b % 5}O{2 + j % 11}", -1.0 - 0.001 * j);
            if (j % 10 == 0) entry.Note = "flagged";
            request.Entries.Add(entry);
        }

        return request;
    }

    /// <summary>The system clock moved on by a fixed span.</summary>
    private sealed class LaterClock(TimeSpan ahead) : TimeProvider
    {
        public override DateTimeOffset GetUtcNow() => base.GetUtcNow() + ahead;
    }
}
