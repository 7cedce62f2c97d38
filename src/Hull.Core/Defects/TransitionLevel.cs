namespace Hull.Core.Defects;

/// <summary>ε(q/q′) = [E_f(q; E_F = 0) − E_f(q′; E_F = 0)] / (q′ − q): the Fermi level (eV above the VBM) where q and q′ cost the same.</summary>
/// <param name="Defect">The defect's name.</param>
/// <param name="Charge">q, the higher charge (stable below the level).</param>
/// <param name="OtherCharge">q′ &lt; q (stable above it).</param>
/// <param name="LevelEv">ε(q/q′) above the VBM.</param>
/// <param name="Kind">Thermodynamic or between non-ground states.</param>
/// <param name="InsideGap">False when the level lies below the VBM or above the CBM.</param>
/// <param name="FormationEnergyEv">E_f of either state at the level.</param>
public sealed record TransitionLevel(string Defect, int Charge, int OtherCharge, double LevelEv, TransitionLevelKind Kind, bool InsideGap, double FormationEnergyEv);
