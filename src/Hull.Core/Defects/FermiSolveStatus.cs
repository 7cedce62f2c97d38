namespace Hull.Core.Defects;

/// <summary>Why a charge-neutrality solve stopped.</summary>
public enum FermiSolveStatus
{
    /// <summary>The Fermi level is bracketed to <see cref="ChargeNeutrality.FermiLevelToleranceEv"/>.</summary>
    Converged = 0,

    /// <summary>
    /// No Fermi level up to <see cref="ChargeNeutrality.BracketReachEv"/> beyond either band edge balances the charge
    /// (a tabulated band holds fewer states than the fixed charge needs); the reported level is the edge of the search.
    /// </summary>
    NoNeutralLevel = 1,

    /// <summary>The iteration limit was reached; the reported level is the best estimate.</summary>
    IterationLimit = 2,
}
