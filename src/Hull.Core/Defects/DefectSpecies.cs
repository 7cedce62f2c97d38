namespace Hull.Core.Defects;

/// <summary>
/// One defect as carrier statistics see it: where it sits, how many sites there are, and the line
/// E_f(q; E_F) = a_q + q E_F of each charge state with its degeneracy.
/// </summary>
/// <param name="Name">The defect's name.</param>
/// <param name="SiteSet">The site set it competes for (site blocking).</param>
/// <param name="SitesPerCubicCentimetre">N_sites (cm^-3).</param>
/// <param name="ChargeStates">Each charge state's intercept and degeneracy.</param>
/// <param name="AtomsExchanged">n_i per element (added &gt; 0), for dopant totals.</param>
public sealed record DefectSpecies(
    string Name,
    string SiteSet,
    double SitesPerCubicCentimetre,
    IReadOnlyList<SpeciesChargeState> ChargeStates,
    IReadOnlyDictionary<string, int> AtomsExchanged);
