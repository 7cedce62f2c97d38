using System.Collections.Concurrent;
using Hull.Core.Thermo;
using Hull.Server.Mapping;
using WireCoverage = Hull.Protos.V1.SystemCoverage;
using WireEntryStability = Hull.Protos.V1.EntryStability;
using WireReference = Hull.Protos.V1.ElementReference;

namespace Hull.Server.Caching;

/// <summary>
/// One chemical system's hull for one dataset version, with an index of its entries' stability by id, and the wire
/// forms of what every answer on it repeats (its coverage, its references, each entry's stability), made once: a
/// busy server answers the same entries again and again, and building those messages was a sizeable part of a
/// query's CPU. The wire messages are shared between answers and must never be changed after they are made.
/// </summary>
public sealed class CachedHull
{
    private readonly Lazy<Dictionary<string, EntryStability>> _byId;
    private readonly Lazy<WireCoverage> _wireCoverage;
    private readonly Lazy<IReadOnlyList<KeyValuePair<string, WireReference>>> _wireReferences;
    private readonly ConcurrentDictionary<string, WireEntryStability> _wireStability = new(StringComparer.Ordinal);

    private readonly CacheStatisticsCounters? _counters;

    public CachedHull(SystemHull hull, CacheStatisticsCounters? counters = null)
    {
        Hull = hull;
        _counters = counters;
        _byId = new Lazy<Dictionary<string, EntryStability>>(
            () => hull.Entries.ToDictionary(e => e.Id, StringComparer.Ordinal), LazyThreadSafetyMode.ExecutionAndPublication);
        _wireCoverage = new Lazy<WireCoverage>(() => WireMapping.ToWire(hull.Coverage), LazyThreadSafetyMode.PublicationOnly);
        _wireReferences = new Lazy<IReadOnlyList<KeyValuePair<string, WireReference>>>(() => WireReferencesOf(hull), LazyThreadSafetyMode.PublicationOnly);
    }

    public SystemHull Hull { get; }

    /// <summary>The hull's coverage as sent (shared: never change it).</summary>
    public WireCoverage WireCoverage => _wireCoverage.Value;

    /// <summary>The hull's references as sent, by symbol in ordinal order, the first of a symbol kept (shared: never change them).</summary>
    public IReadOnlyList<KeyValuePair<string, WireReference>> WireReferences => _wireReferences.Value;

    /// <summary>The stability of entry <paramref name="id"/>, which must be one of the hull's entries.</summary>
    public EntryStability StabilityOf(string id) => _byId.Value[id];

    /// <summary>The stability of entry <paramref name="id"/>; false when the hull does not hold it.</summary>
    public bool TryStabilityOf(string id, out EntryStability stability) => _byId.Value.TryGetValue(id, out stability!);

    /// <summary>
    /// The wire form of entry <paramref name="id"/>'s stability (shared: never change it). The formula as stored is
    /// the version's, the same for every question on this hull.
    /// </summary>
    public WireEntryStability WireStabilityOf(string id, string formulaAsStored)
    {
        if (_wireStability.TryGetValue(id, out WireEntryStability? wire)) return wire;
        wire = WireMapping.ToWire(StabilityOf(id), formulaAsStored);
        _counters?.CountEntryAnswerMade();
        return _wireStability.GetOrAdd(id, wire);
    }

    private static IReadOnlyList<KeyValuePair<string, WireReference>> WireReferencesOf(SystemHull hull)
    {
        var bySymbol = new SortedDictionary<string, WireReference>(StringComparer.Ordinal);
        foreach (ElementReference reference in hull.References) bySymbol.TryAdd(reference.Symbol, WireMapping.ToWire(reference));
        return bySymbol.ToArray();
    }
}
