namespace Hull.Core.Thermo;

/// <summary>
/// The reference for one element's total energies: a total energy per atom (eV/atom, on the scale of the entries'
/// total energies), either given explicitly or taken from the lowest-energy pure-element entry, whose id
/// <see cref="SourceEntryId"/> then names. Formation energies are measured from it.
/// </summary>
public sealed record ElementReference(string Symbol, double TotalEnergyEvPerAtom, string? SourceEntryId)
{
    /// <summary>True when the reference was given explicitly rather than taken from an entry.</summary>
    public bool IsExplicit => SourceEntryId is null;
}
