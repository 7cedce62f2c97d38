namespace Hull.Core.Geometry;

/// <summary>
/// LU factorisation with partial pivoting of the small dense matrices the hull works with (one row per facet
/// vertex, at most a few dozen): allocation-free on caller-provided spans, because it runs once per new facet.
/// </summary>
internal static class SmallLinearSolver
{
    /// <summary>
    /// Factorises a (row-major, n x n, overwritten) in place. Returns the determinant; pivots receive the row order.
    /// </summary>
    public static double Factorize(Span<double> a, int n, Span<int> pivots)
    {
        double det = 1.0;
        for (int k = 0; k < n; k++)
        {
            int p = k;
            double best = Math.Abs(a[k * n + k]);
            for (int r = k + 1; r < n; r++)
            {
                double v = Math.Abs(a[r * n + k]);
                if (v > best) { best = v; p = r; }
            }
            pivots[k] = p;
            if (p != k)
            {
                for (int c = 0; c < n; c++) (a[k * n + c], a[p * n + c]) = (a[p * n + c], a[k * n + c]);
                det = -det;
            }
            double pivot = a[k * n + k];
            det *= pivot;
            if (pivot == 0.0) continue;
            for (int r = k + 1; r < n; r++)
            {
                double factor = a[r * n + k] / pivot;
                a[r * n + k] = factor;
                if (factor == 0.0) continue;
                for (int c = k + 1; c < n; c++) a[r * n + c] -= factor * a[k * n + c];
            }
        }
        return det;
    }

    /// <summary>Solves A x = b with a factorisation from <see cref="Factorize"/>; b is overwritten by x.</summary>
    public static void Solve(ReadOnlySpan<double> lu, int n, ReadOnlySpan<int> pivots, Span<double> b)
    {
        for (int k = 0; k < n; k++)
        {
            int p = pivots[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
        }
        for (int r = 1; r < n; r++)
        {
            double s = b[r];
            for (int c = 0; c < r; c++) s -= lu[r * n + c] * b[c];
            b[r] = s;
        }
        for (int r = n - 1; r >= 0; r--)
        {
            double s = b[r];
            for (int c = r + 1; c < n; c++) s -= lu[r * n + c] * b[c];
            b[r] = s / lu[r * n + r];
        }
    }

    /// <summary>Solves A^T x = b with a factorisation of A from <see cref="Factorize"/>; b is overwritten by x.</summary>
    public static void SolveTransposed(ReadOnlySpan<double> lu, int n, ReadOnlySpan<int> pivots, Span<double> b)
    {
        // A = P^T L U, so A^T x = U^T L^T P x = b: solve U^T y = b, L^T z = y, then x = P^T z.
        for (int r = 0; r < n; r++)
        {
            double s = b[r];
            for (int c = 0; c < r; c++) s -= lu[c * n + r] * b[c];
            b[r] = s / lu[r * n + r];
        }
        for (int r = n - 2; r >= 0; r--)
        {
            double s = b[r];
            for (int c = r + 1; c < n; c++) s -= lu[c * n + r] * b[c];
            b[r] = s;
        }
        for (int k = n - 1; k >= 0; k--)
        {
            int p = pivots[k];
            if (p != k) (b[k], b[p]) = (b[p], b[k]);
        }
    }
}
