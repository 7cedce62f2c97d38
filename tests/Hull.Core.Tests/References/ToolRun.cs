namespace Hull.Core.Tests.References;

/// <summary>What a finished reference tool printed.</summary>
public sealed record ToolRun(string StandardOutput, string StandardError, TimeSpan Elapsed);
