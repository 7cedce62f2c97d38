namespace Hull.Core.Defects;

/// <summary>All charge states of one defect together.</summary>
/// <param name="Defect">The defect's name.</param>
/// <param name="SiteSet">Its site set.</param>
/// <param name="PerCubicCentimetre">Σ_q c_q (cm^-3).</param>
/// <param name="SiteFraction">Σ_q c_q / N_sites: near 1 the dilute form no longer holds.</param>
public sealed record DefectTotal(string Defect, string SiteSet, double PerCubicCentimetre, double SiteFraction);
