using Hull.Core.Thermo;

namespace Hull.Server.Caching;

/// <summary>One chemical system's hull for one dataset version, with an index of its entries' stability by id.</summary>
public sealed class CachedHull
{
    private readonly Lazy<Dictionary<string, EntryStability>> _byId;

    public CachedHull(SystemHull hull)
    {
        Hull = hull;
        _byId = new Lazy<Dictionary<string, EntryStability>>(
            () => hull.Entries.ToDictionary(e => e.Id, StringComparer.Ordinal), LazyThreadSafetyMode.ExecutionAndPublication);
    }

    public SystemHull Hull { get; }

    /// <summary>The stability of entry <paramref name="id"/>, which must be one of the hull's entries.</summary>
    public EntryStability StabilityOf(string id) => _byId.Value[id];

    /// <summary>The stability of entry <paramref name="id"/>; false when the hull does not hold it.</summary>
    public bool TryStabilityOf(string id, out EntryStability stability) => _byId.Value.TryGetValue(id, out stability!);
}
