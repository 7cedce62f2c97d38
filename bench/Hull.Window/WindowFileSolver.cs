using System.Globalization;
using System.Text;
using Hull.Core.Text;
using Hull.Core.Windows;

namespace Hull.Window;

// What "ours" computes in the windows benchmark's whole-process run, in one place: read a limits file, build the
// window polytope the way the window module does (the compound's equality, one limit per competing phase, Δμ ≤ 0,
// the implied lower bounds E_c / x_ci as the starting box, the most abundant element eliminated), enumerate its
// vertices. Compiled by Hull.Window (Native AOT) and linked into Hull.Bench, so both run the same code.

/// <summary>
/// A window limits file: line 1 "ELEMENTS PHASES"; line 2 the compound's atom fractions then its formation energy
/// per atom (eV/atom); then one line per competing phase, the same. Fractions are in one fixed element order.
/// </summary>
public sealed record WindowLimits(int Elements, double[] Compound, double CompoundEvPerAtom, double[][] Phases, double[] PhaseEvPerAtom);

public static class WindowFileSolver
{
    public static WindowLimits Read(string path) => Parse(File.ReadAllBytes(path));

    /// <summary>The limits in a file's bytes (ASCII numbers, UTF-8 at most): no string per line or per field.</summary>
    public static WindowLimits Parse(ReadOnlySpan<byte> text)
    {
        int at = 0, line = 0;
        void Numbers(ReadOnlySpan<byte> text, Span<double> values)
        {
            int expected = values.Length;
            line++;
            if (at >= text.Length) throw new FormatException($"line {line}: the file ends early");
            int end = text[at..].IndexOf((byte)'\n');
            end = end < 0 ? text.Length : at + end;
            ReadOnlySpan<byte> rest = text[at..end].TrimEnd((byte)'\r');
            at = end + 1;
            int count = 0;
            while (true)
            {
                rest = rest.TrimStart((byte)' ');
                if (rest.IsEmpty) break;
                int space = rest.IndexOf((byte)' ');
                ReadOnlySpan<byte> field = space < 0 ? rest : rest[..space];
                rest = space < 0 ? [] : rest[space..];
                if (count < expected && (!DecimalReader.TryParse(field, out values[count]) || !double.IsFinite(values[count])))
                {
                    throw new FormatException($"line {line}, field {count + 1}: '{Encoding.UTF8.GetString(field)}' is not a finite number");
                }

                count++;
            }

            if (count != expected) throw new FormatException($"line {line}: {count} numbers, expected {expected}");
        }

        Span<double> header = stackalloc double[2];
        Numbers(text, header);
        int n = (int)header[0], m = (int)header[1];
        if (n < 2 || n != header[0] || m < 0 || m != header[1]) throw new FormatException("line 1: ELEMENTS (≥ 2) and PHASES (≥ 0) must be whole numbers");
        // One line's numbers: the atom fractions, then the energy.
        Span<double> row = n < 64 ? stackalloc double[n + 1] : new double[n + 1];
        Numbers(text, row);
        double[] compound = row[..n].ToArray();
        double compoundEnergy = row[n];
        var phases = new double[m][];
        var energies = new double[m];
        for (int j = 0; j < m; j++)
        {
            Numbers(text, row);
            phases[j] = row[..n].ToArray();
            energies[j] = row[n];
        }

        return new WindowLimits(n, compound, compoundEnergy, phases, energies);
    }

    /// <summary>The vertices of the compound's window (empty when the limits leave none).</summary>
    public static PolytopeVertices Solve(WindowLimits limits)
    {
        int n = limits.Elements;
        var lower = new double[n];
        int omit = 0;
        for (int i = 0; i < n; i++)
        {
            // A window is over the compound's own elements, so each has a share and the equality bounds it below.
            if (!(limits.Compound[i] > 0)) throw new FormatException($"line 2, field {i + 1}: the compound's atom fraction must be above 0");
            lower[i] = Math.Min(limits.CompoundEvPerAtom / limits.Compound[i], 0);
            if (limits.Compound[i] >= limits.Compound[omit]) omit = i;
        }

        var inequalities = new List<HalfSpace>(limits.Phases.Length);
        for (int j = 0; j < limits.Phases.Length; j++)
        {
            // A single element at or above its reference adds nothing to Δμ ≤ 0.
            int present = 0;
            foreach (double x in limits.Phases[j]) if (x > 0) present++;
            if (present == 1 && limits.PhaseEvPerAtom[j] >= 0) continue;
            inequalities.Add(new HalfSpace(limits.Phases[j], limits.PhaseEvPerAtom[j], j));
        }

        var definition = new PolytopeDefinition(lower, new double[n], [new HalfSpace(limits.Compound, limits.CompoundEvPerAtom, -1)], inequalities, [omit]);
        return VertexEnumeration.Enumerate(definition);
    }

    public static PolytopeVertices SolveFile(string path) => Solve(Read(path));

    /// <summary>"vertices K", then one vertex per line: every element's Δμ (round-trip), in the file's order.</summary>
    public static string Format(PolytopeVertices vertices)
    {
        int length = FormatAscii(vertices, out byte[] text);
        return Encoding.ASCII.GetString(text, 0, length);
    }

    /// <summary>The same text written to <paramref name="output"/> as ASCII bytes.</summary>
    public static void WriteAscii(PolytopeVertices vertices, Stream output)
    {
        int length = FormatAscii(vertices, out byte[] text);
        output.Write(text, 0, length);
    }

    /// <summary>The text as ASCII bytes at the start of <paramref name="bytes"/>; their count.</summary>
    private static int FormatAscii(PolytopeVertices vertices, out byte[] bytes)
    {
        int width = vertices.Vertices.Count == 0 ? 0 : vertices.Vertices[0].Coordinates.Count;
        bytes = new byte[32 + vertices.Vertices.Count * width * (DecimalWriter.MaxLength + 1)];
        byte[] into = bytes;
        Span<char> number = stackalloc char[DecimalWriter.MaxLength];
        int at = 0;
        void Put(ReadOnlySpan<char> text)
        {
            // Every character of this output is ASCII.
            for (int i = 0; i < text.Length; i++) into[at++] = (byte)text[i];
        }

        Put("vertices ");
        vertices.Vertices.Count.TryFormat(number, out int written, default, CultureInfo.InvariantCulture);
        Put(number[..written]);
        into[at++] = (byte)'\n';
        foreach (PolytopeVertex v in vertices.Vertices)
        {
            for (int i = 0; i < v.Coordinates.Count; i++)
            {
                if (i > 0) into[at++] = (byte)' ';
                Put(number[..DecimalWriter.Write(v.Coordinates[i], number)]);
            }

            into[at++] = (byte)'\n';
        }

        return at;
    }
}
