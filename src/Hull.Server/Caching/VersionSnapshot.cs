using System.Collections.Concurrent;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Store;

namespace Hull.Server.Caching;

/// <summary>
/// One dataset version read from the store and parsed once: its entries in id order, each entry's chemical system,
/// and the entries grouped by chemical system so that the entries within any system are found without a scan of
/// every row. Immutable after construction (the per-system counts are memoised thread-safely).
/// </summary>
public sealed class VersionSnapshot
{
    private readonly Dictionary<string, int> _indexById;
    private readonly Dictionary<string, List<int>> _rowsBySystem;
    private readonly Dictionary<string, HashSet<string>> _elementsBySystem;
    private readonly string[] _systemOfRow;
    private readonly ConcurrentDictionary<string, int> _countWithin = new(StringComparer.Ordinal);

    private VersionSnapshot(VersionRef version, PhaseEntry[] entries, string[] formulasAsStored)
    {
        Version = version;
        Entries = entries;
        FormulasAsStored = formulasAsStored;
        _indexById = new Dictionary<string, int>(entries.Length, StringComparer.Ordinal);
        _rowsBySystem = new Dictionary<string, List<int>>(StringComparer.Ordinal);
        _elementsBySystem = new Dictionary<string, HashSet<string>>(StringComparer.Ordinal);
        _systemOfRow = new string[entries.Length];
        for (int i = 0; i < entries.Length; i++)
        {
            _indexById[entries[i].Id] = i;
            string system = entries[i].Composition.ChemicalSystem;
            _systemOfRow[i] = system;
            if (!_rowsBySystem.TryGetValue(system, out List<int>? rows))
            {
                _rowsBySystem[system] = rows = [];
                _elementsBySystem[system] = new HashSet<string>(entries[i].Composition.Elements, StringComparer.Ordinal);
            }

            rows.Add(i);
        }

        MaximalSystems = FindMaximalSystems();
    }

    public VersionRef Version { get; }

    /// <summary>Every entry of the version, in id order.</summary>
    public IReadOnlyList<PhaseEntry> Entries { get; }

    /// <summary>Each entry's formula exactly as imported (parallel to <see cref="Entries"/>).</summary>
    public IReadOnlyList<string> FormulasAsStored { get; }

    /// <summary>Element lists of the systems contained in no other present system, ordered by name.</summary>
    public IReadOnlyList<IReadOnlyList<string>> MaximalSystems { get; }

    /// <summary>Reads and parses every entry of <paramref name="version"/>.</summary>
    /// <exception cref="Grpc.Core.RpcException">FAILED_PRECONDITION when a stored row cannot be read as an entry.</exception>
    public static VersionSnapshot Load(DatasetStore store, VersionRef version)
    {
        IReadOnlyList<EntryRow> rows = store.GetEntries(version.Dataset, version.Version);
        var entries = new PhaseEntry[rows.Count];
        var formulas = new string[rows.Count];
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
        }

        return new VersionSnapshot(version, entries, formulas);
    }

    /// <summary>The chemical system (elements joined by '-', ordinal order) of the entry in <paramref name="row"/>.</summary>
    public string SystemOf(int row) => _systemOfRow[row];

    /// <summary>The row of the entry with <paramref name="id"/>; false when the version has none.</summary>
    public bool TryFind(string id, out int row) => _indexById.TryGetValue(id, out row);

    /// <summary>Every entry whose elements all lie in <paramref name="elements"/>, in id order.</summary>
    public IReadOnlyList<PhaseEntry> EntriesWithin(IReadOnlyList<string> elements)
    {
        var rows = new List<int>();
        foreach (string system in SystemsWithin(elements)) rows.AddRange(_rowsBySystem[system]);
        rows.Sort();
        return rows.Select(r => Entries[r]).ToArray();
    }

    /// <summary>How many entries lie in <paramref name="elements"/> (memoised per system).</summary>
    public int CountWithin(IReadOnlyList<string> elements) =>
        _countWithin.GetOrAdd(string.Join('-', elements), _ => SystemsWithin(elements).Sum(s => _rowsBySystem[s].Count));

    /// <summary>Most elements of any entry.</summary>
    public int MaxElementsPerEntry => _elementsBySystem.Count == 0 ? 0 : _elementsBySystem.Values.Max(e => e.Count);

    private IEnumerable<string> SystemsWithin(IReadOnlyList<string> elements)
    {
        var allowed = new HashSet<string>(elements, StringComparer.Ordinal);
        return _elementsBySystem.Where(pair => pair.Value.IsSubsetOf(allowed)).Select(pair => pair.Key);
    }

    private IReadOnlyList<IReadOnlyList<string>> FindMaximalSystems()
    {
        var bySizeDescending = _elementsBySystem.OrderByDescending(p => p.Value.Count).ThenBy(p => p.Key, StringComparer.Ordinal).ToArray();
        var maximal = new List<KeyValuePair<string, HashSet<string>>>();
        foreach (KeyValuePair<string, HashSet<string>> candidate in bySizeDescending)
        {
            if (!maximal.Any(m => candidate.Value.IsSubsetOf(m.Value))) maximal.Add(candidate);
        }

        return maximal
            .OrderBy(m => m.Key, StringComparer.Ordinal)
            .Select(m => (IReadOnlyList<string>)m.Value.Order(StringComparer.Ordinal).ToArray())
            .ToArray();
    }
}
