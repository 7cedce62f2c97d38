using Hull.Core.Geometry;

namespace Hull.Core.Optimization;

/// <summary>
/// The explicit inverse of a dense m × m basis matrix: rebuilt from an LU factorisation with partial pivoting
/// (<see cref="Refactor"/>) and updated in O(m²) per basis change in between (<see cref="Replace"/>). Dense is
/// right for this project's programs (rows are components, elements or defect species: tens, not thousands).
/// </summary>
internal sealed class BasisInverse
{
    private readonly int _m;
    private readonly double[] _inverse;
    private readonly double[] _lu;
    private readonly int[] _pivots;
    private readonly double[] _unit;

    public BasisInverse(int m)
    {
        _m = m;
        _inverse = new double[m * m];
        _lu = new double[m * m];
        _pivots = new int[m];
        _unit = new double[m];
    }

    /// <summary>Updates since the last fresh factorisation.</summary>
    public int UpdatesSinceRefactor { get; private set; }

    /// <summary>
    /// Inverts B, given column by column (<paramref name="fillColumn"/>(position, target) writes basis column
    /// <c>position</c>); false when B is singular (a pivot below <see cref="SimplexTolerances.SingularPivot"/>
    /// relative to its column), leaving the previous inverse unusable.
    /// </summary>
    public bool Refactor(Action<int, Span<double>> fillColumn)
    {
        int m = _m;
        Span<double> column = m <= 256 ? stackalloc double[m] : new double[m];
        Span<double> columnScale = m <= 256 ? stackalloc double[m] : new double[m];
        for (int p = 0; p < m; p++)
        {
            fillColumn(p, column);
            double scale = 0;
            for (int r = 0; r < m; r++)
            {
                _lu[r * m + p] = column[r];
                scale = Math.Max(scale, Math.Abs(column[r]));
            }
            if (scale == 0) return false;
            columnScale[p] = scale;
        }
        SmallLinearSolver.Factorize(_lu, m, _pivots);
        for (int p = 0; p < m; p++)
        {
            double pivot = _lu[p * m + p];
            if (!double.IsFinite(pivot) || Math.Abs(pivot) <= SimplexTolerances.SingularPivot * columnScale[p]) return false;
        }
        for (int r = 0; r < m; r++)
        {
            Array.Clear(_unit);
            _unit[r] = 1.0;
            SmallLinearSolver.Solve(_lu, m, _pivots, _unit);
            // _unit is column r of the inverse.
            for (int p = 0; p < m; p++) _inverse[p * m + r] = _unit[p];
        }
        UpdatesSinceRefactor = 0;
        return true;
    }

    /// <summary>B⁻¹[position, row].</summary>
    public double this[int position, int row] => _inverse[position * _m + row];

    /// <summary>Row <paramref name="position"/> of B⁻¹.</summary>
    public ReadOnlySpan<double> Row(int position) => _inverse.AsSpan(position * _m, _m);

    /// <summary>The basis with column <paramref name="position"/> replaced by a column whose coordinates B⁻¹a are <paramref name="alpha"/>.</summary>
    public void Replace(int position, ReadOnlySpan<double> alpha)
    {
        int m = _m;
        double pivot = alpha[position];
        var pivotRow = _inverse.AsSpan(position * m, m);
        for (int c = 0; c < m; c++) pivotRow[c] /= pivot;
        for (int r = 0; r < m; r++)
        {
            if (r == position || alpha[r] == 0.0) continue;
            double factor = alpha[r];
            var row = _inverse.AsSpan(r * m, m);
            for (int c = 0; c < m; c++) row[c] -= factor * pivotRow[c];
        }
        UpdatesSinceRefactor++;
    }
}
