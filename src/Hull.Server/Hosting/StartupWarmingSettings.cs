namespace Hull.Server.Hosting;

/// <summary>How many hulls <see cref="StartupHullWarming"/> builds once the server listens; 0 turns it off.</summary>
public sealed record StartupWarmingSettings(int MaxHulls);
