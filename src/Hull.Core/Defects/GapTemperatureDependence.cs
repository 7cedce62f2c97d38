namespace Hull.Core.Defects;

/// <summary>
/// The band gap's change with temperature in the Varshni form, ΔE_g(T) = −α [T²/(T+β) − T_ref²/(T_ref+β)], where the
/// study's gap is the gap at <paramref name="ReferenceTemperatureK"/>. A share of the change moves the VBM, the rest
/// the CBM; E_F and formation energies stay measured from the study's VBM, so a moving VBM moves the hole edge.
/// </summary>
/// <param name="AlphaEvPerK">α (eV/K), positive for a gap that narrows on heating.</param>
/// <param name="BetaK">β (K), ≥ 0.</param>
/// <param name="ReferenceTemperatureK">The temperature of the study's gap (K), ≥ 0.</param>
/// <param name="ValenceBandShare">The fraction of ΔE_g taken by the VBM (0: all at the CBM; 1: all at the VBM).</param>
public sealed record GapTemperatureDependence(double AlphaEvPerK, double BetaK, double ReferenceTemperatureK, double ValenceBandShare)
{
    /// <summary>E_g(T) − E_g(T_ref) (eV).</summary>
    public double GapChangeEv(double temperatureK) =>
        -AlphaEvPerK * (Varshni(temperatureK) - Varshni(ReferenceTemperatureK));

    private double Varshni(double t) => t == 0 ? 0 : t * t / (t + BetaK);
}
