namespace Hull.Core.Optimization;

/// <summary>What is wrong with a linear program that cannot be solved as given.</summary>
public enum ModelIssueKind
{
    /// <summary>An array's length does not match the row or column count.</summary>
    DimensionMismatch,

    /// <summary>An objective coefficient is NaN or infinite.</summary>
    NonFiniteObjective,

    /// <summary>A constraint coefficient is NaN or infinite.</summary>
    NonFiniteCoefficient,

    /// <summary>A row or column bound is NaN.</summary>
    NaNBound,

    /// <summary>A lower bound is +∞ or an upper bound is −∞: no finite value can satisfy it.</summary>
    UnsatisfiableInfiniteBound,

    /// <summary>A row's lower bound exceeds its upper bound.</summary>
    InconsistentRowBounds,

    /// <summary>A column's lower bound exceeds its upper bound.</summary>
    InconsistentColumnBounds,
}
