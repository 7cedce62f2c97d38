using System.Buffers.Binary;
using System.Security.Cryptography;
using System.Text;

namespace Hull.Store;

/// <summary>
/// SHA-256 over a version's rows, as 64 lowercase hex digits: equal content gives equal fingerprints whatever the
/// dataset or history, so a cache of results built from rows can key on it. The byte stream hashed is
/// <c>"hull.store.content.v1\n"</c>, then for each row in <see cref="EntryIdOrder"/>: id, formula, energy, basis
/// token, metadata. Each text is a 4-byte little-endian length of its UTF-8 bytes followed by those bytes; the
/// energy is its IEEE 754 binary64 bits, little-endian, with -0 written as +0. A row with a temperature model then
/// adds the marker FF FF FF FF (no text length is negative, so it cannot be read as the next row's id), a kind byte
/// (1: standard entropy, 2: G(T) table), the model's formula text, and either the entropy's bits or the anchor token,
/// a 4-byte little-endian point count and each point's temperature and free-energy bits. A row with an energy
/// uncertainty or a correlation group then (after the model, when it has both) adds the byte 'u', the σ's bits (NaN
/// bits when none) and the group's text (empty when none). A row with a method tag then adds the marker FE FF FF FF
/// (-2, again no text length) and the tag's text. A row with none of these adds nothing, so every version without
/// models, uncertainties and method tags keeps the fingerprint it had before they existed (and the prefix stays), and a
/// row without a later addition keeps the layout it had before that addition existed. Persisted fingerprints depend on this layout:
/// change it only together with the prefix and a schema migration that clears stored fingerprints.
/// </summary>
public static class ContentFingerprint
{
    /// <summary>Leading bytes of every fingerprinted stream; names the layout.</summary>
    public const string LayoutPrefix = "hull.store.content.v1\n";

    /// <summary>The fingerprint of a set of rows, in any order (they are sorted by id first).</summary>
    public static string Compute(IEnumerable<EntryRow> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var sorted = rows.ToList();
        sorted.Sort((a, b) => EntryIdOrder.Comparer.Compare(a.Id, b.Id));
        using var builder = new Builder();
        foreach (EntryRow row in sorted) builder.Append(row);
        return builder.Finish();
    }

    /// <summary>Hashes rows fed in id order, one at a time, so a version can be fingerprinted while it streams.</summary>
    internal sealed class Builder : IDisposable
    {
        // Where a row's temperature model begins: -1 where a text length would stand, which no text can have.
        private const int ModelMarker = -1;
        // Where a row's method tag begins, likewise.
        private const int MethodMarker = -2;
        private const byte StandardEntropyKind = 1;
        private const byte FreeEnergyTableKind = 2;

        private readonly IncrementalHash _hash = IncrementalHash.CreateHash(HashAlgorithmName.SHA256);
        private byte[] _buffer = new byte[256];

        public Builder()
        {
            _hash.AppendData(Encoding.ASCII.GetBytes(LayoutPrefix));
        }

        public void Append(EntryRow row)
        {
            int length = 0;
            WriteText(row.Id, ref length);
            WriteText(row.Formula, ref length);
            Ensure(length + 8);
            // -0.0 + 0.0 is +0.0; every other value is unchanged. SQLite gives back -0 as +0, so the two must agree.
            BinaryPrimitives.WriteInt64LittleEndian(_buffer.AsSpan(length), BitConverter.DoubleToInt64Bits(row.EnergyEv + 0.0));
            length += 8;
            WriteText(row.Basis, ref length);
            WriteText(row.Metadata ?? string.Empty, ref length);
            if (row.TemperatureModel is { } model) WriteModel(model, ref length);
            if (row.SigmaEvPerAtom is not null || row.CorrelationGroup is not null)
            {
                Ensure(length + 9);
                _buffer[length++] = (byte)'u';
                BinaryPrimitives.WriteInt64LittleEndian(_buffer.AsSpan(length), BitConverter.DoubleToInt64Bits((row.SigmaEvPerAtom ?? double.NaN) + 0.0));
                length += 8;
                WriteText(row.CorrelationGroup ?? string.Empty, ref length);
            }
            if (row.Method is { } method)
            {
                Ensure(length + 4);
                BinaryPrimitives.WriteInt32LittleEndian(_buffer.AsSpan(length), MethodMarker);
                length += 4;
                WriteText(method, ref length);
            }
            _hash.AppendData(_buffer, 0, length);
        }

        public string Finish() => Convert.ToHexStringLower(_hash.GetHashAndReset());

        public void Dispose() => _hash.Dispose();

        private void WriteModel(StoredTemperatureModel model, ref int length)
        {
            Ensure(length + 5);
            BinaryPrimitives.WriteInt32LittleEndian(_buffer.AsSpan(length), ModelMarker);
            _buffer[length + 4] = model.IsFreeEnergyTable ? FreeEnergyTableKind : StandardEntropyKind;
            length += 5;
            WriteText(model.Formula, ref length);
            if (model.StandardEntropyJPerMolK is double entropy)
            {
                WriteDouble(entropy, ref length);
                return;
            }
            WriteText(model.FreeEnergyAnchor!, ref length);
            Ensure(length + 4);
            BinaryPrimitives.WriteInt32LittleEndian(_buffer.AsSpan(length), model.FreeEnergyPoints.Length);
            length += 4;
            foreach (StoredFreeEnergyPoint point in model.FreeEnergyPoints)
            {
                WriteDouble(point.TemperatureK, ref length);
                WriteDouble(point.FreeEnergyAboveAnchorEv, ref length);
            }
        }

        // -0.0 + 0.0 is +0.0; every other value is unchanged, as for the energy.
        private void WriteDouble(double value, ref int length)
        {
            Ensure(length + 8);
            BinaryPrimitives.WriteInt64LittleEndian(_buffer.AsSpan(length), BitConverter.DoubleToInt64Bits(value + 0.0));
            length += 8;
        }

        private void WriteText(string text, ref int length)
        {
            int byteCount = Encoding.UTF8.GetByteCount(text);
            Ensure(length + 4 + byteCount);
            BinaryPrimitives.WriteInt32LittleEndian(_buffer.AsSpan(length), byteCount);
            length += 4;
            length += Encoding.UTF8.GetBytes(text, _buffer.AsSpan(length));
        }

        private void Ensure(int size)
        {
            if (size > _buffer.Length) Array.Resize(ref _buffer, Math.Max(size, _buffer.Length * 2));
        }
    }
}
