using Hull.Core.Chemistry;

namespace Hull.Core.Geometry;

/// <summary>
/// Groups integer amount rows by composition (rows reduced by their greatest common divisor), storing one reduced
/// row and its atom fractions per distinct composition, back to back in one array each: a dataset of 1e5 entries
/// often holds only a few hundred compositions, and a large input then needs no small array per point or per
/// composition.
/// </summary>
internal sealed class DistinctCompositions
{
    /// <summary>Table sizes start from this many compositions at most, and double as they fill.</summary>
    private const int InitialCompositions = 4096;

    private readonly int _n;
    private int _count;
    // Open addressing: each slot packs a composition's hash (high half) and its id + 1 (low half; 0 = empty), so a
    // probe reads one array, and a comparison one more.
    private long[] _slots;
    private long[] _flat;
    private double[] _fractions;

    public DistinctCompositions(int componentCount, int expectedRows)
    {
        _n = componentCount;
        int start = Math.Min(Math.Max(expectedRows, 8), InitialCompositions);
        _slots = new long[(int)System.Numerics.BitOperations.RoundUpToPowerOf2((uint)start * 2)];
        _flat = new long[start * componentCount];
        _fractions = new double[start * componentCount];
    }

    /// <summary>Number of distinct compositions so far; ids run from 0 to Count - 1 in order of first occurrence.</summary>
    public int Count => _count;

    /// <summary>
    /// The reduced rows, composition id c's at [c * n, (c + 1) * n); the array may be longer than Count rows.
    /// Owned by this table: the caller must not change it.
    /// </summary>
    public long[] ReducedRows => _flat;

    /// <summary>
    /// The atom fractions of each composition (amount / total, each rounded once), laid out as <see cref="ReducedRows"/>.
    /// Owned by this table: the caller must not change it.
    /// </summary>
    public double[] Fractions => _fractions;

    /// <summary>The id of the row's composition, adding it when new. The row must be non-negative and not all zero.</summary>
    public int Add(ReadOnlySpan<long> row)
    {
        int n = _n;
        long g = 0;
        foreach (long v in row)
        {
            g = Rational.Gcd(g, v);
            if (g == 1) break;
        }
        Span<long> reduced = stackalloc long[n];
        ulong h = 0x9E3779B97F4A7C15UL;
        for (int k = 0; k < n; k++)
        {
            long v = g == 1 ? row[k] : row[k] / g;
            reduced[k] = v;
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
                int id = _count++;
                if (_count * n > _flat.Length)
                {
                    Array.Resize(ref _flat, _flat.Length * 2);
                    Array.Resize(ref _fractions, _fractions.Length * 2);
                }
                reduced.CopyTo(_flat.AsSpan(id * n, n));
                // The input checks refuse totals past 64 bits; until they do (they may run beside this), wrapping is harmless.
                long total = 0;
                foreach (long v in reduced) total = unchecked(total + v);
                for (int k = 0; k < n; k++) _fractions[id * n + k] = (double)reduced[k] / total;
                _slots[slot] = ((long)hash << 32) | (uint)(id + 1);
                if (_count * 2 > _slots.Length) Grow();
                return id;
            }
            if ((uint)((ulong)entry >> 32) == hash)
            {
                int id = (int)(uint)entry - 1;
                if (SameRow(_flat, id * n, reduced)) return id;
            }
        }
    }

    private static bool SameRow(long[] flat, int offset, ReadOnlySpan<long> row)
    {
        for (int k = 0; k < row.Length; k++)
        {
            if (flat[offset + k] != row[k]) return false;
        }
        return true;
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
