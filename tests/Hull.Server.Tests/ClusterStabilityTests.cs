using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;
using Hull.Store.Tests.Backends;

namespace Hull.Server.Tests;

/// <summary>
/// Every stability call that stands on a chemical system's hull goes through the grain that holds that hull: three
/// members answer entry stability, candidate assessment, stable phases and facets as a lone server does (the lone
/// server's answers are checked against SciPy's linear program in <see cref="LinearProgramReferenceTests"/>), and
/// between them build each system's hull once, counted in every member's hull cache.
/// </summary>
public sealed class ClusterStabilityTests
{
    private static readonly GetEntryStabilityRequest Entries = new() { Dataset = "cl", EntryIds = { "li2o", "coo", "licoo2", "lio2", "li", "co" } };

    private static readonly AssessCandidatesRequest Candidates = new()
    {
        Dataset = "cl",
        Candidates =
        {
            new Candidate { Label = "a", Formula = "LiCoO3", EnergyEv = -1.5, Basis = EnergyBasis.FormationPerAtom },
            new Candidate { Label = "b", Formula = "Li3O2", EnergyEv = -1.9, Basis = EnergyBasis.FormationPerAtom },
            new Candidate { Label = "c", Formula = "CoO2", EnergyEv = -0.4, Basis = EnergyBasis.FormationPerAtom },
            new Candidate { Label = "d", Formula = "Li2CoO3", EnergyEv = -1.7, Basis = EnergyBasis.FormationPerAtom },
        },
    };

    [Fact]
    public async Task Three_members_answer_every_system_hull_call_as_a_lone_server_and_build_each_system_hull_once_between_them()
    {
        string store = PostgresTestCluster.NewSchema("cluster");
        await using var lone = await RunningServer.StartAsync();
        await using var first = await RunningServer.StartAsync(o => ClusterTests.Member(o, store));
        await using var second = await RunningServer.StartAsync(o => ClusterTests.Member(o, store));
        await using var third = await RunningServer.StartAsync(o => ClusterTests.Member(o, store));
        RunningServer[] members = [first, second, third];
        await ClusterTests.CreateAsync(lone);
        await ClusterTests.CreateAsync(first);
        foreach (RunningServer member in members) Assert.Equal(3, await ClusterTests.ActiveMembersAsync(member, 3));

        var phases = new[] { "Co-Li-O", "Li-O" }.Select(s => new GetStablePhasesRequest { Dataset = "cl", ChemicalSystem = s }).ToArray();
        var facets = new[] { "Co-O", "Co-Li-O" }.Select(s => new GetHullFacetsRequest { Dataset = "cl", ChemicalSystem = s }).ToArray();
        var l = lone.Clients;
        GetEntryStabilityResponse entries = await l.Stability.GetEntryStabilityAsync(Entries, l.Call());
        AssessCandidatesResponse candidates = await l.Stability.AssessCandidatesAsync(Candidates, l.Call());
        GetStablePhasesResponse[] phasesExpected = [.. await Task.WhenAll(phases.Select(p => l.Stability.GetStablePhasesAsync(p, l.Call()).ResponseAsync))];
        GetHullFacetsResponse[] facetsExpected = [.. await Task.WhenAll(facets.Select(f => l.Stability.GetHullFacetsAsync(f, l.Call()).ResponseAsync))];
        foreach (RunningServer member in new[] { first, second, third, second })
        {
            var c = member.Clients;
            Assert.Equal(entries, await c.Stability.GetEntryStabilityAsync(Entries, c.Call()));
            Assert.Equal(candidates, await c.Stability.AssessCandidatesAsync(Candidates, c.Call()));
            for (int i = 0; i < phases.Length; i++) Assert.Equal(phasesExpected[i], await c.Stability.GetStablePhasesAsync(phases[i], c.Call()));
            for (int i = 0; i < facets.Length; i++) Assert.Equal(facetsExpected[i], await c.Stability.GetHullFacetsAsync(facets[i], c.Call()));
        }

        // Five systems asked: Li-O, Co-O, Co-Li-O, Li and Co. Each built once in the whole cluster, wherever placed,
        // by its grain: the members' own hull caches built nothing else.
        long cacheBuilds = 0;
        foreach (RunningServer member in members)
        {
            cacheBuilds += (await member.Clients.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), member.Clients.Call())).HullBuilds;
        }

        Assert.Equal(5, cacheBuilds);
        Assert.Equal(5, members.Sum(m => m.Server.ClusterCounters.GrainHullBuilds));
        Assert.Equal(5, (await l.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), l.Call())).HullBuilds);
    }

    [Fact]
    public async Task A_candidate_refused_in_a_later_system_is_refused_as_the_lone_server_refuses_it()
    {
        string store = PostgresTestCluster.NewSchema("cluster");
        await using var lone = await RunningServer.StartAsync();
        await using var member = await RunningServer.StartAsync(o => ClusterTests.Member(o, store));
        await ClusterTests.CreateAsync(lone);
        await ClusterTests.CreateAsync(member);
        // A total energy with no elemental references in a dataset of formation energies: refused as candidates[2],
        // the third of the request, though it is the first of its system's part.
        var request = new AssessCandidatesRequest { Dataset = "cl", Candidates = { Candidates.Candidates[0], Candidates.Candidates[1] } };
        request.Candidates.Add(new Candidate { Label = "t", Formula = "CoO2", EnergyEv = -15.0, Basis = EnergyBasis.TotalPerFormulaUnit });
        RpcException expected = await Assert.ThrowsAsync<RpcException>(() => lone.Clients.Stability.AssessCandidatesAsync(request, lone.Clients.Call()).ResponseAsync);
        RpcException got = await Assert.ThrowsAsync<RpcException>(() => member.Clients.Stability.AssessCandidatesAsync(request, member.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.FailedPrecondition, expected.StatusCode);
        Assert.Contains("candidates[2]", expected.Status.Detail, StringComparison.Ordinal);
        Assert.Equal(expected.GetRpcStatus(), got.GetRpcStatus());
    }
}
