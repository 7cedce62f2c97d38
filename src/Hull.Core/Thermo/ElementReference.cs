namespace Hull.Core.Thermo;

/// <summary>
/// The reference energy used for one element (eV/atom): either given explicitly or taken from the lowest-energy
/// pure-element entry, whose id <see cref="SourceEntryId"/> then names.
/// </summary>
public sealed record ElementReference(string Symbol, double EvPerAtom, string? SourceEntryId)
{
    /// <summary>True when the reference was given explicitly rather than taken from an entry.</summary>
    public bool IsExplicit => SourceEntryId is null;
}
