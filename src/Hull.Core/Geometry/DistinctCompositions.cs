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
    /// <summary>The hash table starts with room for this many compositions at most, and doubles as it fills.</summary>
    private const int InitialCompositions = 4096;

    private readonly int _n;
    private int _count;
    // Open addressing: a slot holds a composition's id + 1 (0 = empty); each composition's hash is kept beside its
    // row, so a probe compares hashes before rows. Slots are touched all over, so they start small and grow; the
    // per-composition arrays get room for one composition per row from the start, as memory never written costs
    // nothing, and growing would copy them.
    private int[] _slots;
    private uint[] _hashes;
    private long[] _flat;
    private double[] _fractions;

    public DistinctCompositions(int componentCount, int expectedRows)
    {
        _n = componentCount;
        int rows = Math.Max(expectedRows, 8);
        _slots = new int[(int)System.Numerics.BitOperations.RoundUpToPowerOf2((uint)Math.Min(rows, InitialCompositions) * 2)];
        _hashes = new uint[rows];
        _flat = new long[rows * componentCount];
        _fractions = new double[rows * componentCount];
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
            int entry = _slots[slot];
            if (entry == 0)
            {
                int id = _count++;
                if (_count > _hashes.Length)
                {
                    Array.Resize(ref _hashes, _hashes.Length * 2);
                    Array.Resize(ref _flat, _flat.Length * 2);
                    Array.Resize(ref _fractions, _fractions.Length * 2);
                }
                _hashes[id] = hash;
                reduced.CopyTo(_flat.AsSpan(id * n, n));
                // The input checks refuse totals past 64 bits; until they do (they may run beside this), wrapping is harmless.
                long total = 0;
                foreach (long v in reduced) total = unchecked(total + v);
                for (int k = 0; k < n; k++) _fractions[id * n + k] = (double)reduced[k] / total;
                _slots[slot] = id + 1;
                if (_count * 2 > _slots.Length) Grow();
                return id;
            }
            if (_hashes[entry - 1] == hash && SameRow(_flat, (entry - 1) * n, reduced)) return entry - 1;
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
        _slots = new int[_slots.Length * 2];
        int mask = _slots.Length - 1;
        for (int id = 0; id < _count; id++)
        {
            int slot = (int)(_hashes[id] & (uint)mask);
            while (_slots[slot] != 0) slot = (slot + 1) & mask;
            _slots[slot] = id + 1;
        }
    }
}
