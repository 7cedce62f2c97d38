namespace Hull.Core.Defects;

/// <summary>A charge state of a checked study with its finite-size correction worked out.</summary>
/// <param name="Charge">q (e).</param>
/// <param name="TotalEnergyEv">Total energy of the defect supercell (eV).</param>
/// <param name="Correction">E_corr term by term.</param>
public sealed record CorrectedChargeState(int Charge, double TotalEnergyEv, FiniteSizeCorrection Correction);
