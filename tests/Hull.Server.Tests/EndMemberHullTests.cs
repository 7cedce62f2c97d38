using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Hulls over compound end-members through gRPC, against SciPy's HiGHS linear program (hull_lp.py, Debian
/// /usr/bin/python3) on the same points in end-member atom fractions, with formation energies worked out here from
/// the total energies by the textbook formula.
/// </summary>
public sealed class EndMemberHullTests
{
    private const double ToleranceEvPerAtom = 1e-7;

    // Per atom, the references are the pure-element total energies (common practice).
    private static readonly Dictionary<string, double> ReferenceEvPerAtom = new()
    {
        ["Li"] = -1.91, ["Co"] = -7.11, ["Ni"] = -5.57, ["Mn"] = -9.03, ["O"] = -4.95,
    };

    [Fact]
    public async Task Energies_above_a_pseudo_ternary_hull_match_a_scipy_linear_program()
    {
        var random = new Random(4242);
        string[] metals = ["Co", "Ni", "Mn"];
        var entries = ReferenceEvPerAtom.Select(r => Total($"{r.Key}-ref", r.Key, r.Value)).ToList();
        var onCone = new List<(Entry Entry, long[] FormulaUnits, double FormationEvPerAtom)>();

        // End-members LiMO2 as total energies per formula unit: formation per atom = (E - sum n_el mu_el) / atoms.
        for (int k = 0; k < 3; k++)
        {
            double formation = -1.6 - 0.4 * random.NextDouble();
            double total = 4 * formation + ReferenceEvPerAtom["Li"] + ReferenceEvPerAtom[metals[k]] + 2 * ReferenceEvPerAtom["O"];
            Entry e = Total($"Li{metals[k]}O2-end", $"Li{metals[k]}O2", total);
            entries.Add(e);
            onCone.Add((e, Unit(k), formation));
        }

        for (int i = 0; i < 40; i++)
        {
            long[] units = [random.Next(0, 4), random.Next(0, 4), random.Next(0, 4)];
            if (units.Count(u => u > 0) < 2) units[i % 3] += 1 + random.Next(2);
            if (units.Count(u => u > 0) < 2) units[(i + 1) % 3] += 1;
            long n = units.Sum();
            string formula = $"Li{n}" + string.Concat(metals.Select((m, k) => units[k] == 0 ? string.Empty : $"{m}{units[k]}")) + $"O{2 * n}";
            double formation = -1.5 - 0.6 * random.NextDouble();
            Entry e = Data.Formation($"mix{i:00}", formula, formation);
            entries.Add(e);
            onCone.Add((e, units, formation));
        }

        // Off the cone (another Li : metal : O ratio): part of the elements' hull, never of the end-members' one.
        entries.Add(Data.Formation("off-Li2O", "Li2O", -2.1));
        entries.Add(Data.Formation("off-LiCo2O4", "LiCo2O4", -1.9));

        await using var s = await RunningServer.StartAsync();
        await Data.CreateWithAsync(s.Clients, "pseudo", [.. entries]);
        var request = new GetEntryStabilityRequest { Dataset = "pseudo" };
        request.EntryIds.AddRange(onCone.Select(c => c.Entry.Id));
        // One end-member named by a stored entry, two by formula.
        request.EndMembers.Add(new EndMember { EntryId = "LiCoO2-end" });
        request.EndMembers.Add(new EndMember { Formula = "LiNiO2" });
        request.EndMembers.Add(new EndMember { Formula = "LiMnO2" });
        GetEntryStabilityResponse response = await s.Clients.Stability.GetEntryStabilityAsync(request, s.Clients.Call());

        // Every end-member formula unit has 4 atoms, so atom amounts are 4 x formula units.
        var amounts = onCone.Select(c => c.FormulaUnits.Select(u => 4 * u).ToArray()).ToList();
        var queries = amounts.Select(a => a.Select(x => x / (double)a.Sum()).ToArray()).ToList();
        double[] lp = LinearProgramReferenceTests.RunLinearProgram(amounts, onCone.Select(c => c.FormationEvPerAtom).ToArray(), queries);
        for (int i = 0; i < onCone.Count; i++)
        {
            EntryStability r = response.Results[i];
            Assert.Equal("LiCoO2-LiNiO2-LiMnO2", r.ChemicalSystem);
            Assert.Equal(onCone[i].FormationEvPerAtom, r.FormationEnergyEvPerAtom, 1e-9);
            double expected = Math.Max(0.0, onCone[i].FormationEvPerAtom - lp[i]);
            Assert.True(Math.Abs(r.EnergyAboveHullEvPerAtom - expected) <= ToleranceEvPerAtom,
                $"{r.EntryId}: service {r.EnergyAboveHullEvPerAtom}, LP {expected}");
        }

        Assert.Contains(response.Results, r => r.EnergyAboveHullEvPerAtom > 0.05);
        Assert.Contains(response.Results, r => r.IsHullVertex && r.EntryId.StartsWith("mix", StringComparison.Ordinal));

        // Stable phases and facets over the same end-members; stable = the LP's zero-above entries that are vertices.
        var endMembers = new[] { new EndMember { Formula = "LiCoO2" }, new EndMember { Formula = "LiNiO2" }, new EndMember { Formula = "LiMnO2" } };
        var stable = await s.Clients.Stability.GetStablePhasesAsync(new GetStablePhasesRequest { Dataset = "pseudo", EndMembers = { endMembers } }, s.Clients.Call());
        Assert.Equal(response.Results.Where(r => r.IsHullVertex).Select(r => r.EntryId).Order(StringComparer.Ordinal), stable.Phases.Select(p => p.PhaseId));
        var facets = await s.Clients.Stability.GetHullFacetsAsync(new GetHullFacetsRequest { Dataset = "pseudo", EndMembers = { endMembers } }, s.Clients.Call());
        Assert.Equal(["LiCoO2", "LiNiO2", "LiMnO2"], facets.Components);
        Assert.NotEmpty(facets.TieLines);
    }

    [Fact]
    public async Task Bad_end_members_are_refused_with_the_field_named()
    {
        await using var s = await RunningServer.StartAsync();
        await Data.CreateWithAsync(s.Clients, "pseudo", Data.LiCoO());
        var offCone = new GetEntryStabilityRequest { Dataset = "pseudo", EntryIds = { "Li2O" } };
        offCone.EndMembers.Add(new EndMember { Formula = "LiCoO2" });
        offCone.EndMembers.Add(new EndMember { Formula = "Co3O4" });
        var e = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Stability.GetEntryStabilityAsync(offCone, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.FailedPrecondition, e.StatusCode);
        Assert.Contains("not a non-negative combination", e.Status.Detail, StringComparison.Ordinal);

        var dependent = new GetHullFacetsRequest { Dataset = "pseudo" };
        dependent.EndMembers.Add(new EndMember { Formula = "LiCoO2" });
        dependent.EndMembers.Add(new EndMember { Formula = "Li2Co2O4" });
        e = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Stability.GetHullFacetsAsync(dependent, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        Assert.Equal("end_members[1]", Data.Violations(e).Single().Field);

        var unknown = new GetStablePhasesRequest { Dataset = "pseudo" };
        unknown.EndMembers.Add(new EndMember { EntryId = "no-such-entry" });
        unknown.EndMembers.Add(new EndMember { Formula = "Li2O" });
        e = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Stability.GetStablePhasesAsync(unknown, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.NotFound, e.StatusCode);

        var both = new GetHullFacetsRequest { Dataset = "pseudo", ChemicalSystem = "Li-Co-O" };
        both.EndMembers.Add(new EndMember { Formula = "LiCoO2" });
        both.EndMembers.Add(new EndMember { Formula = "Li2O" });
        e = await Assert.ThrowsAsync<RpcException>(() => s.Clients.Stability.GetHullFacetsAsync(both, s.Clients.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
    }

    [Fact]
    public async Task Explicit_references_apply_to_an_end_member_hull_and_do_not_share_its_cache_slot()
    {
        // Totals built from formation energies by the textbook formula E = N F + sum n_el mu_el (common practice).
        double li = ReferenceEvPerAtom["Li"], co = ReferenceEvPerAtom["Co"], o = ReferenceEvPerAtom["O"];
        double li2CoO2 = 5 * -1.75 + 2 * li + co + 2 * o;
        Entry[] entries =
        [
            Total("Li-ref", "Li", li), Total("Co-ref", "Co", co), Total("O-ref", "O", o),
            Total("Li2O", "Li2O", 3 * -2.0 + 2 * li + o), Total("CoO", "CoO", 2 * -1.2 + co + o), Total("Li2CoO2", "Li2CoO2", li2CoO2),
        ];
        await using var s = await RunningServer.StartAsync();
        await Data.CreateWithAsync(s.Clients, "pair", entries);

        GetEntryStabilityRequest Query(double? explicitLi)
        {
            var request = new GetEntryStabilityRequest { Dataset = "pair", EntryIds = { "Li2CoO2" } };
            request.EndMembers.Add(new EndMember { Formula = "Li2O" });
            request.EndMembers.Add(new EndMember { Formula = "CoO" });
            if (explicitLi is double given) request.ElementalReferences.Add(new ElementReferenceEnergy { Symbol = "Li", EnergyEvPerAtom = given });
            return request;
        }

        GetEntryStabilityResponse stored = await s.Clients.Stability.GetEntryStabilityAsync(Query(null), s.Clients.Call());
        GetEntryStabilityResponse given = await s.Clients.Stability.GetEntryStabilityAsync(Query(-1.5), s.Clients.Call());
        GetEntryStabilityResponse again = await s.Clients.Stability.GetEntryStabilityAsync(Query(null), s.Clients.Call());

        Assert.Equal(-1.75, stored.Results.Single().FormationEnergyEvPerAtom, 1e-9);
        // The same total against Li at -1.5 eV/atom: F = (E - 2 (-1.5) - mu_Co - 2 mu_O) / 5.
        Assert.Equal((li2CoO2 - 2 * -1.5 - co - 2 * o) / 5, given.Results.Single().FormationEnergyEvPerAtom, 1e-9);
        ElementReference liUsed = given.References.Single(r => r.Symbol == "Li");
        Assert.True(liUsed.GivenByCaller);
        Assert.Equal(-1.5, liUsed.TotalEnergyEvPerAtom);
        Assert.Equal(stored.Results.Single(), again.Results.Single());
        Assert.Equal("Li-ref", again.References.Single(r => r.Symbol == "Li").SourceEntryId);

        var facets = new GetHullFacetsRequest { Dataset = "pair", ElementalReferences = { new ElementReferenceEnergy { Symbol = "Li", EnergyEvPerAtom = -1.5 } } };
        facets.EndMembers.Add(new EndMember { Formula = "Li2O" });
        facets.EndMembers.Add(new EndMember { Formula = "CoO" });
        GetHullFacetsResponse pseudo = await s.Clients.Stability.GetHullFacetsAsync(facets, s.Clients.Call());
        Assert.True(pseudo.References.Single(r => r.Symbol == "Li").GivenByCaller);
        var phases = new GetStablePhasesRequest { Dataset = "pair", EndMembers = { facets.EndMembers }, ElementalReferences = { facets.ElementalReferences } };
        GetStablePhasesResponse stable = await s.Clients.Stability.GetStablePhasesAsync(phases, s.Clients.Call());
        Assert.True(stable.References.Single(r => r.Symbol == "Li").GivenByCaller);
        Assert.Equal("Li2O-CoO", stable.Coverage.Single().ChemicalSystem);
    }

    private static long[] Unit(int k) => Enumerable.Range(0, 3).Select(j => j == k ? 1L : 0L).ToArray();

    private static Entry Total(string id, string formula, double ev) =>
        formula.Length <= 2
            ? new Entry { Id = id, Formula = formula, EnergyEv = ev, Basis = EnergyBasis.TotalPerAtom }
            : Data.Total(id, formula, ev);
}
