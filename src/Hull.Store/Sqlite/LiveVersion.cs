namespace Hull.Store.Sqlite;

/// <summary>A version that can be read, with the number of entries visible at it.</summary>
internal readonly record struct LiveVersion(long Version, long EntryCount);
