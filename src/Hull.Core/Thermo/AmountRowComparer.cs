namespace Hull.Core.Thermo;

/// <summary>Equality of integer amount rows by their values, for grouping entries of one system by composition.</summary>
internal sealed class AmountRowComparer : IEqualityComparer<long[]>
{
    public static readonly AmountRowComparer Instance = new();

    private AmountRowComparer()
    {
    }

    public bool Equals(long[]? x, long[]? y) => x is null ? y is null : y is not null && x.AsSpan().SequenceEqual(y);

    public int GetHashCode(long[] row)
    {
        var hash = default(HashCode);
        foreach (long value in row)
        {
            hash.Add(value);
        }

        return hash.ToHashCode();
    }
}
