namespace Hull.Core.Defects;

/// <summary>How defect concentrations follow from formation energies.</summary>
public enum ConcentrationForm
{
    /// <summary>c = N_sites g e^{−E_f/k_BT}, each charge state alone: right while every c ≪ N_sites.</summary>
    Dilute = 0,

    /// <summary>
    /// c_i = N g_i e^{−E_i/k_BT} / (1 + Σ_j g_j e^{−E_j/k_BT}), the sum over every defect and charge state of one site
    /// set: a site holds at most one defect, so concentrations saturate at the site density (near solubility limits).
    /// A complex counts against the one site set it declares.
    /// </summary>
    SiteBlocking = 1,
}
