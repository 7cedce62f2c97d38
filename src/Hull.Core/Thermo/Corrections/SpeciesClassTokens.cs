namespace Hull.Core.Thermo.Corrections;

/// <summary>The text names of <see cref="SpeciesClass"/>, as files, the store and the CLI write them.</summary>
public static class SpeciesClassTokens
{
    public const string InCompound = "in_compound";
    public const string WithMetal = "with_metal";

    public static string Of(SpeciesClass kind) => kind switch
    {
        SpeciesClass.InCompound => InCompound,
        SpeciesClass.WithMetal => WithMetal,
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, "unknown species class"),
    };

    /// <exception cref="ThermoInputException">A token that names no class.</exception>
    public static SpeciesClass Parse(string token) => token switch
    {
        InCompound => SpeciesClass.InCompound,
        WithMetal => SpeciesClass.WithMetal,
        _ => throw new ThermoInputException($"'{token}' is not a species class; use {InCompound} or {WithMetal}."),
    };
}
