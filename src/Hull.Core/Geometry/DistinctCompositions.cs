using Hull.Core.Chemistry;

namespace Hull.Core.Geometry;

/// <summary>
/// Groups integer amount rows by composition (rows reduced by their greatest common divisor), allocating one
/// reduced row per distinct composition rather than one per point: a dataset of 1e5 entries often holds only a
/// few hundred compositions.
/// </summary>
internal sealed class DistinctCompositions
{
    /// <summary>Table sizes start from this many compositions at most, and double as they fill.</summary>
    private const int InitialCompositions = 4096;

    private readonly int _n;
    private readonly List<long[]> _reduced;
    // Open addressing: each slot packs a composition's hash (high half) and its id + 1 (low half; 0 = empty), so a
    // probe reads one array; the reduced rows are also kept back to back, so a comparison reads one more.
    private long[] _slots;
    private long[] _flat;
    private readonly long[] _scratch;

    public DistinctCompositions(int componentCount, int expectedRows)
    {
        _n = componentCount;
        _scratch = new long[componentCount];
        // Most rows of a data set are distinct compositions: room for all from the start saves regrowing.
        _reduced = new List<long[]>(expectedRows);
        int start = Math.Min(Math.Max(expectedRows, 8), InitialCompositions);
        _slots = new long[(int)System.Numerics.BitOperations.RoundUpToPowerOf2((uint)start * 2)];
        _flat = new long[start * componentCount];
    }

    /// <summary>The reduced rows, indexed by composition id.</summary>
    public IReadOnlyList<long[]> Reduced => _reduced;

    /// <summary>
    /// The id of the row's composition, adding it when new. The row must be non-negative and not all zero.
    /// <paramref name="keepable"/> is the row's own array when nobody will change it: a row already in lowest terms
    /// is then kept itself instead of a copy. Null: always copy.
    /// </summary>
    public int Add(ReadOnlySpan<long> row, long[]? keepable)
    {
        long g = 0;
        foreach (long v in row)
        {
            g = Rational.Gcd(g, v);
            if (g == 1) break;
        }
        ulong h = 0x9E3779B97F4A7C15UL;
        for (int k = 0; k < _n; k++)
        {
            long v = g == 1 ? row[k] : row[k] / g;
            _scratch[k] = v;
            h = (h ^ (ulong)v) * 0xBF58476D1CE4E5B9UL;
            h ^= h >> 31;
        }
        uint hash = (uint)(h >> 32);
        int mask = _slots.Length - 1;
        for (int slot = (int)(hash & (uint)mask); ; slot = (slot + 1) & mask)
        {
            long entry = _slots[slot];
            if (entry == 0)
            {
                int id = _reduced.Count;
                _reduced.Add(g == 1 && keepable is not null ? keepable : (long[])_scratch.Clone());
                if ((id + 1) * _n > _flat.Length) Array.Resize(ref _flat, _flat.Length * 2);
                _scratch.CopyTo(_flat, id * _n);
                _slots[slot] = ((long)hash << 32) | (uint)(id + 1);
                if (_reduced.Count * 2 > _slots.Length) Grow();
                return id;
            }
            if ((uint)((ulong)entry >> 32) == hash)
            {
                int id = (int)(uint)entry - 1;
                if (_flat.AsSpan(id * _n, _n).SequenceEqual(_scratch)) return id;
            }
        }
    }

    private void Grow()
    {
        var old = _slots;
        _slots = new long[old.Length * 2];
        int mask = _slots.Length - 1;
        foreach (long entry in old)
        {
            if (entry == 0) continue;
            int slot = (int)((uint)((ulong)entry >> 32) & (uint)mask);
            while (_slots[slot] != 0) slot = (slot + 1) & mask;
            _slots[slot] = entry;
        }
    }
}
