namespace Hull.Core.Defects;

/// <summary>
/// The finite-size correction of one charge state, term by term: E_corr = E_lat − qΔV (eV).
/// </summary>
/// <param name="Charge">q (e).</param>
/// <param name="ImageChargeEv">E_lat: isolated minus periodic energy of the model charge.</param>
/// <param name="Alignment">How ΔV was found and how well defined it is; null when no alignment input was given.</param>
public sealed record FiniteSizeCorrection(int Charge, double ImageChargeEv, AlignmentResult? Alignment)
{
    /// <summary>−qΔV (eV); 0 without alignment input.</summary>
    public double AlignmentEv => Alignment is null ? 0 : -Charge * Alignment.ShiftVolts;

    /// <summary>E_corr = E_lat − qΔV (eV).</summary>
    public double TotalEv => ImageChargeEv + AlignmentEv;

    /// <summary>No correction at all (an uncharged state, or corrections switched off).</summary>
    public static FiniteSizeCorrection None(int charge) => new(charge, 0, null);
}
