namespace Hull.Core.Defects;

/// <summary>The host's perfect supercell and its electronic reference levels.</summary>
/// <param name="HostFormula">The host compound's formula, e.g. "ZnO".</param>
/// <param name="FormulaUnits">Formula units of the host in the supercell.</param>
/// <param name="Atoms">Atoms of each element in the supercell (must be FormulaUnits × the formula).</param>
/// <param name="TotalEnergyEv">Total energy of the supercell (eV).</param>
/// <param name="Lattice">The supercell's lattice vectors (Å).</param>
/// <param name="VbmEv">Valence-band maximum of the bulk (eV, on the scale of the total energies).</param>
/// <param name="BandGapEv">Band gap (eV), positive.</param>
/// <param name="Dielectric">Static dielectric tensor (electronic + ionic).</param>
public sealed record BulkSupercell(
    string HostFormula,
    int FormulaUnits,
    IReadOnlyDictionary<string, int> Atoms,
    double TotalEnergyEv,
    LatticeCell Lattice,
    double VbmEv,
    double BandGapEv,
    DielectricTensor Dielectric);
