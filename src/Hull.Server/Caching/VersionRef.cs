namespace Hull.Server.Caching;

/// <summary>
/// A resolved dataset version, the fingerprint of its content (SHA-256, 64 hex digits), and the correction set it was
/// derived with (null for a version imported as given). Both are fixed when the version is committed.
/// </summary>
public sealed record VersionRef(string Dataset, long Version, string Fingerprint, Store.VersionCorrections? Corrections = null);
