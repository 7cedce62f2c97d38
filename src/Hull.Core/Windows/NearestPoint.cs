namespace Hull.Core.Windows;

/// <summary>
/// The point of the convex hull of finitely many points that is nearest to the origin (Euclidean), by Wolfe's
/// minimum-norm-point algorithm: a finite active-set method that keeps the nearest point as a convex combination
/// of an affinely independent subset (P. Wolfe, "Finding the nearest point in a polytope", Mathematical Programming
/// 11 (1976) 128–149).
/// </summary>
public static class NearestPoint
{
    /// <summary>
    /// Optimality and weight tolerance, relative to the largest squared norm of the points: the stopping test
    /// compares squared lengths, whose rounding is about 1e-15 of that scale.
    /// </summary>
    private const double RelativeTolerance = 1e-12;

    /// <summary>The convex weights (one per point, summing to 1) of the nearest point to the origin.</summary>
    public static double[] WeightsNearestOrigin(IReadOnlyList<IReadOnlyList<double>> points)
    {
        ArgumentNullException.ThrowIfNull(points);
        if (points.Count == 0) throw new ArgumentException("No points.", nameof(points));
        int k = points[0].Count;
        double scale = points.Max(p => Dot(p, p));
        double tol = RelativeTolerance * Math.Max(scale, 1e-300);
        int first = Enumerable.Range(0, points.Count).MinBy(i => Dot(points[i], points[i]));
        var active = new List<int> { first };
        var weights = new List<double> { 1.0 };
        for (int major = 0; major < 10 * points.Count + 100; major++)
        {
            double[] x = Combine(points, active, weights, k);
            double xx = Dot(x, x);
            int j = Enumerable.Range(0, points.Count).MinBy(i => Dot(x, points[i]));
            if (Dot(x, points[j]) > xx - tol || active.Contains(j)) break;
            active.Add(j);
            weights.Add(0);
            while (true)
            {
                double[] alpha = AffineMinimum(points, active);
                if (alpha.All(a => a > tol / Math.Max(scale, 1e-300)))
                {
                    for (int i = 0; i < alpha.Length; i++) weights[i] = alpha[i];
                    break;
                }

                double theta = 1;
                for (int i = 0; i < alpha.Length; i++)
                {
                    if (alpha[i] <= 0 && weights[i] - alpha[i] > 0) theta = Math.Min(theta, weights[i] / (weights[i] - alpha[i]));
                }

                for (int i = 0; i < alpha.Length; i++) weights[i] += theta * (alpha[i] - weights[i]);
                for (int i = active.Count - 1; i >= 0; i--)
                {
                    if (weights[i] <= 1e-15)
                    {
                        active.RemoveAt(i);
                        weights.RemoveAt(i);
                    }
                }

                if (active.Count == 0) throw new InvalidOperationException("The nearest-point iteration lost every point.");
                double sum = weights.Sum();
                for (int i = 0; i < weights.Count; i++) weights[i] /= sum;
            }
        }

        var result = new double[points.Count];
        for (int i = 0; i < active.Count; i++) result[active[i]] = weights[i];
        return result;
    }

    private static double[] AffineMinimum(IReadOnlyList<IReadOnlyList<double>> points, List<int> active)
    {
        // Minimise |Σ a_i p_i|² subject to Σ a_i = 1: [G 1; 1ᵀ 0] [a; λ] = [0; 1] with G the Gram matrix.
        int s = active.Count;
        var m = new double[s + 1, s + 2];
        for (int i = 0; i < s; i++)
        {
            for (int j = 0; j < s; j++) m[i, j] = Dot(points[active[i]], points[active[j]]);
            m[i, s] = 1;
            m[s, i] = 1;
        }

        m[s, s + 1] = 1;
        int n = s + 1;
        for (int col = 0; col < n; col++)
        {
            int best = col;
            for (int r = col + 1; r < n; r++) if (Math.Abs(m[r, col]) > Math.Abs(m[best, col])) best = r;
            for (int c = 0; c <= n; c++) (m[col, c], m[best, c]) = (m[best, c], m[col, c]);
            double pivot = m[col, col];
            if (Math.Abs(pivot) < 1e-300) continue;
            for (int r = 0; r < n; r++)
            {
                if (r == col) continue;
                double f = m[r, col] / pivot;
                if (f == 0) continue;
                for (int c = col; c <= n; c++) m[r, c] -= f * m[col, c];
            }
        }

        var a = new double[s];
        for (int i = 0; i < s; i++) a[i] = Math.Abs(m[i, i]) < 1e-300 ? 0 : m[i, n] / m[i, i];
        return a;
    }

    private static double[] Combine(IReadOnlyList<IReadOnlyList<double>> points, List<int> active, List<double> weights, int k)
    {
        var x = new double[k];
        for (int i = 0; i < active.Count; i++)
        {
            for (int c = 0; c < k; c++) x[c] += weights[i] * points[active[i]][c];
        }

        return x;
    }

    private static double Dot(IReadOnlyList<double> a, IReadOnlyList<double> b)
    {
        double s = 0;
        for (int i = 0; i < a.Count; i++) s += a[i] * b[i];
        return s;
    }
}
