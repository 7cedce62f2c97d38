namespace Hull.Server.Cluster;

/// <summary>
/// One chemical system's hull of one dataset version, built once in the cluster and kept by the server that holds
/// it. Keyed by <see cref="SystemHullKey"/>.
/// </summary>
public interface ISystemHullGrain : IGrainWithStringKey
{
    /// <summary>
    /// Answers a request whose formulas or entries all lie in this grain's system: the request is the stability
    /// service's own wire message for <paramref name="question"/>, the answer its response or refusal, so the grain
    /// layer only carries them. The caller's cancellation (its deadline or cancel) reaches the grain's wait for the
    /// version and the hull.
    /// </summary>
    Task<SystemHullAnswer> AnswerAsync(SystemHullQuestion question, byte[] request, CancellationToken cancellation);
}
