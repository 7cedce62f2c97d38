using System.Buffers.Binary;
using System.IO.Compression;

namespace Hull.Core.Tests.Figures;

/// <summary>
/// Reads the 8-bit RGB or RGBA, non-interlaced PNGs that rsvg-convert writes (PNG specification, ISO/IEC 15948:
/// chunks, zlib-compressed scanlines, filter types 0-4 with the Paeth predictor).
/// </summary>
public sealed class PngImage
{
    private readonly byte[] _pixels;
    private readonly int _channels;

    private PngImage(int width, int height, int channels, byte[] pixels)
    {
        (Width, Height, _channels, _pixels) = (width, height, channels, pixels);
    }

    public int Width { get; }

    public int Height { get; }

    /// <summary>Red, green, blue, alpha of pixel (x, y).</summary>
    public (byte R, byte G, byte B, byte A) At(int x, int y)
    {
        int i = (y * Width + x) * _channels;
        return (_pixels[i], _pixels[i + 1], _pixels[i + 2], _channels == 4 ? _pixels[i + 3] : (byte)255);
    }

    public static PngImage Read(byte[] file)
    {
        byte[] signature = [137, 80, 78, 71, 13, 10, 26, 10];
        Assert.True(file.AsSpan(0, 8).SequenceEqual(signature), "not a PNG file");
        int at = 8, width = 0, height = 0, channels = 0;
        using var compressed = new MemoryStream();
        while (at < file.Length)
        {
            int length = BinaryPrimitives.ReadInt32BigEndian(file.AsSpan(at));
            string type = System.Text.Encoding.ASCII.GetString(file, at + 4, 4);
            ReadOnlySpan<byte> data = file.AsSpan(at + 8, length);
            if (type == "IHDR")
            {
                width = BinaryPrimitives.ReadInt32BigEndian(data);
                height = BinaryPrimitives.ReadInt32BigEndian(data[4..]);
                Assert.Equal(8, data[8]);
                channels = data[9] switch { 6 => 4, 2 => 3, _ => throw new NotSupportedException($"PNG colour type {data[9]}") };
                Assert.Equal(0, data[12]);
            }
            else if (type == "IDAT")
            {
                compressed.Write(data);
            }
            else if (type == "IEND")
            {
                break;
            }

            at += 12 + length;
        }

        compressed.Position = 0;
        using var inflate = new ZLibStream(compressed, CompressionMode.Decompress);
        using var raw = new MemoryStream();
        inflate.CopyTo(raw);
        byte[] bytes = raw.ToArray();
        int stride = width * channels;
        Assert.Equal(height * (stride + 1), bytes.Length);
        var pixels = new byte[height * stride];
        for (int y = 0; y < height; y++)
        {
            byte filter = bytes[y * (stride + 1)];
            for (int x = 0; x < stride; x++)
            {
                int value = bytes[y * (stride + 1) + 1 + x];
                int left = x >= channels ? pixels[y * stride + x - channels] : 0;
                int up = y > 0 ? pixels[(y - 1) * stride + x] : 0;
                int upLeft = x >= channels && y > 0 ? pixels[(y - 1) * stride + x - channels] : 0;
                int predictor = filter switch
                {
                    0 => 0,
                    1 => left,
                    2 => up,
                    3 => (left + up) / 2,
                    4 => Paeth(left, up, upLeft),
                    _ => throw new NotSupportedException($"PNG filter {filter}"),
                };
                pixels[y * stride + x] = (byte)(value + predictor);
            }
        }

        return new PngImage(width, height, channels, pixels);
    }

    private static int Paeth(int a, int b, int c)
    {
        int p = a + b - c;
        int pa = Math.Abs(p - a), pb = Math.Abs(p - b), pc = Math.Abs(p - c);
        return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
    }
}
