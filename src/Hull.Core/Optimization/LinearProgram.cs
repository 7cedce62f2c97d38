namespace Hull.Core.Optimization;

/// <summary>
/// A dense linear program: minimise or maximise c·x subject to rowLower ≤ A x ≤ rowUpper and
/// columnLower ≤ x ≤ columnUpper. An equality is a row with equal bounds, a one-sided inequality has an infinite
/// bound on the other side (<see cref="double.PositiveInfinity"/> / <see cref="double.NegativeInfinity"/>), a free
/// column has both column bounds infinite and a fixed one equal bounds.
/// </summary>
/// <remarks>
/// Immutable: the arrays given are copied. Construction accepts any values so that a bad model can be reported
/// rather than thrown; <see cref="FindIssue"/> (which every solve calls first) names the first defect: wrong
/// lengths, NaN or infinite coefficients, NaN bounds, a lower bound of +∞ or an upper bound of −∞, or a lower bound
/// above the upper one. Results and bases are kept apart from the model (<see cref="LinearProgramResult"/>,
/// <see cref="LinearProgramBasis"/>), so one model can be solved from several starting bases.
/// </remarks>
public sealed class LinearProgram
{
    private readonly double[] _objective;
    private readonly double[] _matrix;
    private readonly double[] _rowLower;
    private readonly double[] _rowUpper;
    private readonly double[] _columnLower;
    private readonly double[] _columnUpper;
    private readonly Lazy<ModelIssue?> _issue;

    /// <param name="sense">Minimise or maximise.</param>
    /// <param name="objective">c, one coefficient per column.</param>
    /// <param name="matrix">A, [row, column]; its dimensions define the row and column counts.</param>
    /// <param name="rowLower">Lower bound of each row's activity A_i·x (−∞ for none).</param>
    /// <param name="rowUpper">Upper bound of each row's activity (+∞ for none).</param>
    /// <param name="columnLower">Lower bound of each column (−∞ for none).</param>
    /// <param name="columnUpper">Upper bound of each column (+∞ for none).</param>
    public LinearProgram(ObjectiveSense sense, double[] objective, double[,] matrix, double[] rowLower, double[] rowUpper,
        double[] columnLower, double[] columnUpper)
    {
        ArgumentNullException.ThrowIfNull(objective);
        ArgumentNullException.ThrowIfNull(matrix);
        ArgumentNullException.ThrowIfNull(rowLower);
        ArgumentNullException.ThrowIfNull(rowUpper);
        ArgumentNullException.ThrowIfNull(columnLower);
        ArgumentNullException.ThrowIfNull(columnUpper);
        Sense = sense;
        RowCount = matrix.GetLength(0);
        ColumnCount = matrix.GetLength(1);
        _matrix = new double[RowCount * ColumnCount];
        for (int i = 0; i < RowCount; i++)
        {
            for (int j = 0; j < ColumnCount; j++) _matrix[i * ColumnCount + j] = matrix[i, j];
        }
        _objective = (double[])objective.Clone();
        _rowLower = (double[])rowLower.Clone();
        _rowUpper = (double[])rowUpper.Clone();
        _columnLower = (double[])columnLower.Clone();
        _columnUpper = (double[])columnUpper.Clone();
        _issue = new Lazy<ModelIssue?>(Validate);
    }

    /// <summary>Takes ownership of already copied row-major arrays (the builder and the With methods).</summary>
    private LinearProgram(ObjectiveSense sense, int rowCount, int columnCount, double[] objective, double[] matrix,
        double[] rowLower, double[] rowUpper, double[] columnLower, double[] columnUpper)
    {
        Sense = sense;
        RowCount = rowCount;
        ColumnCount = columnCount;
        _objective = objective;
        _matrix = matrix;
        _rowLower = rowLower;
        _rowUpper = rowUpper;
        _columnLower = columnLower;
        _columnUpper = columnUpper;
        _issue = new Lazy<ModelIssue?>(Validate);
    }

    internal static LinearProgram FromOwnedArrays(ObjectiveSense sense, int rowCount, int columnCount, double[] objective,
        double[] matrixRowMajor, double[] rowLower, double[] rowUpper, double[] columnLower, double[] columnUpper) =>
        new(sense, rowCount, columnCount, objective, matrixRowMajor, rowLower, rowUpper, columnLower, columnUpper);

    public ObjectiveSense Sense { get; }

    /// <summary>Number of constraint rows (the first dimension of the matrix).</summary>
    public int RowCount { get; }

    /// <summary>Number of columns, i.e. variables (the second dimension of the matrix).</summary>
    public int ColumnCount { get; }

    public ReadOnlySpan<double> Objective => _objective;

    public ReadOnlySpan<double> RowLower => _rowLower;

    public ReadOnlySpan<double> RowUpper => _rowUpper;

    public ReadOnlySpan<double> ColumnLower => _columnLower;

    public ReadOnlySpan<double> ColumnUpper => _columnUpper;

    /// <summary>A_ij.</summary>
    public double Coefficient(int row, int column)
    {
        if ((uint)row >= (uint)RowCount) throw new ArgumentOutOfRangeException(nameof(row), row, $"The program has {RowCount} rows.");
        if ((uint)column >= (uint)ColumnCount) throw new ArgumentOutOfRangeException(nameof(column), column, $"The program has {ColumnCount} columns.");
        return _matrix[row * ColumnCount + column];
    }

    /// <summary>Row i of A.</summary>
    public ReadOnlySpan<double> Row(int row)
    {
        if ((uint)row >= (uint)RowCount) throw new ArgumentOutOfRangeException(nameof(row), row, $"The program has {RowCount} rows.");
        return _matrix.AsSpan(row * ColumnCount, ColumnCount);
    }

    /// <summary>A, row-major, for the solver.</summary>
    internal double[] MatrixRowMajor => _matrix;

    /// <summary>The first defect of the model, or null when it can be solved. Checked once and remembered.</summary>
    public ModelIssue? FindIssue() => _issue.Value;

    /// <summary>The same program with row i's bounds replaced (the shape is kept, so a basis of this one warm-starts it).</summary>
    public LinearProgram WithRowBounds(int row, double lower, double upper)
    {
        if ((uint)row >= (uint)RowCount) throw new ArgumentOutOfRangeException(nameof(row), row, $"The program has {RowCount} rows.");
        var rl = (double[])_rowLower.Clone();
        var ru = (double[])_rowUpper.Clone();
        rl[row] = lower;
        ru[row] = upper;
        return new(Sense, RowCount, ColumnCount, _objective, _matrix, rl, ru, _columnLower, _columnUpper);
    }

    /// <summary>The same program with column j's bounds replaced.</summary>
    public LinearProgram WithColumnBounds(int column, double lower, double upper)
    {
        if ((uint)column >= (uint)ColumnCount) throw new ArgumentOutOfRangeException(nameof(column), column, $"The program has {ColumnCount} columns.");
        var cl = (double[])_columnLower.Clone();
        var cu = (double[])_columnUpper.Clone();
        cl[column] = lower;
        cu[column] = upper;
        return new(Sense, RowCount, ColumnCount, _objective, _matrix, _rowLower, _rowUpper, cl, cu);
    }

    /// <summary>The same program with another objective (one coefficient per column) and sense.</summary>
    public LinearProgram WithObjective(ObjectiveSense sense, double[] objective)
    {
        ArgumentNullException.ThrowIfNull(objective);
        return new(sense, RowCount, ColumnCount, (double[])objective.Clone(), _matrix, _rowLower, _rowUpper, _columnLower, _columnUpper);
    }

    /// <summary>
    /// The program with one more row (coefficients one per column) appended after the others; a basis of this
    /// program warm-starts the new one through <see cref="LinearProgramBasis.WithRowsAppended"/>.
    /// </summary>
    public LinearProgram WithRowAppended(ReadOnlySpan<double> coefficients, double lower, double upper)
    {
        if (coefficients.Length != ColumnCount)
        {
            throw new ArgumentException($"The new row has {coefficients.Length} coefficients; the program has {ColumnCount} columns.", nameof(coefficients));
        }
        var matrix = new double[(RowCount + 1) * ColumnCount];
        _matrix.CopyTo(matrix, 0);
        coefficients.CopyTo(matrix.AsSpan(RowCount * ColumnCount, ColumnCount));
        return new(Sense, RowCount + 1, ColumnCount, _objective, matrix, [.. _rowLower, lower], [.. _rowUpper, upper], _columnLower, _columnUpper);
    }

    private ModelIssue? Validate()
    {
        if (_objective.Length != ColumnCount)
        {
            return new ModelIssue(ModelIssueKind.DimensionMismatch, -1, -1,
                $"The objective has {_objective.Length} coefficients; the matrix has {ColumnCount} columns.");
        }
        foreach (var (name, array, count) in new[]
        {
            ("row lower bounds", _rowLower, RowCount), ("row upper bounds", _rowUpper, RowCount),
            ("column lower bounds", _columnLower, ColumnCount), ("column upper bounds", _columnUpper, ColumnCount),
        })
        {
            if (array.Length != count)
            {
                string what = count == RowCount && name.StartsWith("row", StringComparison.Ordinal) ? "rows" : "columns";
                return new ModelIssue(ModelIssueKind.DimensionMismatch, -1, -1, $"There are {array.Length} {name}; the matrix has {count} {what}.");
            }
        }
        for (int j = 0; j < ColumnCount; j++)
        {
            if (!double.IsFinite(_objective[j]))
            {
                return new ModelIssue(ModelIssueKind.NonFiniteObjective, -1, j, $"Objective coefficient of column {j} is {_objective[j]}.");
            }
        }
        for (int i = 0; i < RowCount; i++)
        {
            for (int j = 0; j < ColumnCount; j++)
            {
                double a = _matrix[i * ColumnCount + j];
                if (!double.IsFinite(a)) return new ModelIssue(ModelIssueKind.NonFiniteCoefficient, i, j, $"Coefficient of row {i}, column {j} is {a}.");
            }
        }
        for (int i = 0; i < RowCount; i++)
        {
            if (BoundIssue(_rowLower[i], _rowUpper[i], $"row {i}") is { } issue)
            {
                return new ModelIssue(issue.Kind == ModelIssueKind.InconsistentColumnBounds ? ModelIssueKind.InconsistentRowBounds : issue.Kind, i, -1, issue.Message);
            }
        }
        for (int j = 0; j < ColumnCount; j++)
        {
            if (BoundIssue(_columnLower[j], _columnUpper[j], $"column {j}") is { } issue) return issue with { Column = j };
        }
        return null;
    }

    /// <summary>The defect of one pair of bounds (kind InconsistentColumnBounds for lower above upper), or null.</summary>
    private static ModelIssue? BoundIssue(double lower, double upper, string where)
    {
        if (double.IsNaN(lower)) return new ModelIssue(ModelIssueKind.NaNBound, -1, -1, $"Lower bound of {where} is NaN.");
        if (double.IsNaN(upper)) return new ModelIssue(ModelIssueKind.NaNBound, -1, -1, $"Upper bound of {where} is NaN.");
        if (double.IsPositiveInfinity(lower)) return new ModelIssue(ModelIssueKind.UnsatisfiableInfiniteBound, -1, -1, $"Lower bound of {where} is +∞.");
        if (double.IsNegativeInfinity(upper)) return new ModelIssue(ModelIssueKind.UnsatisfiableInfiniteBound, -1, -1, $"Upper bound of {where} is −∞.");
        if (lower > upper)
        {
            return new ModelIssue(ModelIssueKind.InconsistentColumnBounds, -1, -1, $"Lower bound of {where} ({lower:R}) exceeds its upper bound ({upper:R}).");
        }
        return null;
    }
}
