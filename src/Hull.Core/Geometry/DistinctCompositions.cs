using Hull.Core.Chemistry;

namespace Hull.Core.Geometry;

/// <summary>
/// Groups integer amount rows by composition (rows reduced by their greatest common divisor), allocating one
/// reduced row per distinct composition rather than one per point: a dataset of 1e5 entries often holds only a
/// few hundred compositions.
/// </summary>
internal sealed class DistinctCompositions
{
    private readonly int _n;
    private readonly List<long[]> _reduced;
    private readonly List<int> _hashes;
    private int[] _slots;
    private readonly long[] _scratch;

    public DistinctCompositions(int componentCount, int expectedRows)
    {
        _n = componentCount;
        _scratch = new long[componentCount];
        // Most rows of a data set are distinct compositions: room for all from the start saves regrowing.
        _reduced = new List<long[]>(expectedRows);
        _hashes = new List<int>(expectedRows);
        _slots = new int[Math.Max(16, (int)System.Numerics.BitOperations.RoundUpToPowerOf2((uint)Math.Min(expectedRows, 1 << 20) * 2))];
        Array.Fill(_slots, -1);
    }

    /// <summary>The reduced rows, indexed by composition id.</summary>
    public IReadOnlyList<long[]> Reduced => _reduced;

    /// <summary>
    /// The id of the row's composition, adding it when new. The row must be non-negative and not all zero. A row
    /// already in lowest terms is kept itself, without a copy, when <paramref name="rowIsImmutable"/> says that
    /// nobody will change it.
    /// </summary>
    public int Add(long[] row, bool rowIsImmutable = false)
    {
        long g = 0;
        foreach (long v in row)
        {
            g = Rational.Gcd(g, v);
            if (g == 1) break;
        }
        for (int k = 0; k < _n; k++) _scratch[k] = row[k] / g;
        var hc = new HashCode();
        foreach (long v in _scratch) hc.Add(v);
        int hash = hc.ToHashCode();
        int mask = _slots.Length - 1;
        for (int slot = hash & mask; ; slot = (slot + 1) & mask)
        {
            int id = _slots[slot];
            if (id < 0)
            {
                id = _reduced.Count;
                _reduced.Add(g == 1 && rowIsImmutable ? row : (long[])_scratch.Clone());
                _hashes.Add(hash);
                _slots[slot] = id;
                if (_reduced.Count * 2 > _slots.Length) Grow();
                return id;
            }
            if (_hashes[id] == hash && _reduced[id].AsSpan().SequenceEqual(_scratch)) return id;
        }
    }

    private void Grow()
    {
        _slots = new int[_slots.Length * 2];
        Array.Fill(_slots, -1);
        int mask = _slots.Length - 1;
        for (int id = 0; id < _reduced.Count; id++)
        {
            int slot = _hashes[id] & mask;
            while (_slots[slot] >= 0) slot = (slot + 1) & mask;
            _slots[slot] = id;
        }
    }
}
