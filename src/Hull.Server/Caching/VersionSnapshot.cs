using System.Collections.Concurrent;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Solids;
using Hull.Core.Thermo.Uncertainty;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Store;

namespace Hull.Server.Caching;

/// <summary>
/// One dataset version read from the store and parsed once: its entries in id order, and their grouping by chemical
/// system (Core's <see cref="ChemicalSystemGrouping"/>) so that the entries within any system are found without a
/// scan of every row. Immutable after construction (the per-system counts are memoised thread-safely).
/// </summary>
public sealed class VersionSnapshot
{
    private readonly Dictionary<string, int> _indexById;
    private readonly ChemicalSystemGrouping _systems;
    private readonly ConcurrentDictionary<string, int> _countWithin = new(StringComparer.Ordinal);
    private readonly Lazy<TemperatureModelSet> _storedModelSet;

    private VersionSnapshot(VersionRef version, PhaseEntry[] entries, string[] formulasAsStored, AnchoredSolidModel?[] temperatureModels,
        EnergyUncertainty[] uncertainties)
    {
        Version = version;
        Uncertainties = uncertainties;
        Entries = entries;
        FormulasAsStored = formulasAsStored;
        TemperatureModels = temperatureModels;
        _storedModelSet = new Lazy<TemperatureModelSet>(() => new TemperatureModelSet(
            Enumerable.Range(0, entries.Length).Where(i => temperatureModels[i] is not null)
                .Select(i => KeyValuePair.Create(entries[i].Id, temperatureModels[i]!.Model)), []));
        _indexById = new Dictionary<string, int>(entries.Length, StringComparer.Ordinal);
        for (int i = 0; i < entries.Length; i++)
        {
            _indexById[entries[i].Id] = i;
        }

        _systems = new ChemicalSystemGrouping(entries.Select(e => e.Composition).ToArray());
        MaximalSystems = Enumerable.Range(0, _systems.MaximalCount)
            .OrderBy(_systems.MaximalName, StringComparer.Ordinal)
            .Select(_systems.MaximalElements)
            .ToArray();
    }

    // The same parsed content under another version of equal content (see HullCache.GetSnapshotAsync).
    private VersionSnapshot(VersionSnapshot content, VersionRef version)
    {
        Version = version;
        Uncertainties = content.Uncertainties;
        Entries = content.Entries;
        FormulasAsStored = content.FormulasAsStored;
        TemperatureModels = content.TemperatureModels;
        _storedModelSet = content._storedModelSet;
        _indexById = content._indexById;
        _systems = content._systems;
        _countWithin = content._countWithin;
        MaximalSystems = content.MaximalSystems;
    }

    public VersionRef Version { get; }

    /// <summary>This snapshot's content named as <paramref name="version"/> (equal content, so nothing is parsed again).</summary>
    public VersionSnapshot Under(VersionRef version) => new(this, version);

    /// <summary>Every entry of the version, in id order.</summary>
    public IReadOnlyList<PhaseEntry> Entries { get; }

    /// <summary>The energy uncertainty of every entry that has a σ or a correlation group, in id order.</summary>
    public IReadOnlyList<EnergyUncertainty> Uncertainties { get; }

    /// <summary>Each entry's formula exactly as imported (parallel to <see cref="Entries"/>).</summary>
    public IReadOnlyList<string> FormulasAsStored { get; }

    /// <summary>Each entry's stored temperature model with its table's anchor, null where it has none (parallel to <see cref="Entries"/>).</summary>
    public IReadOnlyList<AnchoredSolidModel?> TemperatureModels { get; }

    /// <summary>The stored models by entry id, as Core's set (every model checked against its entry's composition on import).</summary>
    public TemperatureModelSet StoredModelSet => _storedModelSet.Value;

    /// <summary>Element lists of the systems contained in no other present system, ordered by name.</summary>
    public IReadOnlyList<IReadOnlyList<string>> MaximalSystems { get; }

    /// <summary>Reads and parses every entry of <paramref name="version"/>.</summary>
    /// <exception cref="Grpc.Core.RpcException">FAILED_PRECONDITION when a stored row cannot be read as an entry.</exception>
    public static VersionSnapshot Load(IDatasetStore store, VersionRef version)
    {
        IReadOnlyList<EntryRow> rows = store.GetEntries(version.Dataset, version.Version);
        var entries = new PhaseEntry[rows.Count];
        var formulas = new string[rows.Count];
        var models = new AnchoredSolidModel?[rows.Count];
        var uncertainties = new List<EnergyUncertainty>();
        for (int i = 0; i < rows.Count; i++)
        {
            EntryRow row = rows[i];
            if (!Composition.TryParse(row.Formula, out Composition? composition, out FormulaParseException? error))
            {
                throw RpcErrors.FailedPrecondition(
                    $"dataset '{version.Dataset}' version {version.Version}: stored entry '{row.Id}' has a formula the service cannot read: {error.Message}",
                    ErrorReasons.DatasetNotAnalysable, $"entry:{row.Id}");
            }

            formulas[i] = row.Formula;
            entries[i] = new PhaseEntry(row.Id, composition, row.EnergyEv, WireMapping.BasisOf(row));
            if (row.TemperatureModel is { } stored)
            {
                try
                {
                    models[i] = TemperatureModelMapping.ToCore(row.Id, composition, stored);
                }
                catch (InvalidDataException e)
                {
                    throw RpcErrors.FailedPrecondition($"dataset '{version.Dataset}' version {version.Version}: {e.Message}",
                        ErrorReasons.DatasetNotAnalysable, $"entry:{row.Id}");
                }
            }
            if (row.SigmaEvPerAtom is not null || row.CorrelationGroup is not null)
            {
                uncertainties.Add(new EnergyUncertainty(row.Id, row.SigmaEvPerAtom ?? 0.0, row.CorrelationGroup));
            }
        }

        return new VersionSnapshot(version, entries, formulas, models, [.. uncertainties]);
    }

    /// <summary>The temperature model of the entry with <paramref name="id"/>; null when it has none or the version has no such entry.</summary>
    public AnchoredSolidModel? TemperatureModelOf(string id) => _indexById.TryGetValue(id, out int row) ? TemperatureModels[row] : null;

    /// <summary>The row of the entry with <paramref name="id"/>; false when the version has none.</summary>
    public bool TryFind(string id, out int row) => _indexById.TryGetValue(id, out row);

    /// <summary>Every entry whose elements all lie in <paramref name="elements"/>, in id order.</summary>
    public IReadOnlyList<PhaseEntry> EntriesWithin(IReadOnlyList<string> elements)
    {
        var rows = new List<int>();
        foreach (int system in _systems.SystemsWithin(elements)) rows.AddRange(_systems.RowsOf(system));
        rows.Sort();
        return rows.Select(r => Entries[r]).ToArray();
    }

    /// <summary>How many entries lie in <paramref name="elements"/> (memoised per system).</summary>
    public int CountWithin(IReadOnlyList<string> elements) =>
        _countWithin.GetOrAdd(string.Join('-', elements), _ => _systems.SystemsWithin(elements).Sum(s => _systems.RowsOf(s).Count));
}
