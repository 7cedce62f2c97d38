namespace Hull.Core.Optimization;

/// <summary>
/// Builds a <see cref="LinearProgram"/> column by column and row by row, for callers that think in named
/// variables and constraints rather than in a matrix. Not thread-safe; <see cref="Build"/> copies, so the builder
/// can go on growing afterwards.
/// </summary>
public sealed class LinearProgramBuilder
{
    private readonly List<double> _objective = [];
    private readonly List<double> _columnLower = [];
    private readonly List<double> _columnUpper = [];
    private readonly List<(int Column, double Value)[]> _rows = [];
    private readonly List<double> _rowLower = [];
    private readonly List<double> _rowUpper = [];

    public LinearProgramBuilder(ObjectiveSense sense) => Sense = sense;

    public ObjectiveSense Sense { get; }

    public int ColumnCount => _objective.Count;

    public int RowCount => _rows.Count;

    /// <summary>Adds a variable with objective coefficient <paramref name="cost"/> and bounds (default x ≥ 0); returns its column index.</summary>
    public int AddColumn(double cost, double lower = 0.0, double upper = double.PositiveInfinity)
    {
        _objective.Add(cost);
        _columnLower.Add(lower);
        _columnUpper.Add(upper);
        return _objective.Count - 1;
    }

    /// <summary>
    /// Adds lower ≤ Σ value·x_column ≤ upper over existing columns (a column named twice adds up); returns the row index.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">A term names a column not added yet.</exception>
    public int AddRow(ReadOnlySpan<(int Column, double Value)> terms, double lower, double upper)
    {
        for (int t = 0; t < terms.Length; t++)
        {
            if ((uint)terms[t].Column >= (uint)ColumnCount)
            {
                throw new ArgumentOutOfRangeException(nameof(terms), $"Term {t} of row {RowCount} names column {terms[t].Column}; there are {ColumnCount} columns.");
            }
        }
        _rows.Add(terms.ToArray());
        _rowLower.Add(lower);
        _rowUpper.Add(upper);
        return _rows.Count - 1;
    }

    /// <summary>Adds Σ value·x = rhs.</summary>
    public int AddEquality(ReadOnlySpan<(int Column, double Value)> terms, double rhs) => AddRow(terms, rhs, rhs);

    /// <summary>The program as built so far.</summary>
    public LinearProgram Build()
    {
        int m = RowCount, n = ColumnCount;
        var matrix = new double[m * n];
        for (int i = 0; i < m; i++)
        {
            foreach (var (column, value) in _rows[i]) matrix[i * n + column] += value;
        }
        return LinearProgram.FromOwnedArrays(Sense, m, n, [.. _objective], matrix, [.. _rowLower], [.. _rowUpper], [.. _columnLower], [.. _columnUpper]);
    }
}
