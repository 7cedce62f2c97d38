using System.Collections.Immutable;

namespace Hull.Core.Optimization;

/// <summary>
/// The outcome of one solve, kept apart from the <see cref="LinearProgram"/>. The arrays are always present with
/// the program's shape (empty only for an <see cref="LinearProgramStatus.InvalidModel"/> whose dimensions do not
/// fit); the flags say which of them mean something.
/// </summary>
/// <remarks>
/// <para>Sign convention of the duals, the same for minimisation and maximisation: <see cref="RowDuals"/>[i] is the
/// rate of change of the optimal objective per unit increase of row i's active bound (zero for a row whose
/// activity lies strictly between its bounds), and <see cref="ReducedCosts"/>[j] = c_j − Σ_i RowDuals[i]·A_ij, the
/// rate per unit increase of column j's active bound. For a minimisation, a row at its lower bound has a dual ≥ 0
/// and one at its upper bound a dual ≤ 0; a column at its lower bound has a reduced cost ≥ 0. For a maximisation
/// the signs are reversed.</para>
/// <para>Which dual, where it is not unique: at a degenerate optimum (a basic variable at a bound) the optimal
/// duals form a set, and the one returned is the basic dual solution of the final basis, y = c_B B⁻¹, a vertex of
/// that set; which vertex depends on the pivoting path. Callers that need the whole set (a range of
/// chemical potentials, say) must explore it with further programs, e.g. by optimising over the dual constraints.</para>
/// </remarks>
public sealed class LinearProgramResult
{
    internal LinearProgramResult(LinearProgramStatus status, SimplexStopReason stopReason, string message)
    {
        Status = status;
        StopReason = stopReason;
        Message = message;
    }

    public LinearProgramStatus Status { get; }

    /// <summary>Why the method stopped.</summary>
    public SimplexStopReason StopReason { get; }

    /// <summary>The outcome in words, naming the column or row concerned where there is one.</summary>
    public string Message { get; }

    /// <summary>The model's defect when <see cref="Status"/> is <see cref="LinearProgramStatus.InvalidModel"/>, else null.</summary>
    public ModelIssue? Issue { get; internal init; }

    /// <summary>c·x at <see cref="ColumnValues"/> in the program's own sense (NaN when there are no primal values).</summary>
    public double ObjectiveValue { get; internal init; } = double.NaN;

    /// <summary>x, one value per column: the last basic solution (optimal when <see cref="Status"/> is Optimal).</summary>
    public ImmutableArray<double> ColumnValues { get; internal init; } = [];

    /// <summary>A x, one value per row, computed from <see cref="ColumnValues"/>.</summary>
    public ImmutableArray<double> RowActivities { get; internal init; } = [];

    /// <summary>Row duals (see the remarks for the sign); meaningful when <see cref="AreDualsValid"/>.</summary>
    public ImmutableArray<double> RowDuals { get; internal init; } = [];

    /// <summary>Column reduced costs (see the remarks for the sign); meaningful when <see cref="AreDualsValid"/>.</summary>
    public ImmutableArray<double> ReducedCosts { get; internal init; } = [];

    /// <summary>True when <see cref="ColumnValues"/> satisfy every bound within <see cref="SimplexTolerances.PrimalFeasibility"/>.</summary>
    public bool IsPrimalFeasible { get; internal init; }

    /// <summary>True when <see cref="RowDuals"/> and <see cref="ReducedCosts"/> are an optimal dual solution (only at an optimum).</summary>
    public bool AreDualsValid { get; internal init; }

    /// <summary>
    /// When <see cref="Status"/> is Unbounded: a direction d (one entry per column) with x + t·d feasible for every
    /// t ≥ 0 and c·d improving the objective; else empty.
    /// </summary>
    public ImmutableArray<double> UnboundedRay { get; internal init; } = [];

    /// <summary>Simplex iterations of this solve, feasibility phase included.</summary>
    public int Iterations { get; internal init; }

    /// <summary>Of <see cref="Iterations"/>, those spent reaching a feasible basis.</summary>
    public int FeasibilityIterations { get; internal init; }

    /// <summary>Of <see cref="Iterations"/>, those that did not improve the objective of their phase (degenerate pivots).</summary>
    public int DegenerateIterations { get; internal init; }

    /// <summary>Of <see cref="Iterations"/>, those chosen by Bland's rule after a run of degenerate pivots (the anti-cycling safeguard).</summary>
    public int BlandIterations { get; internal init; }

    /// <summary>Whether the starting basis given was used (false: none given, or set aside as singular or not square).</summary>
    public bool WarmStartUsed { get; internal init; }

    /// <summary>The final basis (null for an invalid model), to warm-start the next solve.</summary>
    public LinearProgramBasis? Basis { get; internal init; }

    /// <summary>Largest violation of a row or column bound by <see cref="ColumnValues"/> (NaN without primal values).</summary>
    public double MaxPrimalViolation { get; internal init; } = double.NaN;

    /// <summary>Largest wrong-signed reduced cost or row dual of the final basis (NaN when the duals are not valid).</summary>
    public double MaxDualViolation { get; internal init; } = double.NaN;

    public override string ToString() => $"{Status}: {Message}";
}
