using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Tests.Support;

namespace Hull.Server.Tests;

/// <summary>
/// The thermo service over gRPC on handbook oxides as formation-energy datasets (NBS Tables of Chemical
/// Thermodynamic Properties, 1982, ΔfH° and S° — from memory; the same values as Hull.Core.Tests'
/// OxideDecompositionTemperatureTests), and bad input answered INVALID_ARGUMENT naming the field.
/// </summary>
public sealed class ThermoServiceTests : IAsyncLifetime
{
    // e N_A in kJ/mol per eV (CODATA 2018) — from memory
    private const double KilojoulesPerMolPerEv = 96.48533212;

    // CODATA 2018 R in J/(mol K) — from memory
    private const double GasConstant = 8.314462618;

    private RunningServer _server = null!;

    private ThermoService.ThermoServiceClient Thermo => new(_server.Clients.Channel);

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        // NBS Tables (1982): Ag2O ΔfH° = −31.05 kJ/mol; CuO −157.3; Cu2O −168.6 — from memory (per atom here)
        await Data.CreateWithAsync(C, "oxides",
            Data.Formation("Ag", "Ag", 0), Data.Formation("Ag2O", "Ag2O", -31.05 / KilojoulesPerMolPerEv / 3),
            Data.Formation("Cu", "Cu", 0), Data.Formation("CuO", "CuO", -157.3 / KilojoulesPerMolPerEv / 2),
            Data.Formation("Cu2O", "Cu2O", -168.6 / KilojoulesPerMolPerEv / 3), Data.Formation("O", "O", 0));
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private static ThermoSolidModel Entropy(string id, string formula, double s) =>
        new() { EntryId = id, Model = new EntryTemperatureModel { Formula = formula, StandardEntropyJPerMolK = s }, Source = "NBS Tables (1982)" };

    // NBS Tables (1982) S° in J/(mol K): Ag 42.55, Ag2O 121.3, Cu 33.15, CuO 42.63, Cu2O 93.14, O2 205.138 — from memory
    private static IEnumerable<ThermoSolidModel> Models() =>
    [
        Entropy("Ag", "Ag", 42.55), Entropy("Ag2O", "Ag2O", 121.3), Entropy("Cu", "Cu", 33.15),
        Entropy("CuO", "CuO", 42.63), Entropy("Cu2O", "Cu2O", 93.14),
    ];

    private static ThermoGasConditions Oxygen(double bar) => new() { Gas = "O2", PressureBar = bar, StandardEntropyJPerMolK = 205.138 };

    [Theory]
    // T_d = 31050 / (66.369 − ½ R ln p): 467.84 K at 1 bar, 426.18 K at 0.21 bar, by hand
    [InlineData(1.0, 467.84)]
    [InlineData(0.21, 426.18)]
    public async Task Silver_oxide_decomposes_at_the_closed_form_temperature(double bar, double expectedK)
    {
        var request = new FindDecompositionTemperaturesRequest
        {
            Dataset = "oxides", Phase = new CompoundRef { Formula = "Ag2O" }, FromK = 300, ToK = 900,
            Gas = Oxygen(bar), Treatment = ThermoTreatment.Ellingham,
        };
        request.Models.AddRange(Models());
        FindDecompositionTemperaturesResponse response = await Thermo.FindDecompositionTemperaturesAsync(request, C.Call());
        ThermoCrossing crossing = Assert.Single(response.Crossings);
        Assert.Equal(31050 / (66.369 - (0.5 * GasConstant * Math.Log(bar))), crossing.TemperatureK, 1e-6);
        Assert.Equal(expectedK, crossing.TemperatureK, 0.01);
        Assert.Equal(ThermoCrossingDirection.DecomposesAbove, crossing.Direction);
        Assert.Equal("Ag", Assert.Single(crossing.Competitors.Products).PhaseId);
        Assert.Equal(0.5, crossing.GasReleasedMoleculesPerFormulaUnit, 12);
        Assert.Equal("Ag-O", response.ChemicalSystem);
        Assert.Equal("request", response.ModelsFrom);
        Assert.Contains("fire hazard", response.Caution);
        Assert.Equal("oxides", response.Used.Dataset);
        // The Cu entries are outside Ag-O: nothing unmodelled there.
        Assert.Empty(response.UnmodelledEntryIds);
    }

    [Fact]
    public async Task Cuprous_oxide_crosses_twice_and_the_hull_at_conditions_agrees()
    {
        var request = new FindDecompositionTemperaturesRequest
        {
            Dataset = "oxides", Phase = new CompoundRef { EntryId = "Cu2O" }, FromK = 300, ToK = 2500,
            Gas = Oxygen(1.0), Treatment = ThermoTreatment.Ellingham,
        };
        request.Models.AddRange(Models());
        FindDecompositionTemperaturesResponse response = await Thermo.FindDecompositionTemperaturesAsync(request, C.Call());
        // 2 CuO → Cu2O + ½ O2 at 146000/110.449 = 1321.88 K; Cu2O → 2 Cu + ½ O2 at 168600/75.729 = 2226.36 K, by hand
        Assert.Equal([1321.88, 2226.36], response.Crossings.Select(c => Math.Round(c.TemperatureK, 2)));
        Assert.Equal([ThermoCrossingDirection.FormsAbove, ThermoCrossingDirection.DecomposesAbove], response.Crossings.Select(c => c.Direction));
        Assert.Single(response.Breakpoints);

        var hull = new GetHullAtConditionsRequest
        {
            Dataset = "oxides", ChemicalSystem = "Cu-O", TemperatureK = 1500, Gas = Oxygen(1.0), Treatment = ThermoTreatment.Ellingham,
        };
        hull.Models.AddRange(Models());
        GetHullAtConditionsResponse at1500 = await Thermo.GetHullAtConditionsAsync(hull, C.Call());
        Assert.Equal(["Cu2O"], at1500.StablePhaseIds);
        Assert.Equal(["O"], at1500.ReservoirEntryIds);
        Assert.Equal(["Cu"], at1500.Components);
        Assert.Equal("Cu", Assert.Single(at1500.References).EntryId);
        Assert.Equal("S° = 93.14 J/(mol K) per Cu2O", at1500.Entries.Single(e => e.EntryId == "Cu2O").Model);
        // Δμ_O = ½ (−T S°_O2) at 1 bar in the Ellingham approximation, by hand
        Assert.Equal(-0.5 * 1500 * 205.138 / 1000 / KilojoulesPerMolPerEv, at1500.Gas.DeltaMuEvPerAtom, 1e-9);
    }

    [Fact]
    public async Task Stored_models_answer_when_the_request_gives_none_and_inline_ones_win()
    {
        Entry Modelled(Entry entry, double s)
        {
            entry.TemperatureModel = new EntryTemperatureModel { StandardEntropyJPerMolK = s };
            return entry;
        }

        // NBS Tables (1982), as above — from memory
        await Data.CreateWithAsync(C, "stored",
            Modelled(Data.Formation("Ag", "Ag", 0), 42.55), Data.Formation("O", "O", 0),
            Modelled(Data.Formation("Ag2O", "Ag2O", -31.05 / KilojoulesPerMolPerEv / 3), 121.3));
        var request = new FindDecompositionTemperaturesRequest
        {
            Dataset = "stored", Phase = new CompoundRef { EntryId = "Ag2O" }, FromK = 300, ToK = 900, Gas = Oxygen(1.0), Treatment = ThermoTreatment.Ellingham,
        };
        FindDecompositionTemperaturesResponse stored = await Thermo.FindDecompositionTemperaturesAsync(request, C.Call());
        Assert.Equal("stored", stored.ModelsFrom);
        Assert.Equal(31050 / 66.369, Assert.Single(stored.Crossings).TemperatureK, 1e-6);

        // An inline S° for Ag2O over the stored one: 31050 / (2 × 42.55 + ½ × 205.138 − 131.3) = 550.83 K, by hand
        request.Models.Add(Entropy("Ag2O", "Ag2O", 131.3));
        FindDecompositionTemperaturesResponse both = await Thermo.FindDecompositionTemperaturesAsync(request, C.Call());
        Assert.Equal("request and stored", both.ModelsFrom);
        Assert.Equal(31050 / 56.369, Assert.Single(both.Crossings).TemperatureK, 1e-6);
    }

    [Fact]
    public async Task The_gas_potential_converts_both_ways()
    {
        var request = new GetGasPotentialRequest
        {
            Dataset = "oxides", Gas = new ThermoGasConditions { Gas = "O2", PressureBar = 0.21 }, TemperatureK = 1000, DeltaMuEvPerAtom = -1.2,
        };
        GetGasPotentialResponse response = await Thermo.GetGasPotentialAsync(request, C.Call());
        Assert.Equal(298.15, response.AnchorTemperatureK);
        // NIST-JANAF Thermochemical Tables, 4th ed. (1998), O2 at 1000 K: H − H(298.15) = 22.703 kJ/mol, S° = 243.578 J/(mol K) — from memory
        double expected = 0.5 * ((22.703 - (1000 * 0.243578)) / KilojoulesPerMolPerEv + (8.617333262e-5 * 1000 * Math.Log(0.21)));
        Assert.Equal(expected, response.Point.DeltaMuEvPerAtom, 1e-4);
        Assert.Equal(2 * response.Point.MuEvPerAtom, response.Point.MuEvPerMolecule, 12);
        Assert.True(response.HasConversion);
        // Round trip: the pressure at 1000 K for Δμ = −1.2, then Δμ at that pressure.
        var back = await Thermo.GetGasPotentialAsync(new GetGasPotentialRequest
        {
            Dataset = "oxides", Gas = new ThermoGasConditions { Gas = "O2", PressureBar = response.PressureForDeltaMuBar }, TemperatureK = 1000,
        }, C.Call());
        Assert.Equal(-1.2, back.Point.DeltaMuEvPerAtom, 1e-9);
        Assert.True(response.TemperatureFound);
        var atT = await Thermo.GetGasPotentialAsync(new GetGasPotentialRequest
        {
            Dataset = "oxides", Gas = new ThermoGasConditions { Gas = "O2", PressureBar = 0.21 }, TemperatureK = response.TemperatureForDeltaMuK,
        }, C.Call());
        Assert.Equal(-1.2, atT.Point.DeltaMuEvPerAtom, 1e-9);
    }

    [Fact]
    public async Task The_figure_is_drawn_with_every_crossing()
    {
        var request = new DrawTemperatureFigureRequest
        {
            Dataset = "oxides", FromK = 300, ToK = 2500, Gas = Oxygen(1.0), Treatment = ThermoTreatment.Ellingham,
        };
        request.Phases.Add(new CompoundRef { EntryId = "CuO" });
        request.Phases.Add(new CompoundRef { EntryId = "Cu2O" });
        request.Models.AddRange(Models());
        DrawTemperatureFigureResponse response = await Thermo.DrawTemperatureFigureAsync(request, C.Call());
        Assert.Contains("<svg", response.Svg);
        Assert.Equal(3, response.Svg.Split("data-kind=\"crossing\"").Length - 1);
        Assert.Equal(2, response.Phases.Count);
    }

    public static TheoryData<string, string> BadRequests => new()
    {
        { "gas", "gas.gas" },
        { "pressure", "gas.pressure_bar" },
        { "temperature", "from_k" },
        { "formula", "models[1].model.formula" },
        { "unknown-entry", "models[0].entry_id" },
        { "no-element-model", "models" },
    };

    [Theory]
    [MemberData(nameof(BadRequests))]
    public async Task Bad_input_is_refused_naming_the_field(string what, string field)
    {
        var request = new FindDecompositionTemperaturesRequest
        {
            Dataset = "oxides", Phase = new CompoundRef { EntryId = "Ag2O" }, FromK = 300, ToK = 900,
            Gas = Oxygen(1.0), Treatment = ThermoTreatment.TabulatedGas,
        };
        request.Models.AddRange(Models());
        switch (what)
        {
            case "gas": request.Gas.Gas = "Ar"; break;
            case "pressure": request.Gas.PressureBar = -1; break;
            case "temperature": request.FromK = 50; break;
            case "formula": request.Models[1].Model.Formula = "AgO"; break;
            case "unknown-entry": request.Models[0].EntryId = "nope"; break;
            case "no-element-model": request.Models.RemoveAt(0); break;
        }

        RpcException e = await Assert.ThrowsAsync<RpcException>(() => Thermo.FindDecompositionTemperaturesAsync(request, C.Call()).ResponseAsync);
        Assert.Equal(what == "unknown-entry" ? StatusCode.NotFound : StatusCode.InvalidArgument, e.StatusCode);
        if (what != "unknown-entry") Assert.Equal(field, Assert.Single(Data.Violations(e)).Field);
    }
}
