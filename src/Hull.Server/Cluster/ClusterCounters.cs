namespace Hull.Server.Cluster;

/// <summary>Counters of this server's part in a cluster since start (read through the diagnostics service).</summary>
public sealed class ClusterCounters
{
    private long _grainHullBuilds;
    private long _grainCallsCancelled;

    /// <summary>System hulls this server built as the cluster's holder of them.</summary>
    public long GrainHullBuilds => Interlocked.Read(ref _grainHullBuilds);

    /// <summary>Calls to this server's grains that ended because their caller cancelled or its deadline passed.</summary>
    public long GrainCallsCancelled => Interlocked.Read(ref _grainCallsCancelled);

    internal void CountGrainCallCancelled() => Interlocked.Increment(ref _grainCallsCancelled);

    internal void CountGrainHullBuild() => Interlocked.Increment(ref _grainHullBuilds);
}
