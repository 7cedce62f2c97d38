using Grpc.Core;
using Hull.Core.Thermo.Solids;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Mapping;
using Hull.Server.Tests.Support;
using DatasetStore = Hull.Store.DatasetStore;
using StoredFreeEnergyAnchorTokens = Hull.Store.StoredFreeEnergyAnchorTokens;
using WireAnchor = Hull.Protos.V1.FreeEnergyAnchor;
using WireModel = Hull.Protos.V1.EntryTemperatureModel;
using WirePoint = Hull.Protos.V1.EntryFreeEnergyRow;

namespace Hull.Server.Tests;

/// <summary>
/// Temperature models over gRPC: ImportEntries and import sessions store them with their entries, ExportEntries
/// returns them as given in every version, and every bad model is refused with its field and nothing written.
/// </summary>
public sealed class TemperatureModelServiceTests : IAsyncLifetime
{
    // NBS Tables of Chemical Thermodynamic Properties (Wagman et al., 1982), S°(298.15 K) — from memory:
    // Ag2O(s) 121.3, Ag(s) 42.55, CuO(s) 42.63 J/(mol K); ΔfH°(Ag2O) = −31.05 kJ/mol = −0.3218 eV per formula unit.
    private const double SilverOxideEntropy = 121.3;
    private const double SilverEntropy = 42.55;
    private const double CopperOxideEntropy = 42.63;

    private RunningServer _server = null!;

    private Clients C => _server.Clients;

    public async Task InitializeAsync()
    {
        _server = await RunningServer.StartAsync();
        await Data.CreateWithAsync(C, "silver");
    }

    public async Task DisposeAsync() => await _server.DisposeAsync();

    private static Entry WithEntropy(Entry entry, double entropy, string formula = "")
    {
        entry.TemperatureModel = new WireModel { Formula = formula, StandardEntropyJPerMolK = entropy };
        return entry;
    }

    private static Entry WithTable(Entry entry, WireAnchor anchor, params (double T, double G)[] points)
    {
        var table = new EntryFreeEnergyTable { Anchor = anchor };
        table.Rows.AddRange(points.Select(p => new WirePoint { TemperatureK = p.T, FreeEnergyAboveAnchorEv = p.G }));
        entry.TemperatureModel = new WireModel { FreeEnergyTable = table };
        return entry;
    }

    // G(T) − H°(298.15 K) = −T S° of Ag2O in the Ellingham approximation, −T × 121.3 / 96485.33212 eV, by hand.
    private static Entry SilverOxideTable() => WithTable(Data.Total("ag2o", "Ag2O", -0.3218), WireAnchor.Fitted298K,
        (300, -0.377156), (500, -0.628594), (700, -0.880031));

    private async Task<List<Entry>> ExportAsync(long version = 0)
    {
        var entries = new List<Entry>();
        using var call = C.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = "silver", Version = version }, C.Call());
        await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync()) entries.AddRange(page.Entries);
        return entries;
    }

    private async Task ImportAsync(DuplicatePolicy policy, params Entry[] entries) =>
        await C.Datasets.ImportEntriesAsync(Data.Batch("silver", policy, entries), C.Call());

    [Fact]
    public async Task Models_are_exported_as_imported_in_every_version()
    {
        Entry oxide = WithEntropy(Data.Total("ag2o", "Ag2O", -0.3218), SilverOxideEntropy, "Ag2O");
        Entry silver = WithEntropy(Data.Formation("ag", "Ag", 0), SilverEntropy);
        Entry oxygen = Data.Formation("o2", "O2", 0);
        await ImportAsync(DuplicatePolicy.Reject, oxide, silver, oxygen);
        await ImportAsync(DuplicatePolicy.Replace, SilverOxideTable());

        Assert.Equal([silver, oxide, oxygen], await ExportAsync(1));
        Assert.Equal([silver, SilverOxideTable(), oxygen], await ExportAsync(2));
        Assert.Equal(WireModel.KindOneofCase.FreeEnergyTable, (await ExportAsync())[1].TemperatureModel.KindCase);

        // The server's snapshot of a version hands Core's models to the science, parallel to the entries.
        using DatasetStore store = DatasetStore.Open(_server.DataDirectory);
        VersionSnapshot v1 = VersionSnapshot.Load(store, new VersionRef("silver", 1, store.GetFingerprint("silver", 1)));
        Assert.Equal(["ag", "ag2o", "o2"], v1.Entries.Select(e => e.Id));
        var silverModel = Assert.IsType<StandardEntropyModel>(v1.TemperatureModels[0]!.Model);
        Assert.Equal((SilverEntropy, "Ag"), (silverModel.EntropyJPerMolK, silverModel.Formula.Formula));
        Assert.Null(v1.TemperatureModels[0]!.TableAnchor);
        Assert.Equal(SilverOxideEntropy, Assert.IsType<StandardEntropyModel>(v1.TemperatureModels[1]!.Model).EntropyJPerMolK);
        Assert.Null(v1.TemperatureModels[2]);
        Assert.Equal(v1.TemperatureModels[1], v1.TemperatureModelOf("ag2o"));
        Assert.Null(v1.TemperatureModelOf("o2"));
        Assert.Null(v1.TemperatureModelOf("no-such-entry"));
        Assert.Equal(2, v1.StoredModelSet.Count);
        Assert.Same(v1.TemperatureModels[1]!.Model, v1.StoredModelSet.For(v1.Entries[1]));
        Assert.Null(v1.StoredModelSet.For(v1.Entries[2]));

        VersionSnapshot v2 = VersionSnapshot.Load(store, new VersionRef("silver", 2, store.GetFingerprint("silver", 2)));
        Assert.Equal(Core.Thermo.Solids.FreeEnergyAnchor.Fitted298K, v2.TemperatureModels[1]!.TableAnchor);
        var table = Assert.IsType<TabulatedFreeEnergyModel>(v2.TemperatureModels[1]!.Model);
        Assert.Equal([300.0, 500.0, 700.0], table.Points.Select(p => p.TemperatureK));
        Assert.Equal((300.0, 700.0), table.TemperatureRangeK);
        // Linear between rows, per atom of Ag2O: (−0.377156 − 0.628594) / 2 / 3 atoms at 400 K, by hand.
        Assert.Equal((-0.377156 - 0.628594) / 2 / 3, table.FreeEnergyAboveAnchorEvPerAtom(400, "ag2o-table"), 12);
    }

    [Fact]
    public async Task An_import_session_carries_models_into_its_version()
    {
        ImportSession session = await C.Datasets.BeginImportAsync(
            new BeginImportRequest { Dataset = "silver", DuplicatePolicy = DuplicatePolicy.Reject }, C.Call());
        await C.Datasets.StageEntriesAsync(new StageEntriesRequest { SessionId = session.SessionId, Entries = { SilverOxideTable() } }, C.Call());
        Entry copperOxide = WithEntropy(Data.Total("cuo", "CuO", -1.63), CopperOxideEntropy, "OCu");
        await C.Datasets.StageEntriesAsync(new StageEntriesRequest { SessionId = session.SessionId, Entries = { copperOxide } }, C.Call());
        await C.Datasets.CommitImportAsync(new CommitImportRequest { SessionId = session.SessionId }, C.Call());

        Assert.Equal([SilverOxideTable(), copperOxide], await ExportAsync());
    }

    public static TheoryData<string, Entry, string, string> BadModels() => new()
    {
        { "negative entropy", WithEntropy(Data.Formation("x", "Ag2O", -0.1), -1.0), "entries[1].temperature_model.standard_entropy_j_per_mol_k",
            "The standard entropy of Ag2O must be finite and not negative; got -1 J/(mol K)" },
        { "NaN entropy", WithEntropy(Data.Formation("x", "Ag2O", -0.1), double.NaN), "entries[1].temperature_model.standard_entropy_j_per_mol_k", "got NaN" },
        { "one row", WithTable(Data.Formation("x", "Ag2O", -0.1), WireAnchor.Fitted298K, (300, -0.38)),
            "entries[1].temperature_model.free_energy_table.rows", "needs at least two rows" },
        { "unsorted", WithTable(Data.Formation("x", "Ag2O", -0.1), WireAnchor.Fitted298K, (300, -0.38), (700, -0.88), (500, -0.63)),
            "entries[1].temperature_model.free_energy_table.rows", "Row 2 of the tabulated free energy of Ag2O is at 500 K, not above row 1 (700 K): temperatures must rise" },
        { "repeated", WithTable(Data.Formation("x", "Ag2O", -0.1), WireAnchor.Fitted298K, (300, -0.38), (300, -0.38)),
            "entries[1].temperature_model.free_energy_table.rows", "Row 1 of the tabulated free energy of Ag2O is at 300 K, not above row 0 (300 K)" },
        { "zero kelvin", WithTable(Data.Formation("x", "Ag2O", -0.1), WireAnchor.Computed0K, (0, 0.1), (300, -0.38)),
            "entries[1].temperature_model.free_energy_table.rows", "Row 0 of the tabulated free energy of Ag2O is at 0 K; temperatures must be above 0 K" },
        { "negative kelvin", WithTable(Data.Formation("x", "Ag2O", -0.1), WireAnchor.Computed0K, (-5, 0.1), (300, -0.38)),
            "entries[1].temperature_model.free_energy_table.rows", "needs a finite temperature" },
        { "no anchor", WithTable(Data.Formation("x", "Ag2O", -0.1), WireAnchor.Unspecified, (300, -0.38), (500, -0.63)),
            "entries[1].temperature_model.free_energy_table.anchor", "anchor is not given" },
        { "no kind", new Entry(Data.Formation("x", "Ag2O", -0.1)) { TemperatureModel = new WireModel { Formula = "Ag2O" } },
            "entries[1].temperature_model", "neither a standard entropy nor a free-energy table" },
        { "other formula", WithEntropy(Data.Formation("x", "Ag2O", -0.1), SilverOxideEntropy, "AgO"),
            "entries[1].temperature_model.formula", "Entry 'x' is Ag2O, but its temperature model (S° = 121.3 J/(mol K) per AgO) is for AgO" },
        { "unparsable formula", WithEntropy(Data.Formation("x", "Ag2O", -0.1), SilverOxideEntropy, "Ag2Q"),
            "entries[1].temperature_model.formula", "the temperature model's formula does not parse" },
    };

    [Fact]
    public async Task A_model_given_per_formula_unit_of_a_multiple_is_kept_as_given()
    {
        // The numbers are per formula unit of the model's formula: 2 × 121.3 J/(mol K) per Ag4O2 is Ag2O's S°.
        Entry doubled = WithEntropy(Data.Total("ag2o", "Ag2O", -0.3218), 2 * SilverOxideEntropy, "Ag4O2");
        await ImportAsync(DuplicatePolicy.Reject, doubled);
        Assert.Equal([doubled], await ExportAsync());
        using DatasetStore store = DatasetStore.Open(_server.DataDirectory);
        VersionSnapshot v1 = VersionSnapshot.Load(store, new VersionRef("silver", 1, store.GetFingerprint("silver", 1)));
        var model = Assert.IsType<StandardEntropyModel>(v1.TemperatureModels[0]!.Model);
        Assert.Equal("Ag4O2", model.Formula.Formula);
        var single = new StandardEntropyModel(Core.Chemistry.Composition.Parse("Ag2O"), SilverOxideEntropy);
        Assert.Equal(single.EntropyEvPerKPerAtom, model.EntropyEvPerKPerAtom, 15);
    }

    [Theory]
    [MemberData(nameof(BadModels))]
    public async Task A_bad_model_is_refused_with_its_field_and_nothing_is_written(string what, Entry bad, string field, string message)
    {
        await ImportAsync(DuplicatePolicy.Reject, WithEntropy(Data.Formation("ag", "Ag", 0), SilverEntropy));
        var e = await Assert.ThrowsAsync<RpcException>(async () =>
            await ImportAsync(DuplicatePolicy.Reject, Data.Formation("ok", "O2", 0), bad));
        Assert.Equal(StatusCode.InvalidArgument, e.StatusCode);
        var violation = Assert.Single(Data.Violations(e));
        Assert.True(field == violation.Field, $"{what}: {violation.Field}");
        Assert.Contains(message, violation.Description);

        var staged = await Assert.ThrowsAsync<RpcException>(async () =>
        {
            ImportSession session = await C.Datasets.BeginImportAsync(
                new BeginImportRequest { Dataset = "silver", DuplicatePolicy = DuplicatePolicy.Reject }, C.Call());
            await C.Datasets.StageEntriesAsync(new StageEntriesRequest { SessionId = session.SessionId, Entries = { Data.Formation("ok", "O2", 0), bad } }, C.Call());
        });
        Assert.Equal(field, Assert.Single(Data.Violations(staged)).Field);

        Assert.Equal(1, (await C.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = "silver" }, C.Call())).Dataset.LatestVersion);
        Assert.Equal([WithEntropy(Data.Formation("ag", "Ag", 0), SilverEntropy)], await ExportAsync());
    }

    [Fact]
    public void The_anchor_has_one_meaning_and_one_spelling_in_core_store_and_contract()
    {
        Assert.Equal(StoredFreeEnergyAnchorTokens.All, FreeEnergyAnchorTokens.All.Select(FreeEnergyAnchorTokens.ToToken));
        var defined = EntriesReflection.Descriptor.EnumTypes.Single(e => e.Name == "FreeEnergyAnchor").Values.Where(v => v.Number != 0).ToList();
        Assert.Equal(FreeEnergyAnchorTokens.All.Count, defined.Count);
        foreach (var value in defined)
        {
            Assert.True(TemperatureModelMapping.TryFromWire((WireAnchor)value.Number, out Core.Thermo.Solids.FreeEnergyAnchor anchor), value.Name);
            Assert.Equal(value.Name["FREE_ENERGY_ANCHOR_".Length..].ToLowerInvariant(), FreeEnergyAnchorTokens.ToToken(anchor));
            Assert.Equal((WireAnchor)value.Number, TemperatureModelMapping.ToWire(anchor));
        }

        Assert.False(TemperatureModelMapping.TryFromWire(WireAnchor.Unspecified, out _));
        Assert.False(TemperatureModelMapping.TryFromWire((WireAnchor)9, out _));
    }
}
