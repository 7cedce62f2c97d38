using System.Globalization;
using System.Text;
using Hull.Core.Geometry;

namespace Hull.Solve;

// What "ours" computes in the hull benchmarks, in one place: read a points file, build the lower hull, compute
// every entry's energy above hull, summarise in one line. Compiled by Hull.Solve (the Native AOT executable the
// suites time as a whole process) and linked into Hull.Bench (the in-process timing and the check of the summary),
// so both always run the same code.

/// <summary>The points of a points file: exact integer amounts per component and an energy per atom (eV/atom).</summary>
public sealed class PointsFile
{
    public PointsFile(int components, long[] amountsRowMajor, double[] energiesEvPerAtom)
    {
        if (amountsRowMajor.Length != (long)components * energiesEvPerAtom.Length) throw new ArgumentException("amounts and energies differ in length");
        Components = components;
        AmountsRowMajor = amountsRowMajor;
        EnergiesEvPerAtom = energiesEvPerAtom;
    }

    /// <summary>Points given one array per point, stored row after row.</summary>
    public static PointsFile FromRows(int components, IReadOnlyList<long[]> rows, double[] energiesEvPerAtom)
    {
        var flat = new long[rows.Count * components];
        for (int i = 0; i < rows.Count; i++) rows[i].CopyTo(flat, i * components);
        return new PointsFile(components, flat, energiesEvPerAtom);
    }

    public int Components { get; }

    /// <summary>Amounts row after row: point i's are [i * Components, (i + 1) * Components).</summary>
    public long[] AmountsRowMajor { get; }

    public ReadOnlySpan<long> Row(int i) => AmountsRowMajor.AsSpan(i * Components, Components);
    public double[] EnergiesEvPerAtom { get; }
    public int Count => EnergiesEvPerAtom.Length;
}

/// <summary>
/// The one-line output of a solve: "engine=E vertices=V facets=F on_hull=H sum_eah=S" (E "hull" or "programs";
/// F "none" where the engine builds no facets; S round-trip, eV/atom), which the bench compares between the whole
/// process and the in-process run.
/// </summary>
public readonly record struct SolveSummary(string Engine, int Vertices, int? Facets, int OnHull, double SumEnergyAboveHullEvPerAtom)
{
    public string Format() => string.Create(CultureInfo.InvariantCulture,
        $"engine={Engine} vertices={Vertices} facets={(Facets is int f ? f.ToString(CultureInfo.InvariantCulture) : "none")} on_hull={OnHull} sum_eah={SumEnergyAboveHullEvPerAtom:R}");

    /// <summary>Reads <see cref="Format"/>'s line back; throws FormatException naming what is missing.</summary>
    public static SolveSummary Parse(string line)
    {
        int? vertices = null, facets = null, onHull = null;
        double? sum = null;
        string? engine = null, facetsText = null;
        foreach (string field in line.Trim().Split(' ', StringSplitOptions.RemoveEmptyEntries))
        {
            int eq = field.IndexOf('=');
            if (eq <= 0) continue;
            string key = field[..eq], value = field[(eq + 1)..];
            switch (key)
            {
                case "vertices": vertices = int.Parse(value, NumberStyles.Integer, CultureInfo.InvariantCulture); break;
                case "engine": engine = value; break;
                case "facets":
                    facetsText = value;
                    facets = value == "none" ? null : int.Parse(value, NumberStyles.Integer, CultureInfo.InvariantCulture);
                    break;
                case "on_hull": onHull = int.Parse(value, NumberStyles.Integer, CultureInfo.InvariantCulture); break;
                case "sum_eah": sum = double.Parse(value, NumberStyles.Float, CultureInfo.InvariantCulture); break;
            }
        }
        if (engine is null || vertices is null || facetsText is null || onHull is null || sum is null)
        {
            throw new FormatException($"expected 'engine=E vertices=V facets=F on_hull=H sum_eah=S', got '{line.Trim()}'");
        }
        return new SolveSummary(engine, vertices.Value, facets, onHull.Value, sum.Value);
    }
}

/// <summary>A built hull and its summary.</summary>
public sealed record SolvedPoints(IHullStability Hull, SolveSummary Summary);

/// <summary>Read, build, summarise.</summary>
public static class PointsFileSolver
{
    /// <summary>The whole job of the executable: read <paramref name="path"/>, then <see cref="Solve"/>.</summary>
    public static SolvedPoints SolveFile(string path)
    {
        var points = Read(path);
        return Solve(points);
    }

    /// <summary>
    /// HullStability.Build (the engine the library picks for the data), then the energy above hull of every entry
    /// (summed, and counted where zero).
    /// </summary>
    public static SolvedPoints Solve(PointsFile points)
    {
        // One array for all amounts: no small array per point to allocate and fault in.
        var hull = HullStability.Build(points.AmountsRowMajor, points.Components, points.EnergiesEvPerAtom);
        double[] energiesEvPerAtom = points.EnergiesEvPerAtom;
        double sum = 0;
        int onHull = 0;
        for (int i = 0; i < energiesEvPerAtom.Length; i++)
        {
            double e = hull.EnergyAboveHull(i);
            sum += e;
            if (e == 0.0) onHull++;
        }
        var summary = hull is LowerHull facets
            ? new SolveSummary("hull", hull.VertexPoints.Count, facets.Facets.Count, onHull, sum)
            : new SolveSummary("programs", hull.VertexPoints.Count, null, onHull, sum);
        return new SolvedPoints(hull, summary);
    }

    /// <summary>
    /// Reads a points file: a header line "components count", then one line per entry with the integer amounts of
    /// the components and the energy per atom (eV/atom), fields separated by spaces or tabs, lines ended by LF or
    /// CRLF. Errors (FormatException) name the file, the line and the field.
    /// </summary>
    public static PointsFile Read(string path)
    {
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 1, FileOptions.SequentialScan);
        var lines = new LineReader(stream);
        if (!lines.TryReadLine(out var header)) throw new FormatException($"{path}: empty file, expected 'components count'.");
        int pos = 0;
        if (!NextField(header, ref pos, out var f1) || !NextField(header, ref pos, out var f2) || NextField(header, ref pos, out _)
            || !TryParseInteger(f1, out long n) || !TryParseInteger(f2, out long count)
            || n < 1 || n > int.MaxValue || count < 0 || count > int.MaxValue)
        {
            throw new FormatException($"{path} line 1: expected 'components count' (positive and non-negative integers), got '{Show(header)}'.");
        }
        // Every entry line holds n + 1 fields of at least one byte and n separators: a count the file cannot hold is
        // refused here rather than after allocating room for it.
        if ((double)count * (2 * n + 1) > stream.Length)
        {
            throw new FormatException($"{path} line 1: the header promises {count} entries of {n} components, more than the file's {stream.Length} bytes can hold.");
        }

        int components = (int)n;
        var amounts = new long[count * components];
        var energies = new double[count];
        for (int i = 0; i < count; i++)
        {
            long lineNo = i + 2;
            if (!lines.TryReadLine(out var line))
            {
                throw new FormatException($"{path}: file ends at line {lineNo}; the header promised {count} entries.");
            }
            var row = amounts.AsSpan((int)(i * components), components);
            int field = 0;
            pos = 0;
            while (NextField(line, ref pos, out var token))
            {
                if (field < components)
                {
                    if (!TryParseInteger(token, out row[field]))
                    {
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: '{Show(token)}' is not an integer amount (64-bit).");
                    }
                    if (row[field] < 0)
                    {
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: amount {row[field]} is negative.");
                    }
                }
                else if (field == components)
                {
                    if (!double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out energies[i]))
                    {
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: '{Show(token)}' is not a number (energy, eV/atom).");
                    }
                    if (!double.IsFinite(energies[i]))
                    {
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: energy '{Show(token)}' is not finite.");
                    }
                }
                field++;
            }
            if (field != components + 1)
            {
                throw new FormatException($"{path} line {lineNo}: {field} fields, expected {components} amounts and an energy.");
            }
        }
        while (lines.TryReadLine(out var extra))
        {
            int p = 0;
            if (NextField(extra, ref p, out _))
            {
                throw new FormatException($"{path} line {lines.LineNumber}: more entries than the header's count ({count}).");
            }
        }
        return new PointsFile(components, amounts, energies);
    }

    /// <summary>The next field of <paramref name="line"/> from <paramref name="pos"/> on (spaces and tabs separate).</summary>
    private static bool NextField(ReadOnlySpan<byte> line, ref int pos, out ReadOnlySpan<byte> field)
    {
        while (pos < line.Length && (line[pos] == (byte)' ' || line[pos] == (byte)'\t')) pos++;
        int start = pos;
        while (pos < line.Length && line[pos] != (byte)' ' && line[pos] != (byte)'\t') pos++;
        field = line[start..pos];
        return pos > start;
    }

    /// <summary>An optionally signed decimal integer that fits in 64 bits; nothing else (no spaces, no separators).</summary>
    private static bool TryParseInteger(ReadOnlySpan<byte> s, out long value)
    {
        value = 0;
        int i = 0;
        bool negative = false;
        if (s.Length > 0 && (s[0] == (byte)'-' || s[0] == (byte)'+'))
        {
            negative = s[0] == (byte)'-';
            i = 1;
        }
        if (i == s.Length) return false;
        // Accumulate as a negative number: its range reaches long.MinValue, which the positive side cannot hold.
        long acc = 0;
        for (; i < s.Length; i++)
        {
            uint digit = (uint)(s[i] - (byte)'0');
            if (digit > 9) return false;
            if (acc < (long.MinValue + digit) / 10) return false;
            acc = acc * 10 - digit;
        }
        if (!negative)
        {
            if (acc == long.MinValue) return false;
            acc = -acc;
        }
        value = acc;
        return true;
    }

    /// <summary>Bytes of the input for an error message (shortened: a bad line may be huge).</summary>
    private static string Show(ReadOnlySpan<byte> bytes)
    {
        const int MaxShown = 60;
        return bytes.Length <= MaxShown ? Encoding.UTF8.GetString(bytes) : Encoding.UTF8.GetString(bytes[..MaxShown]) + "...";
    }

    /// <summary>
    /// Lines of a stream as byte spans into one growing buffer (valid until the next call), without a string per
    /// line. A UTF-8 byte order mark at the start is skipped and a CR before the LF dropped.
    /// </summary>
    private sealed class LineReader(Stream stream)
    {
        private const int InitialBufferBytes = 1 << 16;
        private byte[] _buffer = new byte[InitialBufferBytes];
        private int _start;
        private int _end;
        private bool _endOfStream;

        /// <summary>1-based number of the line last returned.</summary>
        public long LineNumber { get; private set; }

        public bool TryReadLine(out ReadOnlySpan<byte> line)
        {
            int searched = 0;
            while (true)
            {
                int newline = _buffer.AsSpan(_start + searched, _end - _start - searched).IndexOf((byte)'\n');
                if (newline >= 0)
                {
                    line = Complete(_start, searched + newline);
                    _start += searched + newline + 1;
                    return true;
                }
                searched = _end - _start;
                if (_endOfStream)
                {
                    if (_start == _end)
                    {
                        line = default;
                        return false;
                    }
                    line = Complete(_start, _end - _start);
                    _start = _end;
                    return true;
                }
                if (_start > 0)
                {
                    Buffer.BlockCopy(_buffer, _start, _buffer, 0, _end - _start);
                    _end -= _start;
                    _start = 0;
                }
                if (_end == _buffer.Length) Array.Resize(ref _buffer, _buffer.Length * 2);
                int read = stream.Read(_buffer, _end, _buffer.Length - _end);
                if (read == 0) _endOfStream = true;
                _end += read;
            }
        }

        private ReadOnlySpan<byte> Complete(int start, int length)
        {
            var line = new ReadOnlySpan<byte>(_buffer, start, length);
            if (LineNumber == 0 && line.StartsWith("\uFEFF"u8)) line = line[3..];
            if (!line.IsEmpty && line[^1] == (byte)'\r') line = line[..^1];
            LineNumber++;
            return line;
        }
    }
}
