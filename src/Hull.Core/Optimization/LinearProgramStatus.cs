namespace Hull.Core.Optimization;

/// <summary>How a solve of a <see cref="LinearProgram"/> ended.</summary>
public enum LinearProgramStatus
{
    /// <summary>An optimal basic solution was found; primal values and duals are valid.</summary>
    Optimal,

    /// <summary>No point satisfies every row and column bound (within the feasibility tolerance).</summary>
    Infeasible,

    /// <summary>Feasible, but the objective improves without limit along <see cref="LinearProgramResult.UnboundedRay"/>.</summary>
    Unbounded,

    /// <summary>The iteration limit was reached first; the last basis is returned and can warm-start a further solve.</summary>
    IterationLimit,

    /// <summary>The model has a defect (<see cref="LinearProgramResult.Issue"/>); nothing was solved.</summary>
    InvalidModel,

    /// <summary>The basis became numerically singular and could not be repaired; the last usable basis is returned.</summary>
    NumericalFailure,
}
