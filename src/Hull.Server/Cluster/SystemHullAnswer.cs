namespace Hull.Server.Cluster;

/// <summary>
/// What a system's grain answers: the service's response (GetHullEnergiesResponse bytes), or the refusal a lone
/// server would have sent for the same request (google.rpc.Status bytes: code, message and details), so that a
/// refusal reaches the caller as itself rather than as a failure between servers.
/// </summary>
[GenerateSerializer, Immutable]
public sealed record SystemHullAnswer([property: Id(0)] byte[]? Response, [property: Id(1)] byte[]? Refusal);
