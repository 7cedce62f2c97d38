namespace Hull.Server.Errors;

/// <summary>One bad field of a request: its path (e.g. "entries[12].formula") and what is wrong with it.</summary>
public sealed record FieldViolation(string Field, string Description);
