using System.Globalization;
using System.Text;

namespace Hull.Bench.Data;

/// <summary>
/// Points of one chemical system for the hull benchmarks: exact integer amounts per component and an energy per
/// atom (eV/atom). Also writes the two text formats the whole-process runs parse (ours is read by
/// Hull.Solve.PointsFileSolver.Read).
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
    /// and the energy per atom (round-trip decimal), as Hull.Solve.PointsFileSolver.Read expects.
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
