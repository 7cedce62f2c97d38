namespace Hull.Server.Caching;

/// <summary>How many hulls the cache keeps before dropping the least recently used.</summary>
public sealed record CacheSettings(int MaxCachedHulls);
