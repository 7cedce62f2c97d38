using Hull.Server.Caching;

namespace Hull.Server.Corrections;

/// <summary>A corrected version as written: the new version (naming its set) and the rows and shifts it was made of.</summary>
public sealed record DerivedVersion(VersionRef Version, CorrectedRows Corrected);
