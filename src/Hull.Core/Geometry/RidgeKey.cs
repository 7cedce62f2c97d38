namespace Hull.Core.Geometry;

/// <summary>The sorted vertex set of a ridge (a facet less one vertex), for pairing new facets across shared ridges.</summary>
internal readonly struct RidgeKey : IEquatable<RidgeKey>
{
    private readonly int[] _sorted;
    private readonly int _hash;

    private RidgeKey(int[] sorted)
    {
        _sorted = sorted;
        var h = new HashCode();
        foreach (int v in sorted) h.Add(v);
        _hash = h.ToHashCode();
    }

    public static RidgeKey Of(int[] vertices, int offset, int count, int skipSlot)
    {
        var sorted = new int[count - 1];
        int j = 0;
        for (int i = 0; i < count; i++)
        {
            if (i != skipSlot) sorted[j++] = vertices[offset + i];
        }
        Array.Sort(sorted);
        return new RidgeKey(sorted);
    }

    public bool Equals(RidgeKey other) => _sorted.AsSpan().SequenceEqual(other._sorted);

    public override bool Equals(object? obj) => obj is RidgeKey other && Equals(other);

    public override int GetHashCode() => _hash;
}
