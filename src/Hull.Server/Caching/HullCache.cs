using System.Collections.Concurrent;
using Hull.Core.Thermo;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Caching;

/// <summary>
/// Parsed versions, chemical-system hulls and whole-dataset analyses, each built once and shared by every query.
/// </summary>
/// <remarks>
/// Keys carry the version's content fingerprint, so a new version (new content) never meets a hull of older
/// content. Each slot holds a <see cref="Lazy{T}"/> of the build task: concurrent identical queries all get the
/// one slot that <see cref="ConcurrentDictionary{TKey,TValue}.GetOrAdd(TKey, TValue)"/> kept and so await exactly
/// one build. A caller that gives up (deadline, cancellation) stops waiting, but the build runs on and serves the
/// next caller. A failed build is dropped from the cache, so a later query retries it.
/// </remarks>
public sealed class HullCache
{
    /// <summary>Parsed versions kept: the few versions being queried at once (each holds its entries in memory).</summary>
    private const int MaxSnapshots = 8;

    /// <summary>Whole-dataset analyses kept: they hold a result per entry, so only the recent few.</summary>
    private const int MaxAnalyses = 4;

    private readonly IDatasetStore _store;
    private readonly ServiceLimits _limits;
    private readonly int _maxHulls;
    private readonly ConcurrentDictionary<(string Dataset, string Fingerprint), Slot<VersionSnapshot>> _snapshots = new();
    // The last key part is the caller's explicit references among the system's elements ("" for none).
    private readonly ConcurrentDictionary<(string Dataset, string Fingerprint, string System, string References), Slot<CachedHull>> _hulls = new();
    private readonly ConcurrentDictionary<(string Dataset, string Fingerprint, string References), Slot<DatasetStabilityResult>> _analyses = new();
    private long _clock;

    public HullCache(IDatasetStore store, ServiceLimits limits, CacheSettings settings)
    {
        _store = store;
        _limits = limits;
        _maxHulls = Math.Max(1, settings.MaxCachedHulls);
    }

    public CacheStatisticsCounters Counters { get; } = new();

    /// <summary>
    /// Run on the building thread before each system hull is built; null in service. Tests hold a build with it, so
    /// that a caller is certainly waiting for a hull when its deadline passes, however fast the machine.
    /// </summary>
    internal Action? BeforeHullBuild { get; set; }

    /// <summary>Hulls held now.</summary>
    public int CachedHullCount => _hulls.Count;

    /// <summary>The parsed entries of <paramref name="version"/>.</summary>
    /// <remarks>
    /// Snapshots are shared by content, and two versions may hold the same content (a corrected version whose set
    /// moved nothing, a batch that replaced rows by equal ones): a snapshot loaded under another version is handed out
    /// under the one asked for, so every answer names its own version and correction set.
    /// </remarks>
    public Task<VersionSnapshot> GetSnapshotAsync(VersionRef version, CancellationToken cancellation)
    {
        Task<VersionSnapshot> loaded = GetOrBuild(_snapshots, (version.Dataset, version.Fingerprint), MaxSnapshots, () =>
        {
            Counters.CountVersionLoad();
            return VersionSnapshot.Load(_store, version);
        }, hit: null, cancellation);
        return loaded.IsCompletedSuccessfully && loaded.Result.Version == version ? loaded : Relabelled(loaded, version);
    }

    private static async Task<VersionSnapshot> Relabelled(Task<VersionSnapshot> loaded, VersionRef version)
    {
        VersionSnapshot snapshot = await loaded;
        return snapshot.Version == version ? snapshot : snapshot.Under(version);
    }

    /// <summary>
    /// The hull of the chemical system <paramref name="elements"/> (ordinal order) over every entry of the snapshot
    /// that lies in it.
    /// </summary>
    /// <exception cref="Grpc.Core.RpcException">RESOURCE_EXHAUSTED past the component or entry limit.</exception>
    public Task<CachedHull> GetHullAsync(
        VersionSnapshot snapshot, IReadOnlyList<string> elements, CancellationToken cancellation, ElementalReferenceList? references = null)
    {
        string system = string.Join('-', elements);
        CheckSystemLimits(snapshot, elements, system);
        references ??= ElementalReferenceList.None;
        return GetOrBuild(_hulls, (snapshot.Version.Dataset, snapshot.Version.Fingerprint, system, references.KeyFor(elements)), _maxHulls, () =>
        {
            Counters.CountHullBuild();
            BeforeHullBuild?.Invoke();
            IReadOnlyList<PhaseEntry> entries = snapshot.EntriesWithin(elements);
            return new CachedHull(SystemHull.OverElements(entries, references.References, elements), Counters);
        }, Counters.CountHullHit, cancellation);
    }

    /// <summary>
    /// The hull over the compound end-members of <paramref name="basis"/>: every entry of the snapshot that is a
    /// non-negative combination of them, with the elemental references of the end-members' elements (the caller's
    /// explicit ones where given).
    /// </summary>
    /// <exception cref="Grpc.Core.RpcException">RESOURCE_EXHAUSTED past the component or entry limit.</exception>
    public Task<CachedHull> GetEndMemberHullAsync(
        VersionSnapshot snapshot, EndMemberBasis basis, CancellationToken cancellation, ElementalReferenceList? references = null)
    {
        references ??= ElementalReferenceList.None;
        // Component order matters (it is the hull's axis order), so the key keeps the order given.
        string system = string.Join('-', basis.Names);
        if (basis.Names.Count > _limits.MaxComponentsPerSystem)
        {
            throw RpcErrors.LimitExceeded("max_components_per_system", _limits.MaxComponentsPerSystem,
                $"{basis.Names.Count} end-members; the limit is {_limits.MaxComponentsPerSystem} components per chemical system");
        }

        CheckSystemLimits(snapshot, basis.Elements, string.Join('-', basis.Elements));
        return GetOrBuild(_hulls, (snapshot.Version.Dataset, snapshot.Version.Fingerprint, "end-members:" + system, references.KeyFor(basis.Elements)), _maxHulls, () =>
        {
            Counters.CountHullBuild();
            return new CachedHull(EndMemberHull.Build(snapshot.EntriesWithin(basis.Elements), basis, references.References), Counters);
        }, Counters.CountHullHit, cancellation);
    }

    /// <summary>The stability of every entry of the snapshot, each from the smallest maximal system that contains it.</summary>
    public Task<DatasetStabilityResult> GetAnalysisAsync(
        VersionSnapshot snapshot, CancellationToken cancellation, ElementalReferenceList? references = null)
    {
        references ??= ElementalReferenceList.None;
        foreach (IReadOnlyList<string> system in snapshot.MaximalSystems)
        {
            CheckSystemLimits(snapshot, system, string.Join('-', system));
        }

        return GetOrBuild(_analyses, (snapshot.Version.Dataset, snapshot.Version.Fingerprint, references.KeyFor(null)), MaxAnalyses, () =>
        {
            Counters.CountDatasetAnalysis();
            return DatasetStability.Analyze(snapshot.Entries, references.References);
        }, hit: null, cancellation);
    }

    /// <summary>RESOURCE_EXHAUSTED when the system is past the component or entry limit (a cluster checks before it asks a peer).</summary>
    internal void CheckSystemLimits(VersionSnapshot snapshot, IReadOnlyList<string> elements, string system)
    {
        if (elements.Count > _limits.MaxComponentsPerSystem)
        {
            throw RpcErrors.LimitExceeded("max_components_per_system", _limits.MaxComponentsPerSystem,
                $"chemical system {system} has {elements.Count} components; the limit is {_limits.MaxComponentsPerSystem} components per chemical system");
        }

        int count = snapshot.CountWithin(elements);
        if (count > _limits.MaxEntriesPerSystem)
        {
            throw RpcErrors.LimitExceeded("max_entries_per_system", _limits.MaxEntriesPerSystem,
                $"chemical system {system} of dataset '{snapshot.Version.Dataset}' version {snapshot.Version.Version} has {count} entries; " +
                $"the limit is {_limits.MaxEntriesPerSystem} entries per chemical system");
        }
    }

    private async Task<T> GetOrBuild<TKey, T>(
        ConcurrentDictionary<TKey, Slot<T>> slots, TKey key, int capacity, Func<T> build, Action? hit, CancellationToken cancellation)
        where TKey : notnull
    {
        long now = Interlocked.Increment(ref _clock);
        if (!slots.TryGetValue(key, out Slot<T>? slot))
        {
            var fresh = new Slot<T>(new Lazy<Task<T>>(() => Task.Run(build), LazyThreadSafetyMode.ExecutionAndPublication), now);
            slot = slots.GetOrAdd(key, fresh);
            if (ReferenceEquals(slot, fresh))
            {
                Evict(slots, capacity);
            }
            else
            {
                hit?.Invoke();
            }
        }
        else
        {
            hit?.Invoke();
        }

        slot.LastUse = now;
        Task<T> task = slot.Value.Value;
        try
        {
            return await task.WaitAsync(cancellation).ConfigureAwait(false);
        }
        catch when (task.IsFaulted)
        {
            slots.TryRemove(new KeyValuePair<TKey, Slot<T>>(key, slot));
            throw;
        }
    }

    /// <summary>Drops the least recently used slots once there are more than <paramref name="capacity"/>.</summary>
    private static void Evict<TKey, T>(ConcurrentDictionary<TKey, Slot<T>> slots, int capacity)
        where TKey : notnull
    {
        if (slots.Count <= capacity) return;
        lock (slots)
        {
            int excess = slots.Count - capacity;
            if (excess <= 0) return;
            // Drop a tenth more than needed so that eviction runs rarely rather than on every insertion.
            int drop = Math.Min(slots.Count - 1, excess + capacity / 10);
            // The dictionary's own ToArray takes a snapshot under its locks. LINQ over the dictionary would read its
            // count and then copy, and a slot another query adds in between (adds do not take this lock) fails the copy.
            foreach (KeyValuePair<TKey, Slot<T>> old in slots.ToArray().OrderBy(p => p.Value.LastUse).Take(drop))
            {
                slots.TryRemove(old);
            }
        }
    }

    private sealed class Slot<T>(Lazy<Task<T>> value, long lastUse)
    {
        public Lazy<Task<T>> Value { get; } = value;

        /// <summary>Logical time of the last use; a torn read only misorders eviction, so no lock.</summary>
        public long LastUse { get; set; } = lastUse;
    }
}
