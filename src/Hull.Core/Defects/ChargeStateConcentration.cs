namespace Hull.Core.Defects;

/// <summary>One charge state at the solved Fermi level.</summary>
/// <param name="Defect">The defect's name.</param>
/// <param name="Charge">q (e).</param>
/// <param name="FormationEnergyEv">E_f at the Fermi level (eV).</param>
/// <param name="PerCubicCentimetre">Its concentration (cm^-3; 0 where it underflows).</param>
public sealed record ChargeStateConcentration(string Defect, int Charge, double FormationEnergyEv, double PerCubicCentimetre);
