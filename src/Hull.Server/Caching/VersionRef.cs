namespace Hull.Server.Caching;

/// <summary>A resolved dataset version and the fingerprint of its content (SHA-256, 64 hex digits).</summary>
public sealed record VersionRef(string Dataset, long Version, string Fingerprint);
