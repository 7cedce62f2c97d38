namespace Hull.Core.Defects;

/// <summary>
/// The self-consistent Fermi level at one temperature and every concentration there, with how they were counted.
/// </summary>
/// <param name="Status">Why the solve stopped.</param>
/// <param name="TemperatureK">T (K).</param>
/// <param name="FermiLevelEv">E_F, eV above the study's VBM.</param>
/// <param name="Edges">The band edges at T.</param>
/// <param name="Iterations">Root-solve iterations.</param>
/// <param name="ElectronsPerCubicCentimetre">n (cm^-3).</param>
/// <param name="HolesPerCubicCentimetre">p (cm^-3).</param>
/// <param name="ExtraDonorsPerCubicCentimetre">Fully ionised donors outside the study (cm^-3).</param>
/// <param name="ExtraAcceptorsPerCubicCentimetre">Fully ionised acceptors outside the study (cm^-3).</param>
/// <param name="ChargeStates">Every charge state of every defect, in the study's order.</param>
/// <param name="Defects">Each defect's total.</param>
/// <param name="Statistics">The carriers' statistics.</param>
/// <param name="Form">The concentration form; null when totals were frozen (quenched) and only charge states re-equilibrated.</param>
/// <param name="NetChargePerCubicCentimetre">p − n + donors − acceptors + Σ q c_q at E_F (e cm^-3).</param>
/// <param name="RelativeChargeImbalance">|net| over the sum of every charge's magnitude.</param>
public sealed record FermiLevelSolution(
    FermiSolveStatus Status,
    double TemperatureK,
    double FermiLevelEv,
    BandEdges Edges,
    int Iterations,
    double ElectronsPerCubicCentimetre,
    double HolesPerCubicCentimetre,
    double ExtraDonorsPerCubicCentimetre,
    double ExtraAcceptorsPerCubicCentimetre,
    IReadOnlyList<ChargeStateConcentration> ChargeStates,
    IReadOnlyList<DefectTotal> Defects,
    CarrierStatistics Statistics,
    ConcentrationForm? Form,
    double NetChargePerCubicCentimetre,
    double RelativeChargeImbalance)
{
    public bool IsConverged => Status == FermiSolveStatus.Converged;

    /// <summary>A defect's total (cm^-3); throws for an unknown name.</summary>
    public double TotalOf(string defect) => Defects.First(d => d.Defect == defect).PerCubicCentimetre;
}
