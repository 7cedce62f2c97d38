namespace Hull.Core.Defects;

/// <summary>One defect of a study, as given (checked by <see cref="DefectStudy.Create"/>).</summary>
/// <param name="Name">Unique within the study (e.g. "V_O", "Ga_Zn", "V_Zn-Ga_Zn").</param>
/// <param name="Kind">Vacancy, interstitial, antisite, substitution or complex.</param>
/// <param name="AtomsExchanged">n_i per element: atoms added (&gt; 0) and removed (&lt; 0).</param>
/// <param name="SiteSet">The set of lattice sites the defect occupies (defects on one set compete for its sites).</param>
/// <param name="Sites">How many such sites there are.</param>
/// <param name="Degeneracy">Spin, orbital and orientational degeneracy, a positive number.</param>
/// <param name="PositionFractional">Where the defect sits in the supercell (fractional), the centre of the model charge.</param>
/// <param name="ChargeStates">Every charge state calculated, each charge once.</param>
/// <param name="Constituents">For a complex: the names of the defects it is made of (a defect may appear twice).</param>
public sealed record DefectInput(
    string Name,
    DefectKind Kind,
    IReadOnlyDictionary<string, int> AtomsExchanged,
    string SiteSet,
    SiteDensity Sites,
    double Degeneracy,
    Vector3D PositionFractional,
    IReadOnlyList<ChargeStateInput> ChargeStates,
    IReadOnlyList<string>? Constituents = null);
