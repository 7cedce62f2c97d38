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
    private static Entry PerAtom(string id, string formula, double evPerAtom) =>
        new() { Id = id, Formula = formula, EnergyEv = evPerAtom, Basis = EnergyBasis.TotalPerAtom };

    private static Task<ImportSession> StageAsync(Clients c, string dataset, params Entry[][] batches) =>
        StageAsync(c, dataset, DuplicatePolicy.Reject, batches);

    private static async Task<ImportSession> StageAsync(Clients c, string dataset, DuplicatePolicy policy, params Entry[][] batches)
    {
        ImportSession session = await c.Datasets.BeginImportAsync(new BeginImportRequest { Dataset = dataset, DuplicatePolicy = policy }, c.Call());
        foreach (Entry[] batch in batches)
        {
            var stage = new StageEntriesRequest { SessionId = session.SessionId };
            stage.Entries.AddRange(batch);
            await c.Datasets.StageEntriesAsync(stage, c.Call());
        }

        return session;
    }

    /// <summary>The one field violation of a commit that must be refused as INVALID_ARGUMENT, after checking its field.</summary>
    private static async Task<Google.Rpc.BadRequest.Types.FieldViolation> RefusedCommitAsync(Clients c, ImportSession session, string field)
    {
        var refused = await Assert.ThrowsAsync<RpcException>(async () =>
            await c.Datasets.CommitImportAsync(new CommitImportRequest { SessionId = session.SessionId }, c.Call()));
        Assert.Equal(StatusCode.InvalidArgument, refused.StatusCode);
        var violation = Assert.Single(Data.Violations(refused));
        Assert.Equal(field, violation.Field);
        return violation;
    }

    [Fact]
    public async Task A_commit_refuses_a_staged_total_energy_whose_implied_formation_energy_is_out_of_range_and_keeps_the_session()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "d", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54));
        // -2e4 eV per formula unit against these references implies about -1e4 eV/atom of formation energy, far outside
        // the ±100 eV/atom that ImportEntries accepts; in a session it is the second row of the second batch.
        ImportSession session = await StageAsync(c, "d", [Data.Formation("ok", "MgO2", -1.0)], [Data.Formation("ok2", "Mg2O", -1.0), Data.Total("bad", "MgO", -2e4)]);

        var violation = await RefusedCommitAsync(c, session, "staged[2].energy_ev");
        Assert.Contains("id 'bad' (MgO)", violation.Description);
        Assert.Contains("implied by its total energy", violation.Description);
        Assert.Single((await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "d" }, c.Call())).Versions);
        // Refused, not lost: the session is still open with its three rows, and cancelling it is what removes them.
        Assert.Equal(3, running.Server.Store.CountStagedRows());
        await c.Datasets.CancelImportAsync(new CancelImportRequest { SessionId = session.SessionId }, c.Call());
        Assert.Equal(0, running.Server.Store.CountStagedRows());
    }

    [Fact]
    public async Task A_commit_refuses_a_staged_reference_that_pushes_stored_entries_out_of_range()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "d", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54), Data.Total("MgO", "MgO", -12.0));
        // A new lowest Mg entry at -1000 eV/atom would put the stored MgO at (-12/2) - 0.5 (-1000) - 0.5 (-4.93), about +496 eV/atom.
        ImportSession session = await StageAsync(c, "d", [PerAtom("Mg-new", "Mg", -1000)]);

        var violation = await RefusedCommitAsync(c, session, "staged[0].energy_ev");
        Assert.Contains("id 'Mg-new' sets the Mg reference to -1000 eV/atom", violation.Description);
        Assert.Contains("'MgO' (MgO)", violation.Description);
        Assert.Single((await c.Datasets.ListVersionsAsync(new ListVersionsRequest { Dataset = "d" }, c.Call())).Versions);
        Assert.Equal(1, running.Server.Store.CountStagedRows());
        await c.Datasets.CancelImportAsync(new CancelImportRequest { SessionId = session.SessionId }, c.Call());

        // Under replace a row of any basis can change a reference: a formation-energy row that supersedes the Mg
        // entry leaves Mg-high (+20 eV/atom) as the reference, and MgO-edge, at (-196.47/2) - 0.5 (-1.54) - 0.5 (-4.93)
        // = -95 eV/atom today, would go to (-196.47/2) - 0.5 (20) - 0.5 (-4.93), about -105.8 eV/atom.
        await Data.CreateWithAsync(c, "r", PerAtom("O2", "O2", -4.93), PerAtom("Mg", "Mg", -1.54), PerAtom("Mg-high", "Mg", 20), Data.Total("MgO-edge", "MgO", -196.47));
        ImportSession replacing = await StageAsync(c, "r", DuplicatePolicy.Replace, [Data.Formation("x", "MgO2", -1.0)], [Data.Formation("Mg", "Mg", 0)]);
        var replaced = await RefusedCommitAsync(c, replacing, "staged[1].energy_ev");
        Assert.Contains("id 'Mg' sets the Mg reference to 20 eV/atom", replaced.Description);
        Assert.Contains("'MgO-edge' (MgO)", replaced.Description);
    }

    [Fact]
    public async Task A_commit_accepts_what_ImportEntries_accepts_a_total_energy_without_reference_and_references_staged_with_it()
    {
        await using RunningServer running = await RunningServer.StartAsync();
        Clients c = running.Clients;
        await Data.CreateWithAsync(c, "d", PerAtom("O2", "O2", -4.93));
        // ZrO2 has no Zr reference: accepted, as ImportEntries accepts it. The Mg reference and MgO come in separate
        // batches; the check sees the whole session, so MgO is judged against the staged Mg: (-12/2) - 0.5 (-1.54) -
        // 0.5 (-4.93) = -2.765 eV/atom, in range.
        ImportSession session = await StageAsync(c, "d", [Data.Total("ZrO2", "ZrO2", -28.5), PerAtom("Mg", "Mg", -1.54)], [Data.Total("MgO", "MgO", -12.0)]);

        ImportEntriesResponse committed = await c.Datasets.CommitImportAsync(new CommitImportRequest { SessionId = session.SessionId }, c.Call());

        Assert.Equal((2L, 3), (committed.DatasetVersion, committed.InsertedCount));
        GetEntryStabilityResponse after = await c.Stability.GetEntryStabilityAsync(new GetEntryStabilityRequest { Dataset = "d", EntryIds = { "MgO" } }, c.Call());
        Assert.Equal(-2.765, after.Results.Single().FormationEnergyEvPerAtom, 1e-9);

        // The ledger the commit leaves behind is the new version's: a later batch is judged against the staged Mg.
        var pushed = await Assert.ThrowsAsync<RpcException>(async () => await c.Datasets.ImportEntriesAsync(
            Data.Batch("d", DuplicatePolicy.Reject, PerAtom("Mg-low", "Mg", -1000)), c.Call()));
        Assert.Contains("'MgO' (MgO)", Assert.Single(Data.Violations(pushed)).Description);
    }
    [Fact]
    public void A_batch_staged_during_the_commit_check_is_answered_as_failed_precondition_naming_the_session()
    {
        // The Store refuses such a commit (ImportSessionTests); this is what the caller then reads.
        RpcException? answer = Hull.Server.Errors.StoreErrorTranslation.Translate(new Hull.Store.ImportSessionChangedException("abc", 4, 5));

        Assert.NotNull(answer);
        Assert.Equal(StatusCode.FailedPrecondition, answer.StatusCode);
        Assert.Contains("import session 'abc' received more entries while its commit was being checked (4 checked, 5 staged)", answer.Status.Detail);
        var failure = answer.GetRpcStatus()!.GetDetail<Google.Rpc.PreconditionFailure>();
        Assert.Equal("import_session:abc", failure.Violations.Single().Subject);
    }
}
