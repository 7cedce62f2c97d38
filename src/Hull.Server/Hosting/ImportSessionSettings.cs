namespace Hull.Server.Hosting;

/// <summary>How long an import session waits for its next call before it lapses and its staged rows are removed.</summary>
/// <param name="IdleExpiry">The wait; every call naming the session starts it again.</param>
public sealed record ImportSessionSettings(TimeSpan IdleExpiry)
{
    /// <summary>Ten minutes: far longer than any pause between two batches of a live client, short enough that a
    /// dead client's rows do not sit on disk for long.</summary>
    public static readonly TimeSpan DefaultIdleExpiry = TimeSpan.FromMinutes(10);

    /// <summary>How often lapsed sessions are swept: a tenth of the expiry, between 1 s and 1 min.</summary>
    public TimeSpan SweepInterval => TimeSpan.FromTicks(Math.Clamp(IdleExpiry.Ticks / 10, TimeSpan.TicksPerSecond, TimeSpan.TicksPerMinute));
}
