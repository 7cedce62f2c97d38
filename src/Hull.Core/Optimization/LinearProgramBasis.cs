using System.Collections.Immutable;

namespace Hull.Core.Optimization;

/// <summary>
/// A simplex basis: the status of every column and of every row's logical variable (its activity A_i·x). Taken
/// from a <see cref="LinearProgramResult"/> and handed to the next solve of a changed program of the same shape
/// (other bounds, objective or coefficients), it starts the simplex method where the last one ended, which takes
/// far fewer iterations when the change is small. A basis that does not fit the new program numerically
/// (singular, or not exactly one basic variable per row) is set aside and the solve starts cold; the result says
/// which happened.
/// </summary>
public sealed class LinearProgramBasis
{
    public LinearProgramBasis(IEnumerable<BasisStatus> columnStatuses, IEnumerable<BasisStatus> rowStatuses)
    {
        ArgumentNullException.ThrowIfNull(columnStatuses);
        ArgumentNullException.ThrowIfNull(rowStatuses);
        ColumnStatuses = [.. columnStatuses];
        RowStatuses = [.. rowStatuses];
    }

    /// <summary>Status of each column.</summary>
    public ImmutableArray<BasisStatus> ColumnStatuses { get; }

    /// <summary>Status of each row's logical variable: Basic means the row is not held at a bound by the basis.</summary>
    public ImmutableArray<BasisStatus> RowStatuses { get; }

    public int ColumnCount => ColumnStatuses.Length;

    public int RowCount => RowStatuses.Length;

    /// <summary>
    /// This basis for the program with <paramref name="count"/> rows appended (<see cref="LinearProgram.WithRowAppended"/>):
    /// the new rows' logical variables are basic, so the basis stays square and non-singular. If the old optimum
    /// violates a new row, the next solve starts from this basis in its feasibility phase.
    /// </summary>
    public LinearProgramBasis WithRowsAppended(int count)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(count);
        return new LinearProgramBasis(ColumnStatuses, RowStatuses.Concat(Enumerable.Repeat(BasisStatus.Basic, count)));
    }
}
