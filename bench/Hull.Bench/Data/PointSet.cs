using System.Globalization;
using System.Text;

namespace Hull.Bench.Data;

/// <summary>
/// Points of one chemical system for the hull benchmarks: exact integer amounts per component and an energy per
/// atom (eV/atom). Also reads and writes the two text formats the whole-process runs parse.
/// </summary>
public sealed class PointSet
{
    public PointSet(int components, long[][] amounts, double[] energiesEvPerAtom)
    {
        if (amounts.Length != energiesEvPerAtom.Length) throw new ArgumentException("amounts and energies differ in length");
        Components = components;
        Amounts = amounts;
        EnergiesEvPerAtom = energiesEvPerAtom;
    }

    public int Components { get; }
    public long[][] Amounts { get; }
    public double[] EnergiesEvPerAtom { get; }
    public int Count => EnergiesEvPerAtom.Length;

    /// <summary>Atom fraction of component k in point i, as the hull engine computes it (amount / total).</summary>
    public double Fraction(int i, int k)
    {
        long total = 0;
        foreach (long a in Amounts[i]) total += a;
        return (double)Amounts[i][k] / total;
    }

    /// <summary>
    /// Our own input format: a header line "components count", then one line per point with the integer amounts
    /// and the energy per atom (round-trip decimal).
    /// </summary>
    public void WriteAmountsFile(string path)
    {
        using var w = new StreamWriter(path, false, new UTF8Encoding(false), 1 << 16);
        w.Write(Components.ToString(CultureInfo.InvariantCulture));
        w.Write(' ');
        w.WriteLine(Count.ToString(CultureInfo.InvariantCulture));
        for (int i = 0; i < Count; i++)
        {
            foreach (long a in Amounts[i])
            {
                w.Write(a.ToString(CultureInfo.InvariantCulture));
                w.Write(' ');
            }
            w.WriteLine(EnergiesEvPerAtom[i].ToString("R", CultureInfo.InvariantCulture));
        }
    }

    /// <summary>Reads <see cref="WriteAmountsFile"/>'s format; errors name the line and field.</summary>
    public static PointSet ReadAmountsFile(string path)
    {
        using var r = new StreamReader(path, Encoding.UTF8, false, 1 << 16);
        string header = r.ReadLine() ?? throw new FormatException($"{path}: empty file, expected 'components count'.");
        var head = header.Split(' ', StringSplitOptions.RemoveEmptyEntries);
        if (head.Length != 2
            || !int.TryParse(head[0], NumberStyles.Integer, CultureInfo.InvariantCulture, out int n)
            || !int.TryParse(head[1], NumberStyles.Integer, CultureInfo.InvariantCulture, out int count)
            || n < 1 || count < 0)
        {
            throw new FormatException($"{path} line 1: expected 'components count', got '{header}'.");
        }
        var amounts = new long[count][];
        var energies = new double[count];
        for (int i = 0; i < count; i++)
        {
            int lineNo = i + 2;
            string line = r.ReadLine() ?? throw new FormatException($"{path}: file ends at line {lineNo}; the header promised {count} points.");
            var span = line.AsSpan();
            var row = new long[n];
            int field = 0;
            foreach (var range in span.Split(' '))
            {
                var token = span[range];
                if (token.IsEmpty) continue;
                if (field < n)
                {
                    if (!long.TryParse(token, NumberStyles.Integer, CultureInfo.InvariantCulture, out row[field]))
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: '{token}' is not an integer amount.");
                }
                else if (field == n)
                {
                    if (!double.TryParse(token, NumberStyles.Float, CultureInfo.InvariantCulture, out energies[i]))
                        throw new FormatException($"{path} line {lineNo} field {field + 1}: '{token}' is not a number (energy, eV/atom).");
                }
                field++;
            }
            if (field != n + 1) throw new FormatException($"{path} line {lineNo}: {field} fields, expected {n} amounts and an energy.");
            amounts[i] = row;
        }
        return new PointSet(n, amounts, energies);
    }

    /// <summary>
    /// Qhull's input format for the lifted points: dimension, count, then per point the first n-1 atom fractions
    /// (the last is 1 minus their sum, so they are independent coordinates) and the energy per atom.
    /// </summary>
    public void WriteQhullFile(string path)
    {
        using var w = new StreamWriter(path, false, new UTF8Encoding(false), 1 << 16);
        w.WriteLine(Components.ToString(CultureInfo.InvariantCulture));
        w.WriteLine(Count.ToString(CultureInfo.InvariantCulture));
        for (int i = 0; i < Count; i++)
        {
            for (int k = 0; k < Components - 1; k++)
            {
                w.Write(Fraction(i, k).ToString("R", CultureInfo.InvariantCulture));
                w.Write(' ');
            }
            w.WriteLine(EnergiesEvPerAtom[i].ToString("R", CultureInfo.InvariantCulture));
        }
    }
}
