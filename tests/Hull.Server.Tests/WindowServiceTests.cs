using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>The window service over gRPC: answers that satisfy the dataset's own limits, and every listed bad input.</summary>
public sealed class WindowServiceTests : IAsyncLifetime
{
    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        await Data.CreateWithAsync(C, "d", [.. Data.LiCoO(), Data.Formation("LiAlO2", "LiAlO2", -2.3), Data.Formation("Al", "Al", 0)]);
        // Total energies with no pure-fluorine entry: fluorine has no elemental reference.
        await Data.CreateWithAsync(C, "t", Data.Total("Li", "Li", -1.9), Data.Total("LiF", "LiF", -10.0));
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private static GetStabilityWindowRequest Window(string dataset, CompoundRef compound) => new() { Dataset = dataset, Compound = compound };

    [Fact]
    public async Task Window_vertices_lie_on_the_compound_plane_and_within_every_limit()
    {
        var response = await C.Windows.GetStabilityWindowAsync(Window("d", new CompoundRef { Formula = "LiCoO2" }), C.Call());
        StabilityWindow w = response.Window;
        Assert.Equal("LiCoO2", w.EntryId);
        Assert.Equal(WindowKind.Full, w.Kind);
        Assert.Equal(2, w.Dimension);
        Assert.Equal(["Co", "Li", "O"], w.Elements);
        Assert.True(w.Vertices.Count >= 3);

        // The dataset's own numbers (eV/atom, Data.LiCoO): LiCoO2 at −1.8 per atom is −7.2 per formula unit.
        (double[] Amounts, double EvPerFormulaUnit)[] limits =
        [
            ([0, 2, 1], -6.0), ([1, 0, 1], -2.4), ([3, 0, 4], -9.1), ([1, 2, 3], -9.0), ([1, 0, 0], 0), ([0, 1, 0], 0), ([0, 0, 1], 0),
        ];
        foreach (WindowVertex v in w.Vertices)
        {
            double[] mu = [.. v.ChemicalPotentialsEv];
            Assert.Equal(-7.2, mu[0] + mu[1] + 2 * mu[2], 1e-9);
            foreach ((double[] a, double h) in limits) Assert.True(a.Zip(mu, (s, t) => s * t).Sum() <= h + 1e-9);
            Assert.True(v.LimitingPhaseIds.Count + v.ElementsAtReference.Count >= 2);
            Assert.Equal(-mu[1], Assert.Single(v.Voltages).VoltsAgainstMetal, 1e-12);
        }

        Assert.Equal(3, w.Extremes.Count);
        Assert.True(w.Size.MeasureInPlaneEvPowK > 0);
    }

    [Fact]
    public async Task Slices_and_dopant_limits_answer()
    {
        var slice = new SliceStabilityWindowRequest { Dataset = "d", Compound = new CompoundRef { EntryId = "LiCoO2" } };
        slice.FixedPotentials.Add(new FixedPotential { Element = "O", ChemicalPotentialEv = -30 });
        SliceStabilityWindowResponse missed = await C.Windows.SliceStabilityWindowAsync(slice, C.Call());
        Assert.True(missed.Misses);
        Assert.True(missed.DistanceEv > 0);
        Assert.Equal(3, missed.NearestPointEv.Count);

        var dopants = new GetDopantLimitsRequest { Dataset = "d", Compound = new CompoundRef { EntryId = "LiCoO2" } };
        dopants.Dopants.Add("Al");
        GetDopantLimitsResponse limits = await C.Windows.GetDopantLimitsAsync(dopants, C.Call());
        DopantLimit al = Assert.Single(limits.Limits);
        Assert.Equal(["Co", "Li", "O", "Al"], al.ExtendedElements);
        Assert.Equal(["LiAlO2"], al.OverallLimitingPhaseIds);
        Assert.Equal(limits.Host.Vertices.Count, al.PerHostVertex.Count);
        Assert.All(al.PerHostVertex, v => Assert.True(v.MaxDopantPotentialEv <= al.OverallMaxEv + 1e-9));
    }

    public static TheoryData<string, StatusCode, string, string> BadQuestions() => new()
    {
        { "no-compound", StatusCode.InvalidArgument, "compound", "no compound given" },
        { "unknown-id", StatusCode.NotFound, "compound.entry_id", "is not in dataset 'd'" },
        { "bad-formula", StatusCode.InvalidArgument, "compound.formula", "character" },
        { "absent-formula", StatusCode.NotFound, "compound.formula", "no entry of composition" },
        { "dopant-in-host", StatusCode.InvalidArgument, "dopants[0]", "already an element of the host" },
        { "dopant-without-phase", StatusCode.NotFound, "dopants[0]", "has no phase in the data" },
        { "positive-slice", StatusCode.InvalidArgument, "fixed_potentials[0]", "above the element's reference" },
        { "missing-reference", StatusCode.FailedPrecondition, "", "missing elemental reference for F" },
    };

    [Theory]
    [MemberData(nameof(BadQuestions))]
    public async Task Bad_questions_name_what_and_where(string question, StatusCode code, string field, string text)
    {
        var host = new CompoundRef { EntryId = "LiCoO2" };
        Task call = question switch
        {
            "no-compound" => C.Windows.GetStabilityWindowAsync(new GetStabilityWindowRequest { Dataset = "d" }, C.Call()).ResponseAsync,
            "unknown-id" => C.Windows.GetStabilityWindowAsync(Window("d", new CompoundRef { EntryId = "nope" }), C.Call()).ResponseAsync,
            "bad-formula" => C.Windows.GetStabilityWindowAsync(Window("d", new CompoundRef { Formula = "LiXx2" }), C.Call()).ResponseAsync,
            "absent-formula" => C.Windows.GetStabilityWindowAsync(Window("d", new CompoundRef { Formula = "LiCo2O5" }), C.Call()).ResponseAsync,
            "dopant-in-host" => C.Windows.GetDopantLimitsAsync(new GetDopantLimitsRequest { Dataset = "d", Compound = host, Dopants = { "Co" } }, C.Call()).ResponseAsync,
            "dopant-without-phase" => C.Windows.GetDopantLimitsAsync(new GetDopantLimitsRequest { Dataset = "d", Compound = host, Dopants = { "Mg" } }, C.Call()).ResponseAsync,
            "positive-slice" => C.Windows.SliceStabilityWindowAsync(new SliceStabilityWindowRequest
            {
                Dataset = "d", Compound = host, FixedPotentials = { new FixedPotential { Element = "O", ChemicalPotentialEv = 0.2 } },
            }, C.Call()).ResponseAsync,
            _ => C.Windows.GetStabilityWindowAsync(Window("t", new CompoundRef { EntryId = "LiF" }), C.Call()).ResponseAsync,
        };
        RpcException e = await Assert.ThrowsAsync<RpcException>(() => call);
        Assert.Equal(code, e.StatusCode);
        Assert.Contains(text, e.Status.Detail);
        if (field.Length > 0) Assert.Equal(field, Assert.Single(Data.Violations(e)).Field);
    }
}
