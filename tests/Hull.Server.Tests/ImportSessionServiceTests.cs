using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>Import sessions over gRPC: one version per session, errors that name the row and field, the write token.</summary>
public sealed class ImportSessionServiceTests
{
    [Fact]
    public async Task A_session_of_three_batches_makes_one_version_and_reads_see_nothing_before_the_commit()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, c.Call());
        ImportSession session = await c.Datasets.BeginImportAsync(
            new BeginImportRequest { Dataset = "d", DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = "three.csv" }, c.Call());
        Assert.Equal(600, session.IdleExpirySeconds);
        for (int b = 0; b < 3; b++)
        {
            var stage = new StageEntriesRequest { SessionId = session.SessionId };
            stage.Entries.Add(Data.Formation($"e{b}", $"Li{b + 1}O", -1 - b));
            Assert.Equal(b + 1, (await c.Datasets.StageEntriesAsync(stage, c.Call())).StagedCount);
        }

        Assert.Equal(0, (await c.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "d" }, c.Call())).Dataset.LatestVersion);
        ImportEntriesResponse committed = await c.Datasets.CommitImportAsync(new CommitImportRequest { SessionId = session.SessionId }, c.Call());

        Assert.Equal((1L, 3), (committed.DatasetVersion, committed.InsertedCount));
        var versions = (await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "d" }, c.Call())).Versions;
        Assert.Equal(("three.csv", 3), (versions.Single().SourceLabel, versions.Single().BatchEntryCount));
        var gone = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.StageEntriesAsync(new StageEntriesRequest { SessionId = session.SessionId, Entries = { Data.Formation("late", "Li", 0) } }, c.Call()));
        Assert.Equal(StatusCode.NotFound, gone.StatusCode);
        Assert.Equal("session_id", Data.Violations(gone).Single().Field);
    }

    [Fact]
    public async Task A_duplicate_found_at_commit_names_its_place_in_the_session_and_the_session_stays_open()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, c.Call());
        ImportSession session = await c.Datasets.BeginImportAsync(new BeginImportRequest { Dataset = "d", DuplicatePolicy = DuplicatePolicy.Reject }, c.Call());
        await c.Datasets.StageEntriesAsync(new StageEntriesRequest { SessionId = session.SessionId, Entries = { Data.Formation("a", "Li", 0) } }, c.Call());
        await c.Datasets.StageEntriesAsync(new StageEntriesRequest { SessionId = session.SessionId, Entries = { Data.Formation("b", "O", 0) } }, c.Call());
        // Another import commits "b" meanwhile.
        await c.Datasets.ImportEntriesAsync(Data.Batch("d", DuplicatePolicy.Reject, Data.Formation("b", "O", 0)), c.Call());

        var refused = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.CommitImportAsync(new CommitImportRequest { SessionId = session.SessionId }, c.Call()));

        Assert.Equal(StatusCode.AlreadyExists, refused.StatusCode);
        var violation = Data.Violations(refused).Single();
        Assert.Equal("staged[1].id", violation.Field);
        Assert.Equal("id 'b' is already in dataset 'd' version 1", violation.Description);
        Assert.Single((await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "d" }, c.Call())).Versions);
        await c.Datasets.CancelImportAsync(new CancelImportRequest { SessionId = session.SessionId }, c.Call());
        Assert.Equal(0, running.Server.Store.CountStagedRows());
    }

    [Fact]
    public async Task Session_calls_are_write_methods_and_a_bad_row_names_its_field()
    {
        await using RunningServer running = await RunningServer.StartAsync(o => o with { WriteToken = "s3cret" });
        Clients c = running.Clients;
        await c.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "d" }, c.Call());
        using var anonymous = new Clients(running.Server.Address);
        var denied = await Assert.ThrowsAsync<RpcException>(async () =>
            await anonymous.Datasets.BeginImportAsync(new BeginImportRequest { Dataset = "d", DuplicatePolicy = DuplicatePolicy.Reject }, anonymous.Call()));
        Assert.Equal(StatusCode.Unauthenticated, denied.StatusCode);

        ImportSession session = await c.Datasets.BeginImportAsync(new BeginImportRequest { Dataset = "d", DuplicatePolicy = DuplicatePolicy.Reject }, c.Call());
        var bad = await Assert.ThrowsAsync<RpcException>(async () => await c.Datasets.StageEntriesAsync(
            new StageEntriesRequest { SessionId = session.SessionId, Entries = { Data.Formation("ok", "Li", 0), Data.Formation("typo", "LiQ", 0) } }, c.Call()));
        Assert.Equal(StatusCode.InvalidArgument, bad.StatusCode);
        Assert.Equal("entries[1].formula", Data.Violations(bad).Single().Field);
        Assert.Equal(0, running.Server.Store.CountStagedRows());

        var missing = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.BeginImportAsync(new BeginImportRequest { Dataset = "nope", DuplicatePolicy = DuplicatePolicy.Reject }, c.Call()));
        Assert.Equal(StatusCode.NotFound, missing.StatusCode);
    }
}
