using Hull.Core.Defects;

namespace Hull.Server.Defects;

/// <summary>
/// The study file's "carriers" block: the bands' states, the gap's temperature dependence and fully ionised extra
/// donors and acceptors. Statistics and concentration form are the caller's choice per request, so they are not here.
/// </summary>
/// <param name="Bands">Parabolic bands (N_c/N_v at 300 K or density-of-states masses) or a tabulated density of states.</param>
/// <param name="GapTemperature">The gap's Varshni dependence; null for a fixed gap.</param>
/// <param name="ExtraDonorsPerCubicCentimetre">Fully ionised donors outside the study (cm^-3).</param>
/// <param name="ExtraAcceptorsPerCubicCentimetre">Fully ionised acceptors outside the study (cm^-3).</param>
public sealed record StudyCarriers(
    BandStates Bands,
    GapTemperatureDependence? GapTemperature,
    double ExtraDonorsPerCubicCentimetre,
    double ExtraAcceptorsPerCubicCentimetre)
{
    /// <summary>The carrier model for one request.</summary>
    public CarrierModel Model(CarrierStatistics statistics, ConcentrationForm form) =>
        new(Bands, statistics, form, ExtraDonorsPerCubicCentimetre, ExtraAcceptorsPerCubicCentimetre, GapTemperature);
}
