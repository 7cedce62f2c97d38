namespace Hull.Core.Optimization;

/// <summary>The role of one column or row (its logical variable, the row activity) in a simplex basis.</summary>
public enum BasisStatus
{
    /// <summary>In the basis: its value is determined by the others.</summary>
    Basic,

    /// <summary>Non-basic at its lower bound (also a fixed variable, whose bounds are equal).</summary>
    AtLower,

    /// <summary>Non-basic at its upper bound.</summary>
    AtUpper,

    /// <summary>Non-basic free variable (no finite bound), held at zero.</summary>
    FreeAtZero,
}
