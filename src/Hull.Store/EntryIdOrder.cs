namespace Hull.Store;

/// <summary>
/// The order entries are returned in: by Unicode code point, which is the order of their UTF-8 bytes and so the
/// order SQLite's BINARY collation gives. It equals <see cref="StringComparer.Ordinal"/> except where a character
/// beyond U+FFFF meets one in U+E000..U+FFFF (UTF-16 ordinal puts the surrogate pair first).
/// </summary>
public sealed class EntryIdOrder : IComparer<string>
{
    /// <summary>The single instance.</summary>
    public static EntryIdOrder Comparer { get; } = new();

    private EntryIdOrder()
    {
    }

    /// <inheritdoc />
    public int Compare(string? x, string? y)
    {
        if (ReferenceEquals(x, y)) return 0;
        if (x is null) return -1;
        if (y is null) return 1;
        int common = Math.Min(x.Length, y.Length);
        for (int i = 0; i < common; i++)
        {
            char a = x[i], b = y[i];
            if (a != b) return CodePointRank(a) - CodePointRank(b);
        }
        return x.Length - y.Length;
    }

    // Moves surrogates (U+D800..U+DFFF) above U+E000..U+FFFF so that UTF-16 code units compare like code points.
    private static int CodePointRank(char c) => c >= 0xE000 ? c - 0x800 : c >= 0xD800 ? c + 0x2000 : c;
}
