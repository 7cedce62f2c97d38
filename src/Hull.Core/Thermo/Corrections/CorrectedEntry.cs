namespace Hull.Core.Thermo.Corrections;

/// <summary>
/// One entry after a correction set: the corrected entry (same id, composition and basis) and the three parts of
/// its shift, each in eV per atom of the entry. An entry no rule touches keeps its energy bit for bit.
/// </summary>
/// <param name="Raw">The entry as given.</param>
/// <param name="Corrected">The entry with its corrected energy.</param>
/// <param name="Method">The entry's method tag as given; null when untagged (counted as the base method).</param>
/// <param name="MethodShiftEvPerAtom">From the method rule (0 on the base method).</param>
/// <param name="SpeciesShiftEvPerAtom">The sum of the species shifts that apply, per atom of the entry.</param>
/// <param name="ReferenceShiftEvPerAtom">For an elemental entry of an element with a fitted reference, the move to it.</param>
public sealed record CorrectedEntry(
    PhaseEntry Raw,
    PhaseEntry Corrected,
    string? Method,
    double MethodShiftEvPerAtom,
    double SpeciesShiftEvPerAtom,
    double ReferenceShiftEvPerAtom)
{
    /// <summary>The whole shift per atom of the entry (eV).</summary>
    public double TotalShiftEvPerAtom => MethodShiftEvPerAtom + SpeciesShiftEvPerAtom + ReferenceShiftEvPerAtom;

    /// <summary>Whether any rule moved the entry.</summary>
    public bool IsChanged => MethodShiftEvPerAtom != 0 || SpeciesShiftEvPerAtom != 0 || ReferenceShiftEvPerAtom != 0;
}
