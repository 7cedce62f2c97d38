using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// The electrochemistry service over gRPC on hand-worked systems (worked in Hull.Core.Tests beside the science:
/// OpenElementHullTests, InsertionVoltageTests, IonStabilityWindowTests, ReactionProfileTests), and every listed
/// bad input answered INVALID_ARGUMENT naming the field.
/// </summary>
public sealed class ElectrochemistryServiceTests : IAsyncLifetime
{
    private RunningServer _server = null!;

    private ElectrochemistryService.ElectrochemistryServiceClient Ec => new(_server.Clients.Channel);

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        await Data.CreateWithAsync(C, "lco", Data.LiCoO());
        // Li-Sn per atom: LiSn −0.80, Li2Sn −1.30, Li3Sn −2.00, Li4Sn −2.30 eV per formula unit.
        await Data.CreateWithAsync(C, "sn",
            Data.Formation("Li", "Li", 0), Data.Formation("Sn", "Sn", 0), Data.Formation("LiSn", "LiSn", -0.40),
            Data.Formation("Li2Sn", "Li2Sn", -1.30 / 3), Data.Formation("Li3Sn", "Li3Sn", -0.50), Data.Formation("Li4Sn", "Li4Sn", -0.46),
            Data.Formation("Mg", "Mg", 0));
        // Li-Fe-F: LiF −6.0, FeF2 −7.0 eV per formula unit.
        await Data.CreateWithAsync(C, "f",
            Data.Formation("Li", "Li", 0), Data.Formation("Fe", "Fe", 0), Data.Formation("F", "F", 0),
            Data.Formation("LiF", "LiF", -3.0), Data.Formation("FeF2", "FeF2", -7.0 / 3));
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    [Fact]
    public async Task Open_hull_answers_on_the_grand_potential_axis()
    {
        var request = new GetOpenElementHullRequest { Dataset = "lco", ChemicalSystem = "Li-Co-O" };
        request.OpenElements.Add(new OpenElementPotential { Element = "O", ChemicalPotentialEvPerAtom = -1.0 });
        GetOpenElementHullResponse response = await Ec.GetOpenElementHullAsync(request, C.Call());
        Assert.Equal(["Co", "Li"], response.Components);
        Assert.Equal("eV per closed-element atom", response.EnergyUnit);
        Assert.Equal(["O"], response.ExcludedEntryIds);
        // CoO at φ = −1.4 against the Co corner Co3O4 at −1.7 (hand-worked).
        Assert.Equal(0.3, response.Entries.Single(e => e.EntryId == "CoO").EnergyAboveHullEvPerClosedAtom, 12);
        Assert.Equal(-2.6, response.Entries.Single(e => e.EntryId == "LiCoO2").GrandPotentialEvPerClosedAtom, 12);
        Assert.Contains("LiCoO2", response.StablePhaseIds);
        Assert.NotEmpty(response.Facets);
    }

    [Fact]
    public async Task Voltage_profile_with_figure()
    {
        GetVoltageProfileResponse response = await Ec.GetVoltageProfileAsync(
            new GetVoltageProfileRequest { Dataset = "sn", HostFormula = "Sn", Ion = "Li", IncludeFigure = true }, C.Call());
        Protos.V1.VoltageProfile p = response.Profile;
        Assert.Equal([0.80, 0.60, 0.30], p.Plateaus.Select(x => Math.Round(x.VoltsAgainstMetal, 9)));
        Assert.Equal(0.575, p.AverageVoltsAgainstMetal, 9);
        Assert.Equal(4.0, p.IonsPerHostInserted, 12);
        Assert.True(p.EndsAtIonMetal);
        Assert.Contains("Gibbs", p.Caveat);
        Assert.StartsWith("<?xml", response.FigureSvg);
        Assert.Contains("kind=\"voltage-profile\"", response.FigureSvg);
    }

    [Fact]
    public async Task Reaction_profile_and_electrochemical_window()
    {
        var reaction = new GetReactionProfileRequest
        {
            Dataset = "f", First = new CompoundRef { EntryId = "Li" }, Second = new CompoundRef { Formula = "FeF2" }, IncludeFigure = true,
        };
        GetReactionProfileResponse r = await Ec.GetReactionProfileAsync(reaction, C.Call());
        Protos.V1.ReactionPoint best = r.Points[r.MostNegativeIndex];
        Assert.True(r.Reacts);
        Assert.Equal("2/5", best.AtomFractionExact);
        Assert.Equal(-1.0, best.ReactionEnergyEvPerAtom, 12);
        Assert.Equal(["Fe", "LiF"], best.Products.Select(p => p.Phase.PhaseId));
        Assert.Contains("kind=\"reaction-profile\"", r.FigureSvg);

        // With F open the reaction is counted per closed-element atom (Li, Fe).
        var withOpen = reaction.Clone();
        withOpen.IncludeFigure = false;
        withOpen.OpenElements.Add(new OpenElementPotential { Element = "F", ChemicalPotentialEvPerAtom = -3.5 });
        GetReactionProfileResponse open = await Ec.GetReactionProfileAsync(withOpen, C.Call());
        Assert.Equal("eV per closed-element atom", open.EnergyUnit);
        Assert.Equal("Fe-Li", open.ChemicalSystem);
        Assert.Contains("F open at -3.5", open.EnergyAxis);

        GetElectrochemicalWindowResponse w = await Ec.GetElectrochemicalWindowAsync(
            new GetElectrochemicalWindowRequest { Dataset = "f", Phase = new CompoundRef { EntryId = "FeF2" }, Ion = "Li" }, C.Call());
        Assert.True(w.Exists);
        Assert.Equal(2.5, w.ReductionLimitVolts, 12);
        Assert.False(w.HasOxidationLimitVolts);
        Assert.Equal(["Fe", "LiF"], w.ReductionProducts.Products.Select(p => p.PhaseId));
    }

    [Fact]
    public async Task Bad_input_names_the_field()
    {
        var notInSystem = new GetOpenElementHullRequest { Dataset = "lco", ChemicalSystem = "Li-Co-O" };
        notInSystem.OpenElements.Add(new OpenElementPotential { Element = "F", ChemicalPotentialEvPerAtom = -1 });
        await AssertField("open_elements[0]", "not an element of the chemical system", () => Ec.GetOpenElementHullAsync(notInSystem, C.Call()).ResponseAsync);

        var above = new GetOpenElementHullRequest { Dataset = "lco", ChemicalSystem = "Li-Co-O" };
        above.OpenElements.Add(new OpenElementPotential { Element = "O", ChemicalPotentialEvPerAtom = 0.5 });
        await AssertField("open_elements[0]", "above its reference", () => Ec.GetOpenElementHullAsync(above, C.Call()).ResponseAsync);

        await AssertField("ion", "not an element symbol", () =>
            Ec.GetVoltageProfileAsync(new GetVoltageProfileRequest { Dataset = "sn", HostFormula = "Sn", Ion = "li" }, C.Call()).ResponseAsync);
        await AssertField("ion", "no phase containing Mg", () =>
            Ec.GetVoltageProfileAsync(new GetVoltageProfileRequest { Dataset = "sn", HostFormula = "Sn", Ion = "Mg" }, C.Call()).ResponseAsync);
        await AssertField("host_formula", "Sn(", () =>
            Ec.GetVoltageProfileAsync(new GetVoltageProfileRequest { Dataset = "sn", HostFormula = "Sn(", Ion = "Li" }, C.Call()).ResponseAsync);
        await AssertField("second", "same phase", () => Ec.GetReactionProfileAsync(new GetReactionProfileRequest
        {
            Dataset = "f", First = new CompoundRef { EntryId = "LiF" }, Second = new CompoundRef { Formula = "LiF" },
        }, C.Call()).ResponseAsync);
        await AssertField("first", "no compound", () => Ec.GetReactionProfileAsync(new GetReactionProfileRequest { Dataset = "f" }, C.Call()).ResponseAsync);
    }

    private static async Task AssertField(string field, string text, Func<Task> call)
    {
        var error = await Assert.ThrowsAsync<RpcException>(call);
        Assert.Equal(StatusCode.InvalidArgument, error.StatusCode);
        Assert.Contains(Data.Violations(error), v => v.Field == field);
        Assert.Contains(text, error.Status.Detail + string.Join(" ", Data.Violations(error).Select(v => v.Description)));
    }
}
