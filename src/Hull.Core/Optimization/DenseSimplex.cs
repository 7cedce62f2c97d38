namespace Hull.Core.Optimization;

/// <summary>
/// The project's general linear-programming solver: a bounded primal simplex method on dense data, for the small
/// programs of thermodynamics (chemical-potential windows, dopant limits, reaction energies, open-element hulls,
/// defect equilibria). Call <see cref="Solve"/>; it never throws for an infeasible, unbounded, degenerate or
/// non-converging program but says so in the result.
/// </summary>
/// <remarks>
/// <para>Method. Every row gets a logical variable s_i = A_i·x carrying the row's bounds, so the program becomes
/// [A −I](x, s) = 0 with bounds on every variable. The start is the given basis (warm start) or all logicals basic
/// with each column at a finite bound (free columns at zero). A composite feasibility phase minimises the sum of
/// bound violations of the basic variables (costs ±1 re-chosen every iteration, ratio test stopping at the first
/// breakpoint), then the optimality phase minimises c·x (the negated objective for maximisation) from the
/// feasible basis reached; nonbasic variables with two finite bounds may flip between them without a basis
/// change. Pricing is by the largest reduced cost; the ratio test is Harris's two-pass test (among the rows that
/// block within the feasibility tolerance, the largest pivot), which keeps pivots large on degenerate data.
/// After <see cref="SimplexTolerances.DegenerateStepsBeforeBland"/> degenerate steps both choices switch to
/// Bland's smallest-index rule, which cannot cycle, until a step makes progress again.</para>
/// <para>Numerics. The basis inverse is dense, updated per pivot and rebuilt from an LU factorisation with partial
/// pivoting every <see cref="SimplexTolerances.RefactorInterval"/> updates and before any final verdict, with the
/// basic values recomputed from the nonbasic ones, so rounding does not accumulate into a verdict.</para>
/// <para>Duals. See <see cref="LinearProgramResult"/> for the sign convention and for which dual is returned at a
/// degenerate optimum (the final basis's y = c_B B⁻¹).</para>
/// <para>Thread safety: <see cref="Solve"/> is a pure function of its arguments; it may be called from many threads.</para>
/// </remarks>
public static class DenseSimplex
{
    /// <summary>
    /// Solves <paramref name="program"/>, starting from <paramref name="start"/> when given (a basis of a program
    /// of the same shape, typically the last result's <see cref="LinearProgramResult.Basis"/>).
    /// </summary>
    /// <exception cref="ArgumentException">The starting basis has another number of rows or columns than the program.</exception>
    public static LinearProgramResult Solve(LinearProgram program, LinearProgramBasis? start = null, SimplexOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(program);
        if (program.FindIssue() is { } issue)
        {
            return new LinearProgramResult(LinearProgramStatus.InvalidModel, SimplexStopReason.ModelRejected, issue.Message) { Issue = issue };
        }
        if (start is not null && (start.ColumnCount != program.ColumnCount || start.RowCount != program.RowCount))
        {
            throw new ArgumentException(
                $"The starting basis is for {start.RowCount} rows and {start.ColumnCount} columns; the program has {program.RowCount} rows and {program.ColumnCount} columns.",
                nameof(start));
        }
        options ??= SimplexOptions.Default;
        int limit = options.IterationLimit ?? SimplexTolerances.DefaultIterationLimit(program.RowCount, program.ColumnCount);
        if (limit < 0) throw new ArgumentException($"The iteration limit is {limit}; it must be zero or more.", nameof(options));
        return new SimplexRun(program, limit).Run(start);
    }
}
