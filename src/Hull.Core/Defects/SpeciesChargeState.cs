namespace Hull.Core.Defects;

/// <summary>A charge state's formation-energy line and degeneracy.</summary>
/// <param name="Charge">q (e).</param>
/// <param name="FormationEnergyAtVbmEv">a_q = E_f(q; E_F = 0) at the chemical-potential point (eV).</param>
/// <param name="Degeneracy">g_q &gt; 0.</param>
public sealed record SpeciesChargeState(int Charge, double FormationEnergyAtVbmEv, double Degeneracy);
