namespace Hull.Server.Security;

/// <summary>The write token the server was started with (null: writes are open).</summary>
public sealed record WriteTokenSetting(string? Token);
