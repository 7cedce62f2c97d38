namespace Hull.ServiceBench;

/// <summary>The service's performance targets on a 2-core machine, as the service's issue sets them.</summary>
public static class ServiceTargets
{
    /// <summary>Queries per second required at 8 and at 64 concurrent clients.</summary>
    public const double MinQueriesPerSecond = 5_000;

    /// <summary>p99 latency bound at 8 clients, ms.</summary>
    public const double MaxP99MsAt8Clients = 20;

    /// <summary>p99 latency bound at 64 clients, ms.</summary>
    public const double MaxP99MsAt64Clients = 60;

    /// <summary>The p99 bound for <paramref name="clients"/>, or null when none is set.</summary>
    public static double? MaxP99Ms(int clients) => clients switch
    {
        8 => MaxP99MsAt8Clients,
        64 => MaxP99MsAt64Clients,
        _ => null,
    };

    /// <summary>Whether a throughput target applies at <paramref name="clients"/>.</summary>
    public static bool HasThroughputTarget(int clients) => clients is 8 or 64;
}
