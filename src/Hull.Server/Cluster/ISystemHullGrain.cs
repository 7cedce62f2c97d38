namespace Hull.Server.Cluster;

/// <summary>
/// One chemical system's hull of one dataset version, built once in the cluster and kept by the server that holds
/// it. Keyed by <see cref="SystemHullKey"/>.
/// </summary>
public interface ISystemHullGrain : IGrainWithStringKey
{
    /// <summary>
    /// Answers a hull-energy request whose formulas all lie in this grain's system: the request is the service's own
    /// wire message (GetHullEnergiesRequest), the answer its response or refusal, so the grain layer only carries them.
    /// </summary>
    Task<SystemHullAnswer> HullEnergiesAsync(byte[] request);
}
