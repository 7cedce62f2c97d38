namespace Hull.Bench.Data;

/// <summary>
/// The "pair" family: every component's amount an independent small integer (0 to <see cref="MaxAmount"/>, at least
/// two nonzero), energies from random pair interactions plus a mostly positive offset. Unlike the lattice family,
/// most entries hold many components at once, and the background is not convex, so few compositions are stable:
/// a hull with few vertices over many points spread through the whole simplex.
/// </summary>
/// <remarks>
/// E(x) = Σ_{i&lt;j} 2 W_ij x_i x_j + δ with W_ij uniform in [-<see cref="MaxPairEvPerAtom"/>, 0] (mean -0.5 eV/atom,
/// the usual size of mixing energies) and δ = <see cref="OffsetScaleEvPerAtom"/> · (Exp(1) − <see cref="OffsetShift"/>):
/// about 0.1 eV/atom, positive for four entries in five (hypothetical structures above the ground state).
/// The elements sit at 0.
/// </remarks>
public static class PairInteractionGenerator
{
    public const int MaxAmount = 5;
    public const double MaxPairEvPerAtom = 1.0;
    public const double OffsetScaleEvPerAtom = 0.1;
    public const double OffsetShift = 0.2;

    public static PointSet Generate(int components, int entries, int seed)
    {
        if (components < 2) throw new ArgumentOutOfRangeException(nameof(components));
        if (entries < components) throw new ArgumentOutOfRangeException(nameof(entries));
        var rng = new Random(seed);
        var w = new double[components, components];
        for (int i = 0; i < components; i++)
        for (int j = i + 1; j < components; j++) w[i, j] = -MaxPairEvPerAtom * rng.NextDouble();
        var amounts = new long[entries][];
        var energies = new double[entries];
        for (int k = 0; k < components; k++)
        {
            amounts[k] = new long[components];
            amounts[k][k] = 1;
        }
        for (int p = components; p < entries; p++)
        {
            var row = new long[components];
            int nonzero;
            do
            {
                nonzero = 0;
                for (int k = 0; k < components; k++)
                {
                    row[k] = rng.Next(MaxAmount + 1);
                    if (row[k] != 0) nonzero++;
                }
            }
            while (nonzero < 2);
            double total = 0;
            foreach (long a in row) total += a;
            double e = 0;
            for (int i = 0; i < components; i++)
            for (int j = i + 1; j < components; j++) e += 2 * w[i, j] * (row[i] / total) * (row[j] / total);
            amounts[p] = row;
            energies[p] = e + OffsetScaleEvPerAtom * (-Math.Log(1.0 - rng.NextDouble()) - OffsetShift);
        }
        return new PointSet(components, amounts, energies);
    }
}
