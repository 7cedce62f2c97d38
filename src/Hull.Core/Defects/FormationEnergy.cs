namespace Hull.Core.Defects;

/// <summary>
/// E_f(X^q; E_F, Δμ) = [E(X^q) − E(bulk)] − Σ n_i(μ_i^ref + Δμ_i) + q(E_VBM + E_F) + E_lat − qΔV, term by term (eV).
/// </summary>
/// <param name="Defect">The defect's name.</param>
/// <param name="Charge">q (e).</param>
/// <param name="FermiLevelEv">E_F above the bulk VBM.</param>
/// <param name="SupercellDifferenceEv">E(X^q) − E(bulk).</param>
/// <param name="ChemicalPotentialEv">−Σ n_i(μ_i^ref + Δμ_i).</param>
/// <param name="ElectronReservoirEv">q(E_VBM + E_F).</param>
/// <param name="ImageChargeEv">E_lat.</param>
/// <param name="AlignmentEv">−qΔV.</param>
public sealed record FormationEnergy(
    string Defect,
    int Charge,
    double FermiLevelEv,
    double SupercellDifferenceEv,
    double ChemicalPotentialEv,
    double ElectronReservoirEv,
    double ImageChargeEv,
    double AlignmentEv)
{
    /// <summary>E_corr = E_lat − qΔV.</summary>
    public double CorrectionEv => ImageChargeEv + AlignmentEv;

    /// <summary>E_f.</summary>
    public double TotalEv => SupercellDifferenceEv + ChemicalPotentialEv + ElectronReservoirEv + CorrectionEv;
}
