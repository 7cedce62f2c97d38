namespace Hull.Core.Defects;

/// <summary>One charge state of a defect as calculated in the supercell.</summary>
/// <param name="Charge">q in units of e (+1: one electron removed).</param>
/// <param name="TotalEnergyEv">Total energy of the defect supercell in this charge state (eV).</param>
/// <param name="Alignment">Alignment input, or null for the image-charge term alone.</param>
/// <param name="SupercellAtoms">Atoms of each element in the defect supercell, when known: checked against the bulk
/// supercell plus the defect's added and removed atoms.</param>
public sealed record ChargeStateInput(int Charge, double TotalEnergyEv, AlignmentInput? Alignment = null, IReadOnlyDictionary<string, int>? SupercellAtoms = null);
