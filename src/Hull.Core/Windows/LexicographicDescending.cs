namespace Hull.Core.Windows;

/// <summary>Orders points by their first coordinate, highest first, then the second, and so on.</summary>
internal sealed class LexicographicDescending : IComparer<IReadOnlyList<double>>
{
    public static LexicographicDescending Instance { get; } = new();

    public int Compare(IReadOnlyList<double>? a, IReadOnlyList<double>? b)
    {
        if (a is null || b is null) return (a is null).CompareTo(b is null);
        for (int i = 0; i < Math.Min(a.Count, b.Count); i++)
        {
            int c = b[i].CompareTo(a[i]);
            if (c != 0) return c;
        }

        return a.Count.CompareTo(b.Count);
    }
}
