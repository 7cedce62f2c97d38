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

    [Fact]
    public async Task A_computed_oxygen_molecule_is_measured_from_the_datasets_reference_in_vertices_and_slices()
    {
        // The LiCoO2 set above in total energies per formula unit (invented): Li −1.9, Co −7.1, O −4.95 eV/atom (the
        // pure-O entry, O2 at −9.9 eV per molecule), each compound's total = Σ references + its formation energy × atoms.
        await Data.CreateWithAsync(C, "t",
            Data.Total("Li", "Li", -1.9), Data.Total("Co", "Co", -7.1), Data.Total("O2", "O2", -9.9),
            Data.Total("Li2O", "Li2O", -14.75), Data.Total("CoO", "CoO", -14.45), Data.Total("Co3O4", "Co3O4", -50.2),
            Data.Total("LiCoO2", "LiCoO2", -26.1), Data.Total("Li2CoO3", "Li2CoO3", -34.75));

        // A computed O2 (invented: −9.86 eV at rest, 0.098 eV zero-point energy) against E_ref(O) = −4.95 eV/atom, with
        // the NIST-JANAF O2 rows at 1000 K above and H°(298.15 K) − H°(0) = 8.683 kJ/mol (4th ed., 1998 — from memory):
        // Δμ_O(1000 K, p) = ½(−9.86 + 0.098) + 4.95 + ½(22.703 + 8.683 − 243.578) / 96.4853321233 + ½ k_B·1000·ln p
        //                 = −1.030608 eV + ½ k_B·1000·ln p.
        double standard = (0.5 * (-9.86 + 0.098)) + 4.95 + ((22.703 + 8.683 - 243.578) / 96.4853321233 / 2);
        Assert.Equal(-1.030608, standard, 6);
        var settings = new WindowSettings { GasAtTemperatureK = 1000, GasMolecules = { new WindowGasMolecule { Gas = "O2", MoleculeEnergyEv = -9.86, ZeroPointEnergyEv = 0.098 } } };
        var compound = new CompoundRef { EntryId = "LiCoO2" };

        GetStabilityWindowResponse window = await C.Windows.GetStabilityWindowAsync(
            new GetStabilityWindowRequest { Dataset = "t", Compound = compound, Settings = settings }, C.Call());
        Assert.NotEmpty(window.Window.Vertices);
        foreach (WindowVertex v in window.Window.Vertices)
        {
            GasCondition c = Assert.Single(v.GasConditions);
            Assert.True(c.ComputedMolecule);
            double hand = 2 * (v.ChemicalPotentialsEv[2] - standard) / (Boltzmann * 1000 * Math.Log(10));
            Assert.Equal(hand, c.Log10PressureBar, 2 * FitToleranceEv / (Boltzmann * 1000 * Math.Log(10)));
        }

        // O2 in air at 1000 K fixes Δμ_O through the same molecule, and the slice's vertices read back as 0.21 bar.
        SliceStabilityWindowResponse slice = await C.Windows.SliceStabilityWindowAsync(new SliceStabilityWindowRequest
        {
            Dataset = "t", Compound = compound, Settings = settings,
            FixedGases = { new GasPotential { Gas = "O2", TemperatureK = 1000, PressureBar = 0.21 } },
        }, C.Call());
        Assert.Equal(standard + (Boltzmann * 1000 * Math.Log(0.21) / 2), Assert.Single(slice.FixedPotentialsUsed).ChemicalPotentialEv, FitToleranceEv);
        Assert.All(slice.Slice.Vertices, v => Assert.Equal(Math.Log10(0.21), Assert.Single(v.GasConditions).Log10PressureBar, 9));

        // A formation-energy dataset has no total-energy reference for O to measure the molecule from.
        RpcException e = await Assert.ThrowsAsync<RpcException>(() => C.Windows.GetStabilityWindowAsync(
            new GetStabilityWindowRequest { Dataset = "d", Compound = compound, Settings = settings }, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.FailedPrecondition, e.StatusCode);
        Assert.Contains("settings.gas_molecules[0]", e.Status.Detail);
        Assert.Contains("reference for O", e.Status.Detail);
    }

    public static TheoryData<string, string, string> BadMolecules() => new()
    {
        { "Mg", "settings.gas_molecules[0].gas", "not a gas with tables here" },
        { "N2", "settings.gas_molecules[0].gas", "N is not an element of this answer" },
        { "nan", "settings.gas_molecules[0].molecule_energy_ev", "not finite" },
        { "negative-zpe", "settings.gas_molecules[0].zero_point_energy_ev", "must not be negative" },
        { "twice", "settings.gas_molecules[1].gas", "given twice" },
    };

    [Theory]
    [MemberData(nameof(BadMolecules))]
    public async Task Bad_computed_molecules_name_their_field(string question, string field, string text)
    {
        var molecule = new WindowGasMolecule { Gas = "O2", MoleculeEnergyEv = -9.86, ZeroPointEnergyEv = 0.098 };
        var settings = new WindowSettings { GasAtTemperatureK = 1000, GasMolecules = { molecule } };
        switch (question)
        {
            case "nan": molecule.MoleculeEnergyEv = double.NaN; break;
            case "negative-zpe": molecule.ZeroPointEnergyEv = -0.1; break;
            case "twice": settings.GasMolecules.Add(molecule.Clone()); break;
            default: molecule.Gas = question; break;
        }

        RpcException e = await Assert.ThrowsAsync<RpcException>(() => C.Windows.GetStabilityWindowAsync(
            new GetStabilityWindowRequest { Dataset = "d", Compound = new CompoundRef { EntryId = "LiCoO2" }, Settings = settings }, C.Call()).ResponseAsync);
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        Assert.Contains(text, e.Status.Detail);
        Assert.Equal(field, Assert.Single(Data.Violations(e)).Field);
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
