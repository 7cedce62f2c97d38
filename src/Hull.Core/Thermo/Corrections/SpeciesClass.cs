namespace Hull.Core.Thermo.Corrections;

/// <summary>Which entries a species shift applies to, for its element X. Never X's own elemental entries.</summary>
public enum SpeciesClass
{
    /// <summary>Every entry that holds X and at least one other element.</summary>
    InCompound,

    /// <summary>
    /// Every entry that holds X and at least one metal (<see cref="MetalElements"/>): X taken as the anion of a
    /// metal compound, e.g. O in oxides. Peroxides and superoxides are counted as oxides by this rule.
    /// </summary>
    WithMetal,
}
