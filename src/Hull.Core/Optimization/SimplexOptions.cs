namespace Hull.Core.Optimization;

/// <summary>Settings of one solve. Tolerances are fixed (<see cref="SimplexTolerances"/>); only the budget is a choice.</summary>
public sealed record SimplexOptions
{
    public static SimplexOptions Default { get; } = new();

    /// <summary>
    /// Most simplex iterations before the solve stops with <see cref="LinearProgramStatus.IterationLimit"/>; null
    /// for <see cref="SimplexTolerances.DefaultIterationLimit"/> of the program's size.
    /// </summary>
    public int? IterationLimit { get; init; }
}
