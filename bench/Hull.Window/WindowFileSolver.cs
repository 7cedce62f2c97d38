using System.Globalization;
using System.Text;
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
    public static WindowLimits Read(string path)
    {
        // One read of the whole file and numbers parsed from spans: no string per line or per field.
        string text = File.ReadAllText(path);
        int at = 0, line = 0;
        double[] Numbers(int expected)
        {
            line++;
            if (at >= text.Length) throw new FormatException($"line {line}: the file ends early");
            int end = text.IndexOf('\n', at);
            if (end < 0) end = text.Length;
            ReadOnlySpan<char> rest = text.AsSpan(at, end - at).TrimEnd('\r');
            at = end + 1;
            var values = new double[expected];
            int count = 0;
            while (true)
            {
                rest = rest.TrimStart(' ');
                if (rest.IsEmpty) break;
                int space = rest.IndexOf(' ');
                ReadOnlySpan<char> field = space < 0 ? rest : rest[..space];
                rest = space < 0 ? [] : rest[space..];
                if (count < expected && (!double.TryParse(field, NumberStyles.Float, CultureInfo.InvariantCulture, out values[count]) || !double.IsFinite(values[count])))
                {
                    throw new FormatException($"line {line}, field {count + 1}: '{field}' is not a finite number");
                }

                count++;
            }

            if (count != expected) throw new FormatException($"line {line}: {count} numbers, expected {expected}");
            return values;
        }

        double[] header = Numbers(2);
        int n = (int)header[0], m = (int)header[1];
        if (n < 2 || n != header[0] || m < 0 || m != header[1]) throw new FormatException("line 1: ELEMENTS (≥ 2) and PHASES (≥ 0) must be whole numbers");
        double[] compound = Numbers(n + 1);
        var phases = new double[m][];
        var energies = new double[m];
        for (int j = 0; j < m; j++)
        {
            double[] row = Numbers(n + 1);
            phases[j] = row[..n];
            energies[j] = row[n];
        }

        return new WindowLimits(n, compound[..n], compound[n], phases, energies);
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
            if (limits.Phases[j].Count(x => x > 0) == 1 && limits.PhaseEvPerAtom[j] >= 0) continue;
            inequalities.Add(new HalfSpace(limits.Phases[j], limits.PhaseEvPerAtom[j], j));
        }

        var definition = new PolytopeDefinition(lower, new double[n], [new HalfSpace(limits.Compound, limits.CompoundEvPerAtom, -1)], inequalities, [omit]);
        return VertexEnumeration.Enumerate(definition);
    }

    public static PolytopeVertices SolveFile(string path) => Solve(Read(path));

    /// <summary>"vertices K", then one vertex per line: every element's Δμ (round-trip), in the file's order.</summary>
    public static string Format(PolytopeVertices vertices)
    {
        var b = new StringBuilder(64 + vertices.Vertices.Count * 120);
        b.Append("vertices ").Append(vertices.Vertices.Count.ToString(CultureInfo.InvariantCulture)).Append('\n');
        foreach (PolytopeVertex v in vertices.Vertices)
        {
            for (int i = 0; i < v.Coordinates.Count; i++)
            {
                if (i > 0) b.Append(' ');
                b.Append(CultureInfo.InvariantCulture, $"{v.Coordinates[i]:R}");
            }

            b.Append('\n');
        }

        return b.ToString();
    }
}
