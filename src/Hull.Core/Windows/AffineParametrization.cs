namespace Hull.Core.Windows;

/// <summary>
/// The solutions of <c>E x = f</c> written as <c>x[pivot] = Offset[pivot] − Σ_free Coupling[pivot, free]·x[free]</c>:
/// the free coordinates parametrize the affine subspace. Built by Gauss–Jordan elimination with pivots chosen by
/// size (the caller's preferred coordinates first); a dependent equality is dropped when consistent.
/// </summary>
internal sealed class AffineParametrization
{
    private AffineParametrization(int n, int[] pivots, int[] free, double[,] coupling, double[] offset, bool consistent)
    {
        CoordinateCount = n;
        Pivots = pivots;
        Free = free;
        _coupling = coupling;
        _offset = offset;
        IsConsistent = consistent;
    }

    private readonly double[,] _coupling;
    private readonly double[] _offset;

    public int CoordinateCount { get; }

    /// <summary>Coordinates expressed through the free ones, one per independent equality.</summary>
    public int[] Pivots { get; }

    /// <summary>The free coordinates, ascending: the parameters.</summary>
    public int[] Free { get; }

    /// <summary>False when the equalities contradict each other (the polytope is empty).</summary>
    public bool IsConsistent { get; }

    public static AffineParametrization Of(int n, IReadOnlyList<HalfSpace> equalities, IReadOnlyList<int> preferred)
    {
        int r = equalities.Count;
        var m = new double[r, n + 1];
        var scale = new double[r];
        for (int i = 0; i < r; i++)
        {
            double norm = Math.Sqrt(equalities[i].Normal.Sum(v => v * v));
            scale[i] = norm > 0 ? 1.0 / norm : 1.0;
            for (int j = 0; j < n; j++) m[i, j] = equalities[i].Normal[j] * scale[i];
            m[i, n] = equalities[i].Bound * scale[i];
        }

        var pivots = new List<int>();
        var pivotRows = new List<int>();
        var used = new bool[n];
        var rowDone = new bool[r];
        bool consistent = true;
        for (int step = 0; step < r; step++)
        {
            // Largest entry over the remaining rows; a preferred coordinate wins when it is not much smaller.
            int bestRow = -1, bestCol = -1;
            double best = 0;
            for (int i = 0; i < r; i++)
            {
                if (rowDone[i]) continue;
                for (int j = 0; j < n; j++)
                {
                    if (!used[j] && Math.Abs(m[i, j]) > best) { best = Math.Abs(m[i, j]); bestRow = i; bestCol = j; }
                }
            }

            if (best <= PolytopeTolerances.RankPivot)
            {
                for (int i = 0; i < r; i++)
                {
                    if (!rowDone[i] && Math.Abs(m[i, n]) > PolytopeTolerances.SlackEv) consistent = false;
                }

                break;
            }

            foreach (int p in preferred)
            {
                if (used[p]) continue;
                int row = -1;
                double size = 0;
                for (int i = 0; i < r; i++)
                {
                    if (!rowDone[i] && Math.Abs(m[i, p]) > size) { size = Math.Abs(m[i, p]); row = i; }
                }

                // A preferred pivot a hundred times smaller than the largest still keeps the elimination stable
                // for the few, well-scaled rows used here.
                if (size >= best * 1e-2) { bestRow = row; bestCol = p; }
                break;
            }

            rowDone[bestRow] = true;
            used[bestCol] = true;
            double pivot = m[bestRow, bestCol];
            for (int j = 0; j <= n; j++) m[bestRow, j] /= pivot;
            for (int i = 0; i < r; i++)
            {
                if (i == bestRow || m[i, bestCol] == 0) continue;
                double factor = m[i, bestCol];
                for (int j = 0; j <= n; j++) m[i, j] -= factor * m[bestRow, j];
                m[i, bestCol] = 0;
            }

            pivots.Add(bestCol);
            pivotRows.Add(bestRow);
        }

        int[] free = Enumerable.Range(0, n).Where(j => !used[j]).ToArray();
        var coupling = new double[n, free.Length];
        var offset = new double[n];
        for (int k = 0; k < pivots.Count; k++)
        {
            offset[pivots[k]] = m[pivotRows[k], n];
            for (int f = 0; f < free.Length; f++) coupling[pivots[k], f] = m[pivotRows[k], free[f]];
        }

        return new AffineParametrization(n, pivots.ToArray(), free, coupling, offset, consistent);
    }

    /// <summary>The full point for parameters <paramref name="y"/> (one per free coordinate).</summary>
    public double[] Point(ReadOnlySpan<double> y)
    {
        var x = new double[CoordinateCount];
        for (int f = 0; f < Free.Length; f++) x[Free[f]] = y[f];
        foreach (int p in Pivots)
        {
            double v = _offset[p];
            for (int f = 0; f < Free.Length; f++) v -= _coupling[p, f] * y[f];
            x[p] = v;
        }

        return x;
    }

    /// <summary>
    /// The constraint <c>a·x ≤ b</c> in the parameters: <c>a'·y ≤ b'</c>; the result is scaled to a unit normal
    /// (false when the normal vanishes, i.e. the constraint is constant on the subspace, with <paramref name="bound"/>
    /// then its slack).
    /// </summary>
    public bool Restrict(ReadOnlySpan<double> a, double b, double[] normal, out double bound)
    {
        double rhs = b;
        for (int f = 0; f < Free.Length; f++) normal[f] = a[Free[f]];
        foreach (int p in Pivots)
        {
            double ap = a[p];
            if (ap == 0) continue;
            rhs -= ap * _offset[p];
            for (int f = 0; f < Free.Length; f++) normal[f] -= ap * _coupling[p, f];
        }

        double norm = 0;
        for (int f = 0; f < Free.Length; f++) norm += normal[f] * normal[f];
        norm = Math.Sqrt(norm);
        if (norm <= PolytopeTolerances.RankPivot)
        {
            bound = rhs;
            return false;
        }

        for (int f = 0; f < Free.Length; f++) normal[f] /= norm;
        bound = rhs / norm;
        return true;
    }
}
