namespace Hull.Core.Thermo.Gases;

/// <summary>
/// μ(T, p) of an ideal gas and its parts, eV per molecule:
/// μ = E_ref + [H°(T) − H°(T_anchor)] − T S°(T) + k_B T ln(p/p°).
/// </summary>
public sealed record GasChemicalPotential(
    string GasFormula,
    GasReferenceMode Mode,
    double TemperatureK,
    double PressureBar,
    int AtomsPerMolecule,
    double ReferenceEnergyEvPerMolecule,
    double EnthalpyAboveAnchorEvPerMolecule,
    double EntropyTermEvPerMolecule,
    double PressureTermEvPerMolecule)
{
    /// <summary>μ per molecule, eV.</summary>
    public double EvPerMolecule =>
        ReferenceEnergyEvPerMolecule + EnthalpyAboveAnchorEvPerMolecule - EntropyTermEvPerMolecule + PressureTermEvPerMolecule;

    /// <summary>μ per atom, eV: the molecule's divided by its atoms (half, for the diatomic gases).</summary>
    public double EvPerAtom => EvPerMolecule / AtomsPerMolecule;
}
