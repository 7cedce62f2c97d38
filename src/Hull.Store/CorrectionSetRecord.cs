namespace Hull.Store;

/// <summary>A stored correction set: its name and version, its JSON body exactly as given, and when it was first stored.</summary>
public sealed record CorrectionSetRecord(string SetName, long SetVersion, string SetJson, DateTimeOffset StoredAtUtc);
