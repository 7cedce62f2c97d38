namespace Hull.Bench.Data;

/// <summary>
/// The "faceted" family, the degenerate extreme: a piecewise-planar convex background on which a share of the
/// entries lies exactly, so that very many entries are on the hull without being vertices, and whole groups of them
/// are coplanar. Compositions come from the ≤12-atom lattice (<see cref="LatticeGenerator"/>).
/// </summary>
/// <remarks>
/// E(x) = max_m −d_m (1 − x_m), one plane per component m with depth d_m uniform in [<see cref="MinDepthEvPerAtom"/>,
/// <see cref="MaxDepthEvPerAtom"/>]: plane m is 0 at component m's corner and −d_m at the others, so every corner is
/// at 0, and the maximum of planes is convex. Its kinks run through the compositions with equal largest fractions,
/// so the stable phases are such compositions only (the equimolar binaries, ternaries, ... and their kin on the
/// kinks); every other entry placed exactly on the surface lies on a hull plane. <see cref="OnSurfaceShare"/> of the
/// entries lie on it (to rounding), the others above it by an exponential offset of mean
/// <see cref="OffsetMeanEvPerAtom"/>.
/// </remarks>
public static class FacetedGenerator
{
    public const double MinDepthEvPerAtom = 0.2;
    public const double MaxDepthEvPerAtom = 1.0;
    public const double OnSurfaceShare = 0.4;
    public const double OffsetMeanEvPerAtom = 0.05;

    public static PointSet Generate(int components, int entries, int seed)
    {
        var lattice = LatticeGenerator.Generate(components, entries, LatticeGenerator.SmallCellMaxAtoms, EnergyDistribution.Dense, seed);
        var rng = new Random(seed ^ 0x2545F491);
        var depth = new double[components];
        for (int m = 0; m < components; m++) depth[m] = MinDepthEvPerAtom + (MaxDepthEvPerAtom - MinDepthEvPerAtom) * rng.NextDouble();
        var energies = new double[entries];
        for (int p = components; p < entries; p++)
        {
            var row = lattice.Amounts[p];
            double total = 0;
            foreach (long a in row) total += a;
            double e = double.NegativeInfinity;
            for (int m = 0; m < components; m++) e = Math.Max(e, -depth[m] * (1.0 - row[m] / total));
            energies[p] = rng.NextDouble() < OnSurfaceShare ? e : e - OffsetMeanEvPerAtom * Math.Log(1.0 - rng.NextDouble());
        }
        return new PointSet(components, lattice.Amounts, energies);
    }
}
