using System.Buffers.Binary;
using System.Security.Cryptography;
using System.Text;

namespace Hull.Store;

/// <summary>
/// SHA-256 of a defect study's texts as 64 lowercase hex digits: the prefix <c>"hull.store.defect-study.v1\n"</c>,
/// then the JSON and the CSV, each as a 4-byte little-endian length of its UTF-8 bytes followed by those bytes.
/// </summary>
public static class DefectStudyFingerprint
{
    public const string LayoutPrefix = "hull.store.defect-study.v1\n";

    public static string Compute(string studyJson, string chargeStatesCsv)
    {
        using var hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        hash.AppendData(Encoding.UTF8.GetBytes(LayoutPrefix));
        Span<byte> length = stackalloc byte[4];
        foreach (string text in new[] { studyJson, chargeStatesCsv })
        {
            byte[] bytes = Encoding.UTF8.GetBytes(text);
            BinaryPrimitives.WriteInt32LittleEndian(length, bytes.Length);
            hash.AppendData(length);
            hash.AppendData(bytes);
        }

        return Convert.ToHexStringLower(hash.GetHashAndReset());
    }
}
