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
            double e = hull.EnergyAboveHullEvPerAtom(i);
            sum += e;
            if (e == 0.0) onHull++;
        }
        var summary = hull is LowerHull facets
            ? new SolveSummary("hull", hull.VertexPoints.Count, facets.Facets.Count, onHull, sum)
            : new SolveSummary("programs", hull.VertexPoints.Count, null, onHull, sum);
        return new SolvedPoints(hull, summary);
    }

    /// <summary>
    /// From this many entries on, the two halves of the file are parsed at the same time on two cores (the second
    /// worker first counts the lines of the first half, so it knows which entries its half holds).
    /// </summary>
    private const long TwoWorkersFromEntries = 16_384;

    /// <summary>
    /// Reads a points file: a header line "components count", then one line per entry with the integer amounts of
    /// the components and the energy per atom (eV/atom), fields separated by spaces or tabs, lines ended by LF or
    /// CRLF. Errors (FormatException) name the file, the line and the field; of several faults, the first in the
    /// file is reported.
    /// </summary>
    public static PointsFile Read(string path)
    {
        using var stream = OpenForReading(path);
        long fileBytes = stream.Length;
        var lines = new LineReader(stream, fileBytes);
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
        if ((double)count * (2 * n + 1) > fileBytes)
        {
            throw new FormatException($"{path} line 1: the header promises {count} entries of {n} components, more than the file's {fileBytes} bytes can hold.");
        }

        var body = new Body(path, (int)n, (int)count);
        long bodyStart = lines.Position;
        long split = count >= TwoWorkersFromEntries && Environment.ProcessorCount > 1 ? LineStartAfter(stream, bodyStart + (fileBytes - bodyStart) / 2, fileBytes) : fileBytes;
        if (split >= fileBytes)
        {
            long entryLines = body.Parse(lines, firstLineNumber: 2);
            body.CheckComplete(entryLines);
            return body.Points;
        }

        // The second half on a worker, the first here. Each parse stops at its half's first fault; the first half's
        // fault comes first in the file, so it is reported before the second's.
        var second = Task.Run(() =>
        {
            using var secondStream = OpenForReading(path);
            long firstHalfLines = CountLines(secondStream, bodyStart, split);
            secondStream.Position = split;
            return body.Parse(new LineReader(secondStream, fileBytes - split), firstLineNumber: 2 + firstHalfLines);
        });
        long firstLines;
        try
        {
            stream.Position = bodyStart;
            firstLines = body.Parse(new LineReader(stream, split - bodyStart), firstLineNumber: 2);
        }
        catch (FormatException)
        {
            // Let the worker finish before reporting: it reads the file, which the caller may delete next.
            try { second.Wait(); } catch (AggregateException) { }
            throw;
        }
        body.CheckComplete(firstLines + second.GetAwaiter().GetResult());
        return body.Points;
    }

    private static FileStream OpenForReading(string path) =>
        new(path, FileMode.Open, FileAccess.Read, FileShare.Read, bufferSize: 1, FileOptions.SequentialScan);

    /// <summary>The offset just after the first LF at or after <paramref name="from"/> (the end when none); moves the stream.</summary>
    private static long LineStartAfter(Stream stream, long from, long end)
    {
        stream.Position = from;
        var buffer = new byte[4096];
        for (long at = from; at < end;)
        {
            int read = stream.Read(buffer, 0, (int)Math.Min(buffer.Length, end - at));
            if (read == 0) break;
            int newline = buffer.AsSpan(0, read).IndexOf((byte)'\n');
            if (newline >= 0) return at + newline + 1;
            at += read;
        }
        return end;
    }

    /// <summary>Number of LFs in [from, to): the lines of a range that ends just after one.</summary>
    private static long CountLines(Stream stream, long from, long to)
    {
        stream.Position = from;
        var buffer = new byte[1 << 16];
        long lines = 0;
        for (long at = from; at < to;)
        {
            int read = stream.Read(buffer, 0, (int)Math.Min(buffer.Length, to - at));
            if (read == 0) break;
            lines += buffer.AsSpan(0, read).Count((byte)'\n');
            at += read;
        }
        return lines;
    }

    /// <summary>The entries of a points file, filled by the parses of its line ranges.</summary>
    private sealed class Body(string path, int components, int count)
    {
        private readonly long[] _amounts = new long[(long)count * components];
        private readonly double[] _energies = new double[count];

        public PointsFile Points => new(components, _amounts, _energies);

        /// <summary>
        /// Parses every line of <paramref name="lines"/>, the first being file line <paramref name="firstLineNumber"/>
        /// (entry firstLineNumber − 2); returns the number of lines read. Lines after the promised entries must be blank.
        /// </summary>
        public long Parse(LineReader lines, long firstLineNumber)
        {
            long lineNo = firstLineNumber - 1;
            while (lines.TryReadLine(out var line))
            {
                lineNo++;
                long entry = lineNo - 2;
                if (entry >= count)
                {
                    int p = 0;
                    if (NextField(line, ref p, out _))
                    {
                        throw new FormatException($"{path} line {lineNo}: more entries than the header's count ({count}).");
                    }
                    continue;
                }
                ParseEntry(line, lineNo, (int)entry);
            }
            return lineNo - (firstLineNumber - 1);
        }

        /// <summary>Throws when the file's <paramref name="lines"/> after the header hold fewer entries than promised.</summary>
        public void CheckComplete(long lines)
        {
            if (lines < count) throw new FormatException($"{path}: file ends at line {lines + 2}; the header promised {count} entries.");
        }

        private void ParseEntry(ReadOnlySpan<byte> line, long lineNo, int i)
        {
            var row = _amounts.AsSpan(i * components, components);
            int field = 0;
            int pos = 0;
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
                    if (!double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out _energies[i]))
                    {
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: '{Show(token)}' is not a number (energy, eV/atom).");
                    }
                    if (!double.IsFinite(_energies[i]))
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
    private sealed class LineReader(Stream stream, long limitBytes)
    {
        private const int InitialBufferBytes = 1 << 16;
        private readonly long _origin = stream.Position;
        private byte[] _buffer = new byte[InitialBufferBytes];
        private int _start;
        private int _end;
        private long _consumed;
        private bool _endOfStream;

        /// <summary>Number of lines returned so far.</summary>
        private long _lines;

        /// <summary>The stream offset just after the last line returned.</summary>
        public long Position => _origin + _consumed - (_end - _start);

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
                int read = stream.Read(_buffer, _end, (int)Math.Min(_buffer.Length - _end, limitBytes - _consumed));
                if (read == 0) _endOfStream = true;
                _end += read;
                _consumed += read;
            }
        }

        private ReadOnlySpan<byte> Complete(int start, int length)
        {
            var line = new ReadOnlySpan<byte>(_buffer, start, length);
            // A byte order mark can only start the file, whose first line is read from offset 0.
            if (_lines == 0 && _origin == 0 && line.StartsWith("\uFEFF"u8)) line = line[3..];
            if (!line.IsEmpty && line[^1] == (byte)'\r') line = line[..^1];
            _lines++;
            return line;
        }
    }
}
