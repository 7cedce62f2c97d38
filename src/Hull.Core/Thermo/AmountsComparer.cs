namespace Hull.Core.Thermo;

/// <summary>Compares integer amount vectors element by element (reduced compositions as dictionary keys).</summary>
internal sealed class AmountsComparer : IEqualityComparer<long[]>
{
    public static readonly AmountsComparer Instance = new();

    public bool Equals(long[]? x, long[]? y) => x.AsSpan().SequenceEqual(y);

    public int GetHashCode(long[] amounts)
    {
        var hash = new HashCode();
        foreach (long a in amounts)
        {
            hash.Add(a);
        }

        return hash.ToHashCode();
    }
}
