namespace Hull.Core.Optimization;

/// <summary>Why the simplex method stopped, in more detail than <see cref="LinearProgramStatus"/>.</summary>
public enum SimplexStopReason
{
    /// <summary>No column has an improving reduced cost at a primal-feasible basis.</summary>
    NoImprovingColumn,

    /// <summary>The sum of bound violations cannot be reduced further and is still above the feasibility tolerance.</summary>
    InfeasibilityCannotBeReduced,

    /// <summary>An improving column can move without limit: no row or bound blocks it.</summary>
    NoBlockingBound,

    /// <summary>The configured iteration limit was reached.</summary>
    IterationLimitReached,

    /// <summary>The model failed validation before any iteration.</summary>
    ModelRejected,

    /// <summary>Refactorising the basis found it singular.</summary>
    SingularBasis,
}
