namespace Hull.Core.Windows;

/// <summary>
/// The k-dimensional measure (length, area, volume, ...) of a polytope given by its vertices and their tight
/// constraints, in the Euclidean metric of whatever coordinates the points are given in. Cone decomposition from
/// one vertex: the measure is Σ over facets not through the apex of (height · facet measure) / k, facets being the
/// vertex sets of one tight constraint whose affine dimension is k − 1, recursively; each face is measured once.
/// </summary>
public static class PolytopeMeasure
{
    /// <summary>
    /// Points whose distance from an affine subspace is below this (coordinate units, eV) lie in it. Vertex
    /// coordinates carry rounding of about 1e-13 eV after thousands of cuts; 1e-9 is far above it and far below the
    /// size of any window worth reporting.
    /// </summary>
    public const double AffineResidualEv = 1e-9;

    /// <param name="points">The vertices (all of one length).</param>
    /// <param name="tightIds">Per vertex, ids of the constraints tight there (any ids unique per constraint).</param>
    /// <param name="dimension">The dimension to measure in; 0 when the points span less.</param>
    public static double Measure(IReadOnlyList<IReadOnlyList<double>> points, IReadOnlyList<IReadOnlyList<int>> tightIds, int dimension)
    {
        ArgumentNullException.ThrowIfNull(points);
        ArgumentNullException.ThrowIfNull(tightIds);
        if (points.Count != tightIds.Count) throw new ArgumentException("One tight set per point is needed.", nameof(tightIds));
        if (points.Count == 0) return 0;
        var coords = points.Select(p => p.ToArray()).ToArray();
        var tight = tightIds.Select(t => new HashSet<int>(t)).ToArray();
        var memo = new Dictionary<string, double>();
        return Volume(Enumerable.Range(0, coords.Length).ToArray(), dimension, coords, tight, memo);
    }

    /// <summary>Affine dimension of a point set (0 for one point).</summary>
    public static int AffineDimension(IReadOnlyList<IReadOnlyList<double>> points) =>
        points.Count == 0 ? -1 : Basis(points.Select(p => p.ToArray()).ToArray(), Enumerable.Range(0, points.Count).ToArray()).Count;

    private static double Volume(int[] subset, int m, double[][] x, HashSet<int>[] tight, Dictionary<string, double> memo)
    {
        if (m == 0) return 1;
        string key = m + ":" + string.Join(',', subset);
        if (memo.TryGetValue(key, out double known)) return known;
        List<double[]> basis = Basis(x, subset);
        double result = 0;
        if (basis.Count < m)
        {
            result = 0;
        }
        else if (m == 1)
        {
            foreach (int a in subset)
            {
                foreach (int b in subset) result = Math.Max(result, Distance(x[a], x[b]));
            }
        }
        else
        {
            // Group the face's vertices by tight constraint in one pass over the incidences.
            int apex = subset[0];
            var members = new Dictionary<int, List<int>>();
            foreach (int v in subset)
            {
                foreach (int label in tight[v])
                {
                    if (tight[apex].Contains(label)) continue;
                    if (!members.TryGetValue(label, out List<int>? list)) members[label] = list = [];
                    list.Add(v);
                }
            }

            var seen = new HashSet<string>();
            foreach (List<int> list in members.Values)
            {
                if (list.Count < m) continue;
                int[] facet = list.ToArray();
                if (!seen.Add(string.Join(',', facet))) continue;
                List<double[]> facetBasis = Basis(x, facet);
                if (facetBasis.Count != m - 1) continue;
                double height = Residual(Difference(x[apex], x[facet[0]]), facetBasis);
                result += height * Volume(facet, m - 1, x, tight, memo) / m;
            }
        }

        memo[key] = result;
        return result;
    }

    private static List<double[]> Basis(double[][] x, int[] subset)
    {
        var basis = new List<double[]>();
        double[] origin = x[subset[0]];
        for (int i = 1; i < subset.Length; i++)
        {
            double[] v = Difference(x[subset[i]], origin);
            foreach (double[] e in basis)
            {
                double dot = 0;
                for (int k = 0; k < v.Length; k++) dot += v[k] * e[k];
                for (int k = 0; k < v.Length; k++) v[k] -= dot * e[k];
            }

            double norm = Math.Sqrt(v.Sum(t => t * t));
            if (norm <= AffineResidualEv) continue;
            for (int k = 0; k < v.Length; k++) v[k] /= norm;
            basis.Add(v);
        }

        return basis;
    }

    private static double Residual(double[] v, List<double[]> basis)
    {
        var r = (double[])v.Clone();
        foreach (double[] e in basis)
        {
            double dot = 0;
            for (int k = 0; k < r.Length; k++) dot += r[k] * e[k];
            for (int k = 0; k < r.Length; k++) r[k] -= dot * e[k];
        }

        return Math.Sqrt(r.Sum(t => t * t));
    }

    private static double[] Difference(double[] a, double[] b)
    {
        var d = new double[a.Length];
        for (int k = 0; k < a.Length; k++) d[k] = a[k] - b[k];
        return d;
    }

    private static double Distance(double[] a, double[] b) => Math.Sqrt(Difference(a, b).Sum(t => t * t));
}
