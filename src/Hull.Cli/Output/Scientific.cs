namespace Hull.Cli.Output;

/// <summary>
/// A table cell for quantities spanning many decades (concentrations per cm³): the table shows four significant
/// digits in exponent form, CSV the round-trip value.
/// </summary>
public readonly record struct Scientific(double Value);
