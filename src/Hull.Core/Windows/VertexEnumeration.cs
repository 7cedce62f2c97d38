namespace Hull.Core.Windows;

/// <summary>
/// Vertex enumeration of a bounded polytope by the double description method: start from the box of the free
/// coordinates and cut it by one half-space at a time, keeping every vertex with the set of constraints tight
/// there and the edge graph. A cut keeps the vertices on its side, adds one vertex on every edge it crosses, and
/// joins the vertices of the new face by the combinatorial adjacency test (two vertices are adjacent exactly when no
/// third vertex is tight on every constraint tight at both).
/// </summary>
/// <remarks>
/// Degenerate input — many constraints through one vertex — is the normal case and needs no perturbation: a vertex
/// on the cutting plane (within <see cref="PolytopeTolerances.SlackEv"/>) is kept and the plane added to its tight
/// set; a new vertex lies strictly inside its edge, so its tight set is exactly the edge's tight set plus the cut
/// (a constraint tight at an inner point of a segment and satisfied at both ends is tight at both ends). Tight
/// sets are therefore decided combinatorially and never drift. Equalities are eliminated first
/// (<see cref="AffineParametrization"/>) and the method runs in the free coordinates.
/// </remarks>
public static class VertexEnumeration
{
    /// <summary>The vertices of the polytope, each with its tight inequalities and bounds.</summary>
    /// <exception cref="ArgumentNullException">No definition.</exception>
    public static PolytopeVertices Enumerate(PolytopeDefinition polytope)
    {
        ArgumentNullException.ThrowIfNull(polytope);
        int n = polytope.Dimension;
        AffineParametrization map = AffineParametrization.Of(n, polytope.Equalities, polytope.EliminationOrder);
        if (!map.IsConsistent) return PolytopeVertices.Empty(map.Free);

        int d = map.Free.Length;
        int m = polytope.Inequalities.Count;

        // Every constraint in the free coordinates: the inequalities (ids 0..m-1), then the bounds of the
        // eliminated coordinates (id m + 2·coordinate for lower, +1 for upper); the free coordinates' own bounds
        // are the starting box and use the same ids.
        var rows = new List<double[]>(m + 2 * n);
        var rhs = new List<double>(m + 2 * n);
        var ids = new List<int>(m + 2 * n);
        var scratch = new double[d];
        var full = new double[n];
        bool Add(ReadOnlySpan<double> a, double b, int id)
        {
            if (map.Restrict(a, b, scratch, out double bound))
            {
                rows.Add(scratch.AsSpan().ToArray());
                rhs.Add(bound);
                ids.Add(id);
                return true;
            }

            // Constant on the subspace: either always satisfied or never.
            return bound >= -PolytopeTolerances.SlackEv;
        }

        var boundRows = new List<int>();
        foreach (int p in map.Pivots)
        {
            Array.Clear(full);
            full[p] = -1;
            if (!Add(full, -polytope.LowerBounds[p], m + 2 * p)) return PolytopeVertices.Empty(map.Free);
            full[p] = 1;
            if (!Add(full, polytope.UpperBounds[p], m + 2 * p + 1)) return PolytopeVertices.Empty(map.Free);
        }

        int boundCount = rows.Count;
        for (int k = 0; k < m; k++)
        {
            if (!Add(polytope.Inequalities[k].Coefficients, polytope.Inequalities[k].Bound, k)) return PolytopeVertices.Empty(map.Free);
        }

        var lower = map.Free.Select(j => polytope.LowerBounds[j]).ToArray();
        var upper = map.Free.Select(j => polytope.UpperBounds[j]).ToArray();
        var boxIds = new int[2 * d];
        for (int f = 0; f < d; f++)
        {
            boxIds[2 * f] = m + 2 * map.Free[f];
            boxIds[2 * f + 1] = m + 2 * map.Free[f] + 1;
        }

        var engine = new DoubleDescription(d, lower, upper, boxIds, rows, rhs, ids);
        if (d == 0)
        {
            // A single point: every constraint must hold there.
            for (int k = 0; k < rows.Count; k++)
            {
                if (rhs[k] < -PolytopeTolerances.SlackEv) return PolytopeVertices.Empty(map.Free);
            }
        }

        // Bounds of the eliminated coordinates first (with the box they make the simplest enclosing shape), then
        // the inequalities, most violated at the centre of what is left first: deep cuts early keep the
        // intermediate polytopes small.
        for (int k = 0; k < boundCount; k++)
        {
            if (!engine.Cut(k)) return PolytopeVertices.Empty(map.Free);
        }

        double[] centre = engine.Centroid();
        int[] order = new int[rows.Count - boundCount];
        double[] depth = new double[rows.Count];
        for (int i = 0; i < order.Length; i++)
        {
            order[i] = boundCount + i;
            depth[boundCount + i] = rhs[boundCount + i] - Dot(rows[boundCount + i], centre);
        }

        double[] keys = new double[order.Length];
        for (int i = 0; i < order.Length; i++) keys[i] = depth[order[i]];
        Array.Sort(keys, order);
        // Equal depths in row order, as a stable sort leaves them.
        for (int i = 0, j; i < order.Length; i = j)
        {
            for (j = i + 1; j < order.Length && keys[j] == keys[i]; j++) { }
            if (j - i > 1) Array.Sort(order, i, j - i);
        }
        foreach (int k in order)
        {
            if (!engine.Cut(k)) return PolytopeVertices.Empty(map.Free);
        }

        var vertices = new List<PolytopeVertex>();
        foreach ((double[] y, int[] tight) in engine.Vertices())
        {
            double[] x = map.Point(y);
            // Tight ids ascend, so the bounds' coordinates come out ascending and once each; labels need sorting.
            int inequalityCount = 0, lowerCount = 0;
            foreach (int id in tight)
            {
                if (id < m) inequalityCount++;
                else if (((id - m) & 1) == 0) lowerCount++;
            }

            var labels = new int[inequalityCount];
            var atLower = new int[lowerCount];
            var atUpper = new int[tight.Length - inequalityCount - lowerCount];
            int li = 0, lo = 0, up = 0;
            foreach (int id in tight)
            {
                if (id < m) labels[li++] = polytope.Inequalities[id].Label;
                else if (((id - m) & 1) == 0) atLower[lo++] = (id - m) / 2;
                else atUpper[up++] = (id - m) / 2;
            }

            // Eliminated coordinates are exact functions of the free ones; snap those within the tolerance of a
            // bound onto it so a reported bound and the printed value agree.
            foreach (int j in atLower) x[j] = polytope.LowerBounds[j];
            foreach (int j in atUpper) x[j] = polytope.UpperBounds[j];
            Array.Sort(labels);
            int distinct = 0;
            for (int i = 0; i < labels.Length; i++) if (i == 0 || labels[i] != labels[i - 1]) labels[distinct++] = labels[i];
            vertices.Add(new PolytopeVertex(x, distinct == labels.Length ? labels : labels[..distinct], atLower, atUpper));
        }

        return new PolytopeVertices(map.Free, vertices, d);
    }

    internal static double Dot(double[] a, ReadOnlySpan<double> b)
    {
        double s = 0;
        for (int i = 0; i < a.Length; i++) s += a[i] * b[i];
        return s;
    }
}
