using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// Gas elements in the window calls over gRPC: a slice fixed by O2 at (T, p) and vertices shown as pressures, against a
/// hand computation from the NIST-JANAF O2 table; bad gas conditions name their field.
/// </summary>
public sealed class WindowGasServiceTests : IAsyncLifetime
{
    // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 at 1000 K: H° − H°(298.15 K) = 22.703 kJ/mol,
    // S° = 243.578 J/(mol K) — from memory. CODATA 2018 k_B and e N_A. With the dataset's references fitted:
    // Δμ_O(1000 K, p) = [(22.703 − 243.578) / 96.4853321233 + k_B·1000·ln p] / 2.
    private const double Boltzmann = 8.617333262e-5;
    private static readonly double StandardDeltaMuO = (22.703 - 243.578) / 96.4853321233 / 2;

    // The Shomate fit reproduces the table to a few J/mol: a few 1e-5 eV per atom.
    private const double FitToleranceEv = 1e-4;

    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        await Data.CreateWithAsync(C, "d", Data.LiCoO());
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    [Fact]
    public async Task A_slice_by_oxygen_in_air_and_vertices_as_pressures_match_the_janaf_hand_values()
    {
        var compound = new CompoundRef { EntryId = "LiCoO2" };
        var request = new SliceStabilityWindowRequest
        {
            Dataset = "d", Compound = compound, FixedGases = { new GasPotential { Gas = "O2", TemperatureK = 1000, PressureBar = 0.21 } },
            Settings = new WindowSettings { GasAtTemperatureK = 1000, GasAtPressureBar = 1 },
        };
        SliceStabilityWindowResponse slice = await C.Windows.SliceStabilityWindowAsync(request, C.Call());
        FixedPotential used = Assert.Single(slice.FixedPotentialsUsed);
        Assert.Equal("O", used.Element);
        Assert.Equal(StandardDeltaMuO + (Boltzmann * 1000 * Math.Log(0.21) / 2), used.ChemicalPotentialEv, FitToleranceEv);
        Assert.NotEmpty(slice.Slice.Vertices);
        foreach (WindowVertex v in slice.Slice.Vertices)
        {
            Assert.Equal(used.ChemicalPotentialEv, v.ChemicalPotentialsEv[2], 9);
            GasCondition c = Assert.Single(v.GasConditions);
            Assert.Equal(("O", "O2"), (c.Element, c.Gas));
            // At 1000 K the slice's own Δμ reads back as 0.21 bar; at 1 bar the same Δμ needs a higher temperature:
            // to first order ΔT = k_B·1000·ln(1/0.21) / S°(1000 K) = 0.13449 eV / (243.578 / 96485.33 eV/K) = 53.3 K
            // (the heat capacity's second-order term is well under 1 K here).
            Assert.Equal(Math.Log10(0.21), c.Log10PressureBar, 9);
            Assert.Equal("converged", c.TemperatureStatus);
            Assert.Equal(1000 + (Boltzmann * 1000 * Math.Log(1 / 0.21) / (243.578 / 96485.3321233)), c.TemperatureK, 1.0);
        }

        // Whole-window vertices at 1000 K: log10 p = [2Δμ_O − 2Δμ_O(1000 K, 1 bar)] / (k_B·1000·ln 10).
        GetStabilityWindowResponse window = await C.Windows.GetStabilityWindowAsync(
            new GetStabilityWindowRequest { Dataset = "d", Compound = compound, Settings = new WindowSettings { GasAtTemperatureK = 1000 } }, C.Call());
        foreach (WindowVertex v in window.Window.Vertices)
        {
            GasCondition c = Assert.Single(v.GasConditions);
            double hand = 2 * (v.ChemicalPotentialsEv[2] - StandardDeltaMuO) / (Boltzmann * 1000 * Math.Log(10));
            Assert.Equal(hand, c.Log10PressureBar, 2 * FitToleranceEv / (Boltzmann * 1000 * Math.Log(10)));
            Assert.False(c.HasTemperatureK);
        }
    }

    public static TheoryData<string, string, string> BadGases() => new()
    {
        { "unknown-gas", "fixed_gases[0].gas", "not a gas with tables here" },
        { "cold", "fixed_gases[0].temperature_k", "50" },
        { "no-pressure", "fixed_gases[0].pressure_bar", "positive number of bar" },
        { "twice", "fixed_gases[0].gas", "fixed twice" },
        { "display-pressure", "settings.gas_at_pressure_bar", "positive number of bar" },
        { "display-cold", "settings.gas_at_temperature_k", "10" },
    };

    [Theory]
    [MemberData(nameof(BadGases))]
    public async Task Bad_gas_conditions_name_their_field(string question, string field, string text)
    {
        var request = new SliceStabilityWindowRequest { Dataset = "d", Compound = new CompoundRef { EntryId = "LiCoO2" } };
        var air = new GasPotential { Gas = "O2", TemperatureK = 1000, PressureBar = 0.21 };
        switch (question)
        {
            case "unknown-gas": air.Gas = "O3"; break;
            case "cold": air.TemperatureK = 50; break;
            case "no-pressure": air.PressureBar = 0; break;
            case "twice": request.FixedPotentials.Add(new FixedPotential { Element = "O", ChemicalPotentialEv = -1 }); break;
            case "display-pressure": request.Settings = new WindowSettings { GasAtPressureBar = -1 }; break;
            default: request.Settings = new WindowSettings { GasAtTemperatureK = 10 }; break;
        }

        request.FixedGases.Add(air);
        RpcException e = await Assert.ThrowsAsync<RpcException>(() => C.Windows.SliceStabilityWindowAsync(request, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        Assert.Contains(text, e.Status.Detail);
        Assert.Equal(field, Assert.Single(Data.Violations(e)).Field);
    }
}
