namespace Hull.Server.Cluster;

/// <summary>Counters of this server's part in a cluster since start (read through the diagnostics service).</summary>
public sealed class ClusterCounters
{
    private long _grainHullBuilds;

    /// <summary>System hulls this server built as the cluster's holder of them.</summary>
    public long GrainHullBuilds => Interlocked.Read(ref _grainHullBuilds);

    internal void CountGrainHullBuild() => Interlocked.Increment(ref _grainHullBuilds);
}
