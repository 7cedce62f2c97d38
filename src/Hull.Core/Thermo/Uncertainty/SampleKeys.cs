namespace Hull.Core.Thermo.Uncertainty;

/// <summary>
/// Decompositions and stable sets interned as sorted canonical point indices: each distinct key gets the next id,
/// looked up by span so that a key seen before costs no allocation.
/// </summary>
internal sealed class SampleKeys
{
    private readonly Dictionary<int[], int> _ids = new(KeyComparer.Instance);
    private readonly Dictionary<int[], int>.AlternateLookup<ReadOnlySpan<int>> _bySpan;
    private readonly List<int[]> _keys = [];

    public SampleKeys() => _bySpan = _ids.GetAlternateLookup<ReadOnlySpan<int>>();

    /// <summary>Keys interned so far (ids 0 .. Count − 1).</summary>
    public int Count => _keys.Count;

    /// <summary>The key of id <paramref name="id"/>.</summary>
    public int[] this[int id] => _keys[id];

    /// <summary>The id of <paramref name="key"/>, a new one if it was not seen before.</summary>
    public int Intern(ReadOnlySpan<int> key)
    {
        if (_bySpan.TryGetValue(key, out int id))
        {
            return id;
        }

        id = _keys.Count;
        int[] stored = key.ToArray();
        _keys.Add(stored);
        _ids.Add(stored, id);
        return id;
    }

    /// <summary>As <see cref="Intern(ReadOnlySpan{int})"/>, keeping <paramref name="key"/> itself when it is new (it is never changed after).</summary>
    public int InternShared(int[] key)
    {
        if (_ids.TryGetValue(key, out int id))
        {
            return id;
        }

        id = _keys.Count;
        _keys.Add(key);
        _ids.Add(key, id);
        return id;
    }

    /// <summary>Orders keys as sequences (the tie-break of the most frequent key).</summary>
    public static int Compare(int[] x, int[] y) => x.AsSpan().SequenceCompareTo(y);

    private sealed class KeyComparer : IEqualityComparer<int[]>, IAlternateEqualityComparer<ReadOnlySpan<int>, int[]>
    {
        public static KeyComparer Instance { get; } = new();

        public bool Equals(int[]? x, int[]? y) => x.AsSpan().SequenceEqual(y);

        public int GetHashCode(int[] key) => Hash(key);

        public bool Equals(ReadOnlySpan<int> alternate, int[] other) => alternate.SequenceEqual(other);

        public int GetHashCode(ReadOnlySpan<int> alternate) => Hash(alternate);

        public int[] Create(ReadOnlySpan<int> alternate) => alternate.ToArray();

        private static int Hash(ReadOnlySpan<int> key)
        {
            var hash = new HashCode();
            foreach (int k in key)
            {
                hash.Add(k);
            }

            return hash.ToHashCode();
        }
    }
}
