using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Stability under energy uncertainty over gRPC: σ and groups stored per entry version and exported as given, the
/// sampling answered against the closed form of a binary, reproducible by seed, and the refusals it documents.
/// </summary>
public sealed class UncertaintyServiceTests
{
    private static Entry WithSigma(Entry entry, double sigma, string group = "")
    {
        entry.EnergySigmaEvPerAtom = sigma;
        entry.CorrelationGroup = group;
        return entry;
    }

    [Fact]
    public async Task Sigma_and_group_are_stored_per_version_and_exported_as_given()
    {
        await using var s = await RunningServer.StartAsync();
        await Data.CreateWithAsync(s.Clients, "u", Data.Formation("A", "Li", 0), Data.Formation("B", "Co", 0),
            WithSigma(Data.Formation("AB", "LiCo", 0.01), 0.02, "ml"), WithSigma(Data.Formation("A2B", "Li2Co", -0.05), 0.0));
        await s.Clients.Datasets.ImportEntriesAsync(
            Data.Batch("u", DuplicatePolicy.Replace, WithSigma(Data.Formation("AB", "LiCo", 0.01), 0.04)), s.Clients.Call());

        Entry[] v1 = await ExportAsync(s.Clients, "u", 1);
        Entry[] v2 = await ExportAsync(s.Clients, "u", 2);
        Entry ab1 = v1.Single(e => e.Id == "AB"), ab2 = v2.Single(e => e.Id == "AB");
        Assert.True(ab1.HasEnergySigmaEvPerAtom && ab1.EnergySigmaEvPerAtom == 0.02 && ab1.CorrelationGroup == "ml");
        Assert.True(ab2.EnergySigmaEvPerAtom == 0.04 && ab2.CorrelationGroup == "");
        Assert.True(v1.Single(e => e.Id == "A2B").HasEnergySigmaEvPerAtom);
        Assert.False(v1.Single(e => e.Id == "A").HasEnergySigmaEvPerAtom);

        // Version 1's group has no σ unless the request gives one; version 2 has no group.
        var refused = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Uncertainty.SampleStabilityAsync(
            new SampleStabilityRequest { Dataset = "u", Version = 1, ChemicalSystem = "Li-Co", Samples = 100 }, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, refused.StatusCode);
        var violation = Data.Violations(refused).Single();
        Assert.Equal("group_sigmas", violation.Field);
        Assert.Contains("'ml'", violation.Description);
        Assert.Contains("entry 'AB'", violation.Description);
        var answer = await s.Clients.Uncertainty.SampleStabilityAsync(
            new SampleStabilityRequest { Dataset = "u", Version = 2, ChemicalSystem = "Li-Co", Samples = 100 }, s.Clients.Call());
        Assert.Equal(2, answer.Used.Version);
        Assert.Equal(0.04, answer.Entries.Single(e => e.EntryId == "AB").SigmaEvPerAtom);
    }

    [Fact]
    public async Task A_binary_compound_is_stable_with_the_normal_probability_and_the_answer_follows_the_seed()
    {
        await using var s = await RunningServer.StartAsync();
        // AB at ΔE = +0.01 eV/atom above the A–B tie-line with σ = 0.02: P(vertex) = P(E < 0) = Φ(−0.5) = 0.3085375
        // (common practice; Φ(−0.5) = 0.3085375 from memory, the value scipy.stats.norm.cdf(-0.5) gives in the Core check).
        await Data.CreateWithAsync(s.Clients, "bin", Data.Formation("A", "Li", 0), Data.Formation("B", "Co", 0), WithSigma(Data.Formation("AB", "LiCo", 0.01), 0.02));
        var request = new SampleStabilityRequest { Dataset = "bin", ChemicalSystem = "Co-Li", Samples = 6000, Seed = 77 };
        SampleStabilityResponse first = await s.Clients.Uncertainty.SampleStabilityAsync(request, s.Clients.Call());
        var ab = first.Entries.Single(e => e.EntryId == "AB");
        Assert.InRange(ab.VertexProbability, 0.3085375 - 3 * ab.VertexProbabilityStandardError, 0.3085375 + 3 * ab.VertexProbabilityStandardError);
        Assert.Equal(SamplingStop.SampleCountReached, first.Stop);
        Assert.Equal(6000, first.SampleCount);
        Assert.False(ab.PlainIsHullVertex);
        Assert.Equal(0.01, ab.PlainEnergyAboveHullEvPerAtom, 1e-12);
        Assert.Equal(["A", "B"], ab.MostProbableProducts);
        Assert.DoesNotContain("AB", first.ProbableStableSet);
        Assert.Equal(first, await s.Clients.Uncertainty.SampleStabilityAsync(request, s.Clients.Call()));

        request.Seed = 78;
        Assert.NotEqual(ab.VertexProbability, (await s.Clients.Uncertainty.SampleStabilityAsync(request, s.Clients.Call())).Entries.Single(e => e.EntryId == "AB").VertexProbability);

        var figure = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Uncertainty.DrawStabilityOddsFigureAsync(
            new DrawStabilityOddsFigureRequest { Sampling = new SampleStabilityRequest { Dataset = "bin", ChemicalSystem = "Co-Li" } }, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, figure.StatusCode);
        Assert.Equal("sampling.chemical_system", Data.Violations(figure).Single().Field);
    }

    [Fact]
    public async Task A_long_sampling_call_ends_at_its_deadline_or_cancel_and_the_server_answers_the_next_call()
    {
        await using var s = await RunningServer.StartAsync();
        // 300 invented Li–Co–O entries with σ: 60,000 samples are about 10 s of work on two idle cores, far past the deadline.
        var random = new Random(5);
        var entries = new List<Entry>(Data.LiCoO());
        for (int i = 0; i < 300; i++)
        {
            entries.Add(WithSigma(Data.Formation($"r{i}", $"Li{random.Next(1, 9)}Co{random.Next(1, 9)}O{random.Next(1, 9)}", -1.8 + random.NextDouble()), 0.02));
        }

        await Data.CreateWithAsync(s.Clients, "big", [.. entries]);
        // A short request first, so that the system's hull is built and the long calls below start sampling at once
        // (a deadline that passed while the hull was being built would stop a call before it ever sampled).
        var small = new SampleStabilityRequest { Dataset = "big", ChemicalSystem = "Co-Li-O", Samples = 50, Seed = 3 };
        Assert.Equal(50, (await s.Clients.Uncertainty.SampleStabilityAsync(small, s.Clients.Call())).SampleCount);
        Assert.Equal(1, s.Server.Sampling.Finished);

        var large = new SampleStabilityRequest { Dataset = "big", ChemicalSystem = "Co-Li-O", Samples = 60_000, Seed = 3 };
        var late = await Assert.ThrowsAsync<RpcException>(() =>
            s.Clients.Uncertainty.SampleStabilityAsync(large, s.Clients.Call(TimeSpan.FromSeconds(2))).ResponseAsync);
        Assert.Equal(StatusCode.DeadlineExceeded, late.StatusCode);

        // Cancelled once its sampling is under way (a call cancelled before it samples has nothing to stop); the
        // deadline call's sampling may still be winding down when its caller has given up, so wait for that first.
        for (int wait = 0; wait < 6000 && s.Server.Sampling.Running > 0; wait++)
        {
            await Task.Delay(10);
        }

        Assert.Equal(1, s.Server.Sampling.Stopped);
        using var cancel = new CancellationTokenSource();
        Task<SampleStabilityResponse> running = s.Clients.Uncertainty.SampleStabilityAsync(large, s.Clients.Call().WithCancellationToken(cancel.Token)).ResponseAsync;
        for (int wait = 0; wait < 6000 && s.Server.Sampling.Running == 0 && !running.IsCompleted; wait++)
        {
            await Task.Delay(10);
        }

        await cancel.CancelAsync();
        var cancelled = await Assert.ThrowsAsync<RpcException>(() => running);
        Assert.Equal(StatusCode.Cancelled, cancelled.StatusCode);

        // Both stopped their sampling (not merely their reply): no call is sampling, neither ran to its end.
        for (int wait = 0; wait < 1200 && s.Server.Sampling.Running > 0; wait++)
        {
            await Task.Delay(100);
        }

        Assert.Equal(0, s.Server.Sampling.Running);
        Assert.Equal(2, s.Server.Sampling.Stopped);
        Assert.Equal(1, s.Server.Sampling.Finished);

        // The short request again: answered in full.
        SampleStabilityResponse answer = await s.Clients.Uncertainty.SampleStabilityAsync(small, s.Clients.Call());
        Assert.Equal(50, answer.SampleCount);
        Assert.Equal(entries.Count, answer.Entries.Count);
        Assert.Equal(2, s.Server.Sampling.Finished);
    }

    [Fact]
    public async Task Bad_uncertainty_and_sampling_requests_are_refused_naming_the_field()
    {
        await using var s = await RunningServer.StartAsync();
        await s.Clients.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = "bad" }, s.Clients.Call());
        var batch = Data.Batch("bad", DuplicatePolicy.Reject, Data.Formation("A", "Li", 0), WithSigma(Data.Formation("AB", "LiCo", 0.01), -0.1));
        var e1 = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Datasets.ImportEntriesAsync(batch, s.Clients.Call()).ResponseAsync);
        Assert.Equal("entries[1].energy_sigma_ev_per_atom", Data.Violations(e1).Single().Field);
        batch.Entries[1].EnergySigmaEvPerAtom = double.NaN;
        var e2 = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Datasets.ImportEntriesAsync(batch, s.Clients.Call()).ResponseAsync);
        Assert.Equal("entries[1].energy_sigma_ev_per_atom", Data.Violations(e2).Single().Field);
        var described = await s.Clients.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "bad" }, s.Clients.Call());
        Assert.Equal(0, described.Dataset.LatestVersion);

        batch.Entries[1].EnergySigmaEvPerAtom = 0.02;
        await s.Clients.Datasets.ImportEntriesAsync(batch, s.Clients.Call());
        async Task<BadRequestField> Refused(SampleStabilityRequest r)
        {
            var e = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Uncertainty.SampleStabilityAsync(r, s.Clients.Call()).ResponseAsync);
            Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
            var v = Data.Violations(e).Single();
            return new BadRequestField(v.Field, v.Description);
        }

        Assert.Equal("samples", (await Refused(new SampleStabilityRequest { Dataset = "bad", ChemicalSystem = "Li-Co", Samples = 1 })).Field);
        var tooMany = await Refused(new SampleStabilityRequest { Dataset = "bad", ChemicalSystem = "Li-Co", Samples = 200_000 });
        Assert.Equal("samples", tooMany.Field);
        Assert.Contains("work limit", tooMany.Description);
        Assert.Equal("target_standard_error", (await Refused(new SampleStabilityRequest { Dataset = "bad", ChemicalSystem = "Li-Co", TargetStandardError = 0.7 })).Field);
        Assert.Equal("samples", (await Refused(new SampleStabilityRequest { Dataset = "bad", ChemicalSystem = "Li-Co", TargetStandardError = 0.01, Samples = 10 })).Field);
        var group = new SampleStabilityRequest { Dataset = "bad", ChemicalSystem = "Li-Co" };
        group.GroupSigmas.Add(new GroupSigma { Group = "g", SigmaEvPerAtom = -1 });
        Assert.Equal("group_sigmas[0]", (await Refused(group)).Field);
    }

    private sealed record BadRequestField(string Field, string Description);

    private static async Task<Entry[]> ExportAsync(Clients c, string dataset, long version)
    {
        var all = new List<Entry>();
        using var call = c.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = dataset, Version = version }, c.Call());
        await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync()) all.AddRange(page.Entries);
        return [.. all];
    }
}
