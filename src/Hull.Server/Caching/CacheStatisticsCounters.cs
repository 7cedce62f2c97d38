namespace Hull.Server.Caching;

/// <summary>Counters of the hull cache since start (read through the diagnostics service).</summary>
public sealed class CacheStatisticsCounters
{
    private long _hullBuilds;
    private long _hullHits;
    private long _versionLoads;
    private long _datasetAnalyses;
    private long _entryAnswersMade;

    public long HullBuilds => Interlocked.Read(ref _hullBuilds);

    public long HullHits => Interlocked.Read(ref _hullHits);

    public long VersionLoads => Interlocked.Read(ref _versionLoads);

    public long DatasetAnalyses => Interlocked.Read(ref _datasetAnalyses);

    /// <summary>Entries' stability answers made in wire form (each is then kept with its hull); not on the wire.</summary>
    public long EntryAnswersMade => Interlocked.Read(ref _entryAnswersMade);

    internal void CountHullBuild() => Interlocked.Increment(ref _hullBuilds);

    internal void CountHullHit() => Interlocked.Increment(ref _hullHits);

    internal void CountVersionLoad() => Interlocked.Increment(ref _versionLoads);

    internal void CountDatasetAnalysis() => Interlocked.Increment(ref _datasetAnalyses);

    internal void CountEntryAnswerMade() => Interlocked.Increment(ref _entryAnswersMade);
}
