namespace Hull.Core.Defects;

/// <summary>Whether a transition level is one the defect passes through in equilibrium.</summary>
public enum TransitionLevelKind
{
    /// <summary>Between the two lowest-energy states on either side: a break of the lowest-energy line.</summary>
    Thermodynamic = 0,

    /// <summary>Between two states at least one of which is not the lowest there (metastable, e.g. the single-electron levels of a negative-U defect).</summary>
    NotGround = 1,
}
