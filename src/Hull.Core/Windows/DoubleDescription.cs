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
    // Every vertex ever made, dead ones included: coordinates at _d·v, tight ids, neighbours, whether alive.
    private double[] _coords;
    private int _count;
    private int[][] _tight;
    private List<int>[] _adjacent;
    private bool[] _alive;
    private int[] _live;
    private int _liveCount;
    private int[] _spareLive;
    private readonly List<int> _negative = new();
    private readonly List<int> _zero = new();
    private readonly List<int> _face = new();
    private double[] _slack = [];
    // Bounding boxes as centre and half-width, d values each: box 0 holds every live vertex, box 1 + g the live
    // vertices at positions [8g, 8g + 8). A cut whose plane clears a box cannot touch the vertices in it.
    private double[] _centre = [];
    private double[] _halfWidth = [];
    private int _groupCount;

    private readonly Predicate<int> _isDead;

    public DoubleDescription(int d, double[] lower, double[] upper, int[] boxIds, List<double[]> rows, List<double> rhs, List<int> ids)
    {
        _d = d;
        _rows = rows;
        _rhs = rhs;
        _ids = ids;
        int count = 1 << d;
        // Room for the box and about one new vertex per constraint from the start: regrowing copies every array.
        int capacity = Math.Max(64, 4 * count) + rows.Count;
        _coords = new double[capacity * Math.Max(d, 1)];
        _tight = new int[capacity][];
        _adjacent = new List<int>[capacity];
        _alive = new bool[capacity];
        _live = new int[capacity];
        _spareLive = new int[capacity];
        _isDead = v => !_alive[v];
        // The box: vertex b has coordinate f at its upper bound when bit f of b is set; edges flip one bit.
        var x = new double[d];
        for (int b = 0; b < count; b++)
        {
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
            _live[_liveCount++] = AddVertex(x, tight, neighbours);
        }

        Boxes();
    }

    private int AddVertex(ReadOnlySpan<double> x, int[] tight, List<int> neighbours)
    {
        if (_count == _alive.Length)
        {
            int grown = 2 * _count;
            Array.Resize(ref _coords, grown * Math.Max(_d, 1));
            Array.Resize(ref _tight, grown);
            Array.Resize(ref _adjacent, grown);
            Array.Resize(ref _alive, grown);
        }

        x.CopyTo(_coords.AsSpan(_count * _d, _d));
        _tight[_count] = tight;
        _adjacent[_count] = neighbours;
        _alive[_count] = true;
        return _count++;
    }

    private ReadOnlySpan<double> Point(int v) => new(_coords, v * _d, _d);

    public double[] Centroid()
    {
        var c = new double[_d];
        for (int i = 0; i < _liveCount; i++)
        {
            ReadOnlySpan<double> x = Point(_live[i]);
            for (int f = 0; f < _d; f++) c[f] += x[f];
        }

        for (int f = 0; f < _d; f++) c[f] /= Math.Max(1, _liveCount);
        return c;
    }

    public IEnumerable<(double[] Point, int[] Tight)> Vertices()
    {
        for (int i = 0; i < _liveCount; i++) yield return (Point(_live[i]).ToArray(), _tight[_live[i]]);
    }

    /// <summary>Cuts by constraint row <paramref name="k"/>; false when nothing is left.</summary>
    public bool Cut(int k)
    {
        double[] row = _rows[k];
        double b = _rhs[k];
        int id = _ids[k];
        int d = _d;
        // Most cuts of a window are redundant and far from it: the plane's highest value over the bounding box
        // settles those in d steps. Twice the tolerance, so that no vertex the full test would call tight is skipped.
        Span<double> magnitude = stackalloc double[d];
        for (int f = 0; f < d; f++) magnitude[f] = Math.Abs(row[f]);
        if (b - Highest(row, magnitude, 0) > 2 * PolytopeTolerances.SlackEv) return true;

        if (_slack.Length < _count) _slack = new double[_alive.Length];
        // Scratch lists kept across cuts: a cut that changes nothing should allocate nothing.
        List<int> negative = _negative, zero = _zero;
        negative.Clear();
        zero.Clear();
        // The rest are tested by groups of live vertices, each with its own bounding box: a group whose box the plane
        // clears is skipped. Vertices made by one cut lie on one face, so consecutive live vertices lie close together.
        bool anyPositive = false;
        for (int g = 0; g < _groupCount; g++)
        {
            if (b - Highest(row, magnitude, 1 + g) > 2 * PolytopeTolerances.SlackEv) anyPositive = true;
            else anyPositive |= Slacks(row, b, g * GroupSize, Math.Min(_liveCount, (g + 1) * GroupSize));
        }

        if (negative.Count > 0)
        {
            // It cuts: the new vertices need the slack of every live vertex, those of skipped groups included.
            negative.Clear();
            zero.Clear();
            anyPositive = Slacks(row, b, 0, _liveCount);
        }

        foreach (int z in zero) _tight[z] = WithId(_tight[z], id);
        if (negative.Count == 0) return true;
        if (!anyPositive && zero.Count == 0)
        {
            _liveCount = 0;
            return false;
        }

        double[] slack = _slack;
        List<int> face = _face;
        face.Clear();
        face.AddRange(zero);
        Span<double> x = stackalloc double[d];
        foreach (int u in negative)
        {
            double su = slack[u];
            List<int> aroundU = _adjacent[u];
            for (int a = 0; a < aroundU.Count; a++)
            {
                int v = aroundU[a];
                if (!_alive[v]) continue;
                double sv = slack[v];
                if (sv <= PolytopeTolerances.SlackEv) continue;
                double t = sv / (sv - su);
                int au = u * d, av = v * d;
                for (int f = 0; f < d; f++) x[f] = _coords[av + f] + t * (_coords[au + f] - _coords[av + f]);
                int[] tight = IntersectWithId(_tight[u], _tight[v], id);
                // A vertex of a d-dimensional polytope has at least d neighbours: room for them from the start.
                int w = AddVertex(x, tight, new List<int>(d + 1) { v });
                List<int> around = _adjacent[v];
                around[around.IndexOf(u)] = w;
                face.Add(w);
            }
        }

        foreach (int u in negative) _alive[u] = false;
        foreach (int z in zero) _adjacent[z].RemoveAll(_isDead);
        JoinFace(face, zero.Count);

        int needed = _liveCount - negative.Count + face.Count - zero.Count;
        if (_spareLive.Length < needed) _spareLive = new int[Math.Max(needed, 2 * _spareLive.Length)];
        int[] live = _spareLive;
        int kept = 0;
        for (int i = 0; i < _liveCount; i++) if (_alive[_live[i]]) live[kept++] = _live[i];
        for (int i = zero.Count; i < face.Count; i++) live[kept++] = face[i];
        _spareLive = _live;
        _live = live;
        _liveCount = kept;
        Boxes();
        return true;
    }

    private const int GroupSize = 8;

    /// <summary>
    /// The highest value of the row's left side over box <paramref name="box"/>: centre·row + half-width·|row|. The
    /// centre and half-width round by about 1e-15 eV, far inside the twice-the-tolerance margin the callers keep.
    /// </summary>
    private double Highest(double[] row, ReadOnlySpan<double> magnitude, int box)
    {
        int at = box * _d;
        ReadOnlySpan<double> centre = _centre.AsSpan(at, _d), half = _halfWidth.AsSpan(at, _d);
        double highest = 0;
        for (int f = 0; f < centre.Length; f++) highest += row[f] * centre[f] + magnitude[f] * half[f];
        return highest;
    }

    /// <summary>
    /// Slacks of the live vertices at positions [from, to) into the scratch array, sorted into the negative and zero
    /// lists; whether any was positive.
    /// </summary>
    private bool Slacks(double[] row, double b, int from, int to)
    {
        int d = _d;
        double[] coords = _coords, slack = _slack;
        int[] live = _live;
        bool anyPositive = false;
        for (int i = from; i < to; i++)
        {
            int v = live[i];
            int at = v * d;
            double dot = 0;
            if (d == 4)
            {
                // The five-element window's case, without the loop.
                ReadOnlySpan<double> x = coords.AsSpan(at, 4);
                dot = row[0] * x[0] + row[1] * x[1] + row[2] * x[2] + row[3] * x[3];
            }
            else
            {
                for (int f = 0; f < d; f++) dot += row[f] * coords[at + f];
            }

            double s = b - dot;
            slack[v] = s;
            if (s < -PolytopeTolerances.SlackEv) _negative.Add(v);
            else if (s <= PolytopeTolerances.SlackEv) _zero.Add(v);
            else anyPositive = true;
        }

        return anyPositive;
    }

    /// <summary>The bounding boxes of all live vertices and of each group of them, after the live set changed.</summary>
    private void Boxes()
    {
        int d = _d;
        _groupCount = (_liveCount + GroupSize - 1) / GroupSize;
        int size = (_groupCount + 1) * d;
        if (_centre.Length < size)
        {
            _centre = new double[2 * size];
            _halfWidth = new double[2 * size];
        }

        Span<double> low = stackalloc double[d], high = stackalloc double[d], allLow = stackalloc double[d], allHigh = stackalloc double[d];
        allLow.Fill(double.PositiveInfinity);
        allHigh.Fill(double.NegativeInfinity);
        double[] coords = _coords;
        for (int g = 0; g < _groupCount; g++)
        {
            low.Fill(double.PositiveInfinity);
            high.Fill(double.NegativeInfinity);
            int end = Math.Min(_liveCount, (g + 1) * GroupSize);
            for (int i = g * GroupSize; i < end; i++)
            {
                ReadOnlySpan<double> x = coords.AsSpan(_live[i] * d, d);
                for (int f = 0; f < x.Length; f++)
                {
                    if (x[f] < low[f]) low[f] = x[f];
                    if (x[f] > high[f]) high[f] = x[f];
                }
            }

            Store(1 + g, low, high);
            for (int f = 0; f < d; f++)
            {
                if (low[f] < allLow[f]) allLow[f] = low[f];
                if (high[f] > allHigh[f]) allHigh[f] = high[f];
            }
        }

        Store(0, allLow, allHigh);
    }

    private void Store(int box, ReadOnlySpan<double> low, ReadOnlySpan<double> high)
    {
        for (int f = 0; f < _d; f++)
        {
            _centre[box * _d + f] = 0.5 * (low[f] + high[f]);
            _halfWidth[box * _d + f] = 0.5 * (high[f] - low[f]);
        }
    }

    /// <summary>
    /// Joins the vertices of the new face by the combinatorial adjacency test: two vertices are adjacent exactly when
    /// no third vertex is tight on every constraint tight at both (the smallest face holding both then has no other
    /// vertex, so it is an edge). Only vertices of the new face can hold that set, as it contains the cut. Tight sets
    /// are decided combinatorially (see <see cref="VertexEnumeration"/>), so this needs no floating-point rank.
    /// </summary>
    private void JoinFace(List<int> face, int zeroCount)
    {
        if (!TryJoinFaceByMasks(face, zeroCount)) JoinFaceBySortedSets(face);
    }

    // Each constraint id tight somewhere on the face as one bit, when there are at most 64 of them (the usual case):
    // intersections and inclusions of tight sets are then one machine word each.
    private int[] _bitOf = [];
    private int[] _bitStamp = [];
    private int _stamp;
    private ulong[] _masks = new ulong[16];

    private bool TryJoinFaceByMasks(List<int> face, int zeroCount)
    {
        if (_bitOf.Length == 0)
        {
            int largest = 0;
            foreach (int id in _ids) largest = Math.Max(largest, id);
            foreach (int[] tight in _tight.AsSpan(0, _count)) foreach (int id in tight) largest = Math.Max(largest, id);
            _bitOf = new int[largest + 1];
            _bitStamp = new int[largest + 1];
        }

        if (_masks.Length < face.Count) _masks = new ulong[2 * face.Count];
        ulong[] masks = _masks;
        _stamp++;
        int next = 0;
        for (int i = 0; i < face.Count; i++)
        {
            ulong mask = 0;
            foreach (int id in _tight[face[i]])
            {
                if (_bitStamp[id] != _stamp)
                {
                    if (next == 64) return false;
                    _bitStamp[id] = _stamp;
                    _bitOf[id] = next++;
                }

                mask |= 1UL << _bitOf[id];
            }

            masks[i] = mask;
        }

        int need = _d - 1;
        for (int i = 0; i < face.Count; i++)
        {
            for (int j = i + 1; j < face.Count; j++)
            {
                ulong common = masks[i] & masks[j];
                if (System.Numerics.BitOperations.PopCount(common) < need) continue;
                int p = face[i], q = face[j];
                // Only two vertices that were on the cutting plane already can be neighbours already.
                if (j < zeroCount && _adjacent[p].Contains(q)) continue;
                bool edge = true;
                for (int k = 0; k < face.Count; k++)
                {
                    if (k != i && k != j && (common & ~masks[k]) == 0)
                    {
                        edge = false;
                        break;
                    }
                }

                if (!edge) continue;
                _adjacent[p].Add(q);
                _adjacent[q].Add(p);
            }
        }

        return true;
    }

    private void JoinFaceBySortedSets(List<int> face)
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

    /// <summary>The sorted ids common to both sorted sets, with <paramref name="id"/> (above none of them or among them) added: one allocation.</summary>
    private int[] IntersectWithId(int[] a, int[] b, int id)
    {
        int count = IntersectInto(a, b, ref _common);
        int at = Array.BinarySearch(_common, 0, count, id);
        if (at >= 0) return _common.AsSpan(0, count).ToArray();
        at = ~at;
        var result = new int[count + 1];
        Array.Copy(_common, result, at);
        result[at] = id;
        Array.Copy(_common, at, result, at + 1, count - at);
        return result;
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
