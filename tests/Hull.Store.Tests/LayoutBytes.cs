using System.Text;

namespace Hull.Store.Tests;

/// <summary>The fingerprint's documented byte layout written out by hand, piece by piece, to hash with an outside tool.</summary>
internal sealed class LayoutBytes
{
    private readonly List<byte> _bytes = [.. "hull.store.content.v1\n"u8.ToArray()];

    /// <summary>A 4-byte little-endian length of the UTF-8 bytes, then the bytes.</summary>
    public LayoutBytes Text(string s)
    {
        byte[] utf8 = Encoding.UTF8.GetBytes(s);
        _bytes.AddRange(BitConverter.GetBytes(utf8.Length)); // little-endian on every platform .NET runs here
        _bytes.AddRange(utf8);
        return this;
    }

    /// <summary>A binary64's bits, little-endian.</summary>
    public LayoutBytes Double(double d) => Raw(BitConverter.GetBytes(d));

    public LayoutBytes Raw(params byte[] bytes)
    {
        _bytes.AddRange(bytes);
        return this;
    }

    public byte[] ToArray() => [.. _bytes];
}
