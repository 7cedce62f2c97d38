namespace Hull.Server.Services;

/// <summary>
/// Stability-sampling calls since the server started: how many are sampling now, how many finished, and how many
/// stopped because their caller cancelled or their deadline passed. A stopped call counts only once its sampling
/// threads are done, so <see cref="Running"/> at 0 means no sample is being drawn.
/// </summary>
public sealed class SamplingActivity
{
    // Running, finished and stopped, in that order.
    private readonly long[] _counts = new long[3];

    /// <summary>Calls whose sampling is under way.</summary>
    public long Running => Interlocked.Read(ref _counts[0]);

    /// <summary>Calls whose sampling ran to its end.</summary>
    public long Finished => Interlocked.Read(ref _counts[1]);

    /// <summary>Calls whose sampling stopped early on cancellation or deadline.</summary>
    public long Stopped => Interlocked.Read(ref _counts[2]);

    /// <summary>Runs <paramref name="sampling"/> off the request thread, counting it while it runs and how it ended.</summary>
    internal async Task<T> RunAsync<T>(Func<CancellationToken, T> sampling, CancellationToken cancellation)
    {
        Interlocked.Increment(ref _counts[0]);
        try
        {
            // The token reaches the sampling loop itself; Task.Run's copy only spares starting a call already cancelled.
            T result = await Task.Run(() => sampling(cancellation), cancellation);
            Interlocked.Increment(ref _counts[1]);
            return result;
        }
        catch (OperationCanceledException)
        {
            Interlocked.Increment(ref _counts[2]);
            throw;
        }
        finally
        {
            Interlocked.Decrement(ref _counts[0]);
        }
    }
}
