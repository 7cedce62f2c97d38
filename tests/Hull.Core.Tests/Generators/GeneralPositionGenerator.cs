namespace Hull.Core.Tests.Generators;

/// <summary>
/// Points in general position for comparison with a general convex-hull program: every non-pure point has all
/// amounts drawn from a wide integer range (so its fractions are effectively random reals, no point lies on a face
/// of the composition simplex and no d+1 lifted points share a hyperplane), and a random energy.
/// </summary>
public static class GeneralPositionGenerator
{
    /// <summary>Upper end of the random amounts: large enough that fractions behave like random reals.</summary>
    private const long MaxAmount = 1_000_000;

    /// <summary>
    /// One pure point per component at exactly 0 eV/atom (at a random position in the list), then
    /// <paramref name="extraPoints"/> interior points with energies on a convex bowl plus noise, so the lower hull
    /// has many vertices and some points lie far above it (above the pure points too).
    /// </summary>
    public static PointSet Generate(int components, int extraPoints, int seed)
    {
        var rng = new Random(seed);
        var amounts = new List<long[]>();
        var energies = new List<double>();
        var kinds = new List<string>();
        for (int k = 0; k < components; k++)
        {
            var row = new long[components];
            row[k] = 1 + rng.Next(3);
            amounts.Add(row);
            energies.Add(0.0);
            kinds.Add("pure");
        }
        for (int i = 0; i < extraPoints; i++)
        {
            var row = new long[components];
            for (int k = 0; k < components; k++) row[k] = rng.NextInt64(1, MaxAmount + 1);
            double total = row.Sum(a => (double)a);
            double sumSquares = row.Sum(a => (a / total) * (a / total));
            // Convex bowl (sum x^2 - 1 is convex on the simplex and 0 at the corners) plus noise in [-0.15, 0.35];
            // one point in five raised by 0.8 eV/atom so that the upper hull is not just the plane of the pure points.
            double bowl = -0.8 * (1.0 - sumSquares);
            energies.Add(bowl - 0.15 + 0.5 * rng.NextDouble() + (rng.Next(5) == 0 ? 0.8 : 0.0));
            amounts.Add(row);
            kinds.Add("random");
        }
        var set = new PointSet(components, amounts, energies, kinds);
        return set.Shuffled(seed + 1, out _);
    }
}
