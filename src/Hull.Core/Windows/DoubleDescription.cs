namespace Hull.Core.Windows;

/// <summary>
/// The working state of <see cref="VertexEnumeration"/>: vertices with sorted tight-constraint ids, the edge graph,
/// and the constraint rows (unit normals). Mutable, for one enumeration only.
/// </summary>
internal sealed class DoubleDescription
{
    private readonly int _d;
    private readonly List<double[]> _rows;
    private readonly List<double> _rhs;
    private readonly List<int> _ids;
    private readonly List<double[]> _coords = new();
    private readonly List<int[]> _tight = new();
    private readonly List<List<int>> _adjacent = new();
    private readonly List<bool> _alive = new();
    private List<int> _live = new();
    private List<int> _spareLive = new();
    private readonly List<int> _negative = new();
    private readonly List<int> _zero = new();
    private double[] _slack = [];

    private readonly Predicate<int> _isDead;

    public DoubleDescription(int d, double[] lower, double[] upper, int[] boxIds, List<double[]> rows, List<double> rhs, List<int> ids)
    {
        _d = d;
        _isDead = v => !_alive[v];
        _rows = rows;
        _rhs = rhs;
        _ids = ids;
        // The box: vertex b has coordinate f at its upper bound when bit f of b is set; edges flip one bit.
        int count = 1 << d;
        for (int b = 0; b < count; b++)
        {
            var x = new double[d];
            var tight = new int[d];
            for (int f = 0; f < d; f++)
            {
                bool up = ((b >> f) & 1) == 1;
                x[f] = up ? upper[f] : lower[f];
                tight[f] = up ? boxIds[2 * f + 1] : boxIds[2 * f];
            }

            Array.Sort(tight);
            var neighbours = new List<int>(d);
            for (int f = 0; f < d; f++) neighbours.Add(b ^ (1 << f));
            AddVertex(x, tight, neighbours);
        }

        _live = Enumerable.Range(0, count).ToList();
    }

    private int AddVertex(double[] x, int[] tight, List<int> neighbours)
    {
        _coords.Add(x);
        _tight.Add(tight);
        _adjacent.Add(neighbours);
        _alive.Add(true);
        return _coords.Count - 1;
    }

    public double[] Centroid()
    {
        var c = new double[_d];
        foreach (int v in _live)
        {
            for (int f = 0; f < _d; f++) c[f] += _coords[v][f];
        }

        for (int f = 0; f < _d; f++) c[f] /= Math.Max(1, _live.Count);
        return c;
    }

    public IEnumerable<(double[] Point, int[] Tight)> Vertices() => _live.Select(v => (_coords[v], _tight[v]));

    /// <summary>Cuts by constraint row <paramref name="k"/>; false when nothing is left.</summary>
    public bool Cut(int k)
    {
        double[] row = _rows[k];
        double b = _rhs[k];
        int id = _ids[k];
        if (_slack.Length < _coords.Count) _slack = new double[Math.Max(_coords.Count * 2, 64)];
        double[] slack = _slack;
        // Scratch lists kept across cuts: most cuts of a window are redundant and should allocate nothing.
        List<int> negative = _negative, zero = _zero;
        negative.Clear();
        zero.Clear();
        bool anyPositive = false;
        foreach (int v in _live)
        {
            double s = b - VertexEnumeration.Dot(row, _coords[v]);
            slack[v] = s;
            if (s < -PolytopeTolerances.SlackEv) negative.Add(v);
            else if (s <= PolytopeTolerances.SlackEv) zero.Add(v);
            else anyPositive = true;
        }

        foreach (int z in zero) _tight[z] = WithId(_tight[z], id);
        if (negative.Count == 0) return true;
        if (!anyPositive && zero.Count == 0)
        {
            _live.Clear();
            return false;
        }

        var face = new List<int>(zero);
        foreach (int u in negative)
        {
            double su = slack[u];
            foreach (int v in _adjacent[u])
            {
                if (!_alive[v]) continue;
                double sv = slack[v];
                if (sv <= PolytopeTolerances.SlackEv) continue;
                double t = sv / (sv - su);
                var x = new double[_d];
                double[] xu = _coords[u], xv = _coords[v];
                for (int f = 0; f < _d; f++) x[f] = xv[f] + t * (xu[f] - xv[f]);
                int[] tight = WithId(Intersect(_tight[u], _tight[v]), id);
                int w = AddVertex(x, tight, [v]);
                List<int> around = _adjacent[v];
                around[around.IndexOf(u)] = w;
                face.Add(w);
            }
        }

        foreach (int u in negative) _alive[u] = false;
        foreach (int z in zero) _adjacent[z].RemoveAll(_isDead);
        JoinFace(face);

        List<int> live = _spareLive;
        live.Clear();
        foreach (int v in _live) if (_alive[v]) live.Add(v);
        for (int i = zero.Count; i < face.Count; i++) live.Add(face[i]);
        _spareLive = _live;
        _live = live;
        return true;
    }

    /// <summary>
    /// Joins the vertices of the new face by the combinatorial adjacency test: two vertices are adjacent exactly when
    /// no third vertex is tight on every constraint tight at both (the smallest face holding both then has no other
    /// vertex, so it is an edge). Only vertices of the new face can hold that set, as it contains the cut. Tight sets
    /// are decided combinatorially (see <see cref="VertexEnumeration"/>), so this needs no floating-point rank.
    /// </summary>
    private void JoinFace(List<int> face)
    {
        int need = _d - 1;
        for (int i = 0; i < face.Count; i++)
        {
            int p = face[i];
            int[] tp = _tight[p];
            for (int j = i + 1; j < face.Count; j++)
            {
                int q = face[j];
                int count = IntersectInto(tp, _tight[q], ref _common);
                if (count < need || _adjacent[p].Contains(q)) continue;
                bool edge = true;
                for (int k = 0; k < face.Count && edge; k++)
                {
                    if (k == i || k == j) continue;
                    int[] tr = _tight[face[k]];
                    if (tr.Length >= count && Contains(tr, _common, count)) edge = false;
                }

                if (!edge) continue;
                _adjacent[p].Add(q);
                _adjacent[q].Add(p);
            }
        }
    }

    /// <summary>Whether the sorted set <paramref name="outer"/> holds the first <paramref name="count"/> ids of the sorted <paramref name="inner"/>.</summary>
    private static bool Contains(int[] outer, int[] inner, int count)
    {
        int i = 0;
        for (int c = 0; c < count; c++)
        {
            int id = inner[c];
            while (i < outer.Length && outer[i] < id) i++;
            if (i == outer.Length || outer[i] != id) return false;
            i++;
        }

        return true;
    }

    private int[] _common = new int[16];

    private static int IntersectInto(int[] a, int[] b, ref int[] into)
    {
        if (into.Length < Math.Min(a.Length, b.Length)) into = new int[Math.Max(a.Length, b.Length)];
        int count = 0, i = 0, j = 0;
        while (i < a.Length && j < b.Length)
        {
            if (a[i] == b[j]) { into[count++] = a[i]; i++; j++; }
            else if (a[i] < b[j]) i++;
            else j++;
        }

        return count;
    }

    private static int[] Intersect(int[] a, int[] b)
    {
        var common = new List<int>(Math.Min(a.Length, b.Length));
        int i = 0, j = 0;
        while (i < a.Length && j < b.Length)
        {
            if (a[i] == b[j]) { common.Add(a[i]); i++; j++; }
            else if (a[i] < b[j]) i++;
            else j++;
        }

        return common.ToArray();
    }

    private static int[] WithId(int[] sorted, int id)
    {
        int at = Array.BinarySearch(sorted, id);
        if (at >= 0) return sorted;
        at = ~at;
        var result = new int[sorted.Length + 1];
        Array.Copy(sorted, result, at);
        result[at] = id;
        Array.Copy(sorted, at, result, at + 1, sorted.Length - at);
        return result;
    }
}
