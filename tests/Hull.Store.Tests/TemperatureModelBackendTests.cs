using Hull.Store.Tests.Backends;

namespace Hull.Store.Tests;

/// <summary>
/// Temperature models through every write and read path on every backend: batches, replaces, import sessions,
/// pages; and a version holding models has the same fingerprint whichever backend keeps it. (The file layout and
/// the migration of SQLite files are TemperatureModelStorageTests'.)
/// </summary>
public abstract class TemperatureModelBackendTests(StoreBackend backend) : IDisposable
{
    // The values of TemperatureModelStorageTests (S° of Ag2O from NBS 1982, from memory; its table worked by hand from it);
    // here only their exact round trip matters.
    private static readonly StoredTemperatureModel Entropy = StoredTemperatureModel.StandardEntropy(121.3, "Ag2O");
    private static readonly StoredTemperatureModel Table = StoredTemperatureModel.FreeEnergyTable(
        "fitted_298k", [new StoredFreeEnergyPoint(300, -0.377156), new(500, -0.628594), new(700, -0.880031)]);
    private static readonly StoredTemperatureModel ZeroEntropy = StoredTemperatureModel.StandardEntropy(0.0);

    private readonly StoreLocation _location = backend.NewLocation();
    private readonly StoreLocation _sqlite = StoreBackend.Sqlite.NewLocation();

    public void Dispose()
    {
        _location.Dispose();
        _sqlite.Dispose();
    }

    [Fact]
    public void Models_survive_batches_replaces_sessions_and_pages_and_fingerprint_as_on_sqlite()
    {
        using IDatasetStore store = _location.Open();
        using IDatasetStore reference = _sqlite.Open();
        foreach (IDatasetStore s in new[] { store, reference })
        {
            s.CreateDataset("silver");
            s.ImportBatch("silver", [new("ag2o", "Ag2O", -0.32, "formation_per_formula_unit", "", Entropy), new("o2", "O2", 0.0, "formation_per_atom")],
                DuplicatePolicy.Reject, BatchProvenance.None);
            s.ImportBatch("silver", [new("ag2o", "Ag2O", -0.33, "formation_per_formula_unit", "", Table)], DuplicatePolicy.Replace, BatchProvenance.None);
            ImportSessionInfo session = s.BeginImport("silver", DuplicatePolicy.Reject, BatchProvenance.None, TimeSpan.FromMinutes(5));
            s.StageBatch(session.SessionId, [new("ag", "Ag", 0.0, "formation_per_atom", "", ZeroEntropy), new("ag2o2", "AgO", -0.1, "formation_per_atom")],
                TimeSpan.FromMinutes(5));
            Assert.Equal(ZeroEntropy, s.ReadStagedImport(session.SessionId).Rows[0].Row.TemperatureModel);
            s.CommitImport(session.SessionId);
        }

        Assert.Equal(Entropy, store.GetEntry("silver", "ag2o", 1)!.TemperatureModel);
        Assert.Equal(Table, store.GetEntry("silver", "ag2o", 2)!.TemperatureModel);
        Assert.Equal(ZeroEntropy, store.GetEntry("silver", "ag")!.TemperatureModel);
        Assert.Null(store.GetEntry("silver", "o2")!.TemperatureModel);
        Assert.Equal(Table, store.GetEntries("silver", null, "ag", 1).Entries.Single().TemperatureModel);
        for (long v = 1; v <= 3; v++)
        {
            Rows.AssertSame(reference.GetEntries("silver", v), store.GetEntries("silver", v), $"version {v}");
            Assert.Equal(reference.GetEntries("silver", v).Select(r => r.TemperatureModel), store.GetEntries("silver", v).Select(r => r.TemperatureModel));
            Assert.Equal(reference.GetFingerprint("silver", v), store.GetFingerprint("silver", v));
        }
    }
}

public sealed class TemperatureModelBackendTestsOnSqlite() : TemperatureModelBackendTests(StoreBackend.Sqlite)
{
}

public sealed class TemperatureModelBackendTestsOnPostgres() : TemperatureModelBackendTests(StoreBackend.Postgres)
{
}
