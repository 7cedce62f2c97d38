namespace Hull.Core.Windows;

/// <summary>
/// The working state of <see cref="VertexEnumeration"/>: vertices with sorted tight-constraint ids, the edge graph,
/// and the constraint rows (unit normals) by id. Mutable, for one enumeration only.
/// </summary>
internal sealed class DoubleDescription
{
    private readonly int _d;
    private readonly List<double[]> _rows;
    private readonly List<double> _rhs;
    private readonly List<int> _ids;
    private readonly Dictionary<int, double[]> _rowById = new();
    private readonly List<double[]> _coords = new();
    private readonly List<int[]> _tight = new();
    private readonly List<List<int>> _adjacent = new();
    private readonly List<bool> _alive = new();
    private List<int> _live = new();
    private double[] _rankBuffer = [];

    public DoubleDescription(int d, double[] lower, double[] upper, int[] boxIds, List<double[]> rows, List<double> rhs, List<int> ids)
    {
        _d = d;
        _rows = rows;
        _rhs = rhs;
        _ids = ids;
        for (int k = 0; k < rows.Count; k++) _rowById[ids[k]] = rows[k];
        for (int f = 0; f < d; f++)
        {
            var down = new double[d];
            down[f] = -1;
            var up = new double[d];
            up[f] = 1;
            _rowById[boxIds[2 * f]] = down;
            _rowById[boxIds[2 * f + 1]] = up;
        }

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
        var slack = new Dictionary<int, double>(_live.Count);
        var negative = new List<int>();
        var zero = new List<int>();
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
                if (!_alive[v] || !slack.TryGetValue(v, out double sv) || sv <= PolytopeTolerances.SlackEv) continue;
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
        foreach (int z in zero) _adjacent[z].RemoveAll(v => !_alive[v]);
        for (int i = 0; i < face.Count; i++)
        {
            for (int j = i + 1; j < face.Count; j++)
            {
                int p = face[i], q = face[j];
                if (_adjacent[p].Contains(q) || !AreAdjacent(_tight[p], _tight[q])) continue;
                _adjacent[p].Add(q);
                _adjacent[q].Add(p);
            }
        }

        var live = new List<int>(_live.Count + face.Count);
        foreach (int v in _live) if (_alive[v]) live.Add(v);
        for (int i = zero.Count; i < face.Count; i++) live.Add(face[i]);
        _live = live;
        return true;
    }

    private bool AreAdjacent(int[] a, int[] b)
    {
        int[] common = Intersect(a, b);
        if (common.Length < _d - 1) return false;
        return Rank(common) == _d - 1;
    }

    private int Rank(int[] ids)
    {
        int rows = ids.Length;
        if (_rankBuffer.Length < rows * _d) _rankBuffer = new double[rows * _d];
        Span<double> m = _rankBuffer.AsSpan(0, rows * _d);
        for (int i = 0; i < rows; i++) _rowById[ids[i]].CopyTo(m.Slice(i * _d, _d));
        int rank = 0;
        for (int col = 0; col < _d && rank < rows; col++)
        {
            int best = -1;
            double size = PolytopeTolerances.RankPivot;
            for (int i = rank; i < rows; i++)
            {
                double a = Math.Abs(m[i * _d + col]);
                if (a > size) { size = a; best = i; }
            }

            if (best < 0) continue;
            if (best != rank)
            {
                for (int f = 0; f < _d; f++) (m[best * _d + f], m[rank * _d + f]) = (m[rank * _d + f], m[best * _d + f]);
            }

            double pivot = m[rank * _d + col];
            for (int i = rank + 1; i < rows; i++)
            {
                double factor = m[i * _d + col] / pivot;
                if (factor == 0) continue;
                for (int f = col; f < _d; f++) m[i * _d + f] -= factor * m[rank * _d + f];
            }

            rank++;
        }

        return rank;
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
