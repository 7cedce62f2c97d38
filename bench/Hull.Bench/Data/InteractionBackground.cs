namespace Hull.Bench.Data;

/// <summary>
/// A strictly convex formation-energy background over the composition simplex (eV/atom):
/// E(x) = sum_{i&lt;j} W_ij x_i x_j with W_ij = -(Base + r_i + r_j), r_i &gt;= 0 a per-component "reactivity".
/// </summary>
/// <remarks>
/// For a direction v in the simplex (sum v = 0), v^T W v / 2 = Base |v|^2 / 2 + sum r_i v_i^2 &gt; 0, so the surface
/// is strictly convex for any reactivities: without noise every composition would be a hull vertex. Pure
/// components sit at 0. With Base = 0.5 and r_i uniform in [0, 1.5] an equimolar binary lies between -0.125 and
/// -0.875 eV/atom, the usual range of intermetallic and ionic formation energies.
/// </remarks>
public sealed class InteractionBackground
{
    /// <summary>Interaction common to every pair (eV/atom).</summary>
    public const double BaseEvPerAtom = 0.5;

    /// <summary>Upper end of the per-component reactivity draw (eV/atom).</summary>
    public const double MaxReactivityEvPerAtom = 1.5;

    /// <summary>Standard deviation of the dense distribution's noise: about the numerical noise of converged DFT energies (eV/atom).</summary>
    public const double DenseNoiseEvPerAtom = 0.001;

    /// <summary>Mean of the sparse distribution's exponential offset above the background (eV/atom).</summary>
    public const double SparseOffsetMeanEvPerAtom = 0.08;

    private readonly double[] _reactivity;

    public InteractionBackground(double[] reactivityEvPerAtom) => _reactivity = reactivityEvPerAtom;

    public static InteractionBackground Random(int components, Random rng)
    {
        var r = new double[components];
        for (int i = 0; i < components; i++) r[i] = rng.NextDouble() * MaxReactivityEvPerAtom;
        return new InteractionBackground(r);
    }

    /// <summary>Background at the composition of integer amounts over the given component indices.</summary>
    public double EvPerAtom(ReadOnlySpan<long> amounts, ReadOnlySpan<int> componentIndex)
    {
        long total = 0;
        foreach (long a in amounts) total += a;
        double e = 0;
        for (int i = 0; i < amounts.Length; i++)
        {
            if (amounts[i] == 0) continue;
            double xi = (double)amounts[i] / total;
            for (int j = i + 1; j < amounts.Length; j++)
            {
                if (amounts[j] == 0) continue;
                double xj = (double)amounts[j] / total;
                double w = -(BaseEvPerAtom + _reactivity[componentIndex[i]] + _reactivity[componentIndex[j]]);
                e += w * xi * xj;
            }
        }
        return e;
    }

    /// <summary>Draws one entry's deviation from the background.</summary>
    public static double Deviation(EnergyDistribution distribution, Random rng) => distribution switch
    {
        EnergyDistribution.Dense => DenseNoiseEvPerAtom * Gaussian(rng),
        EnergyDistribution.Sparse => -SparseOffsetMeanEvPerAtom * Math.Log(1.0 - rng.NextDouble()),
        _ => throw new ArgumentOutOfRangeException(nameof(distribution)),
    };

    private static double Gaussian(Random rng)
    {
        // Box–Muller; 1 - U keeps the logarithm's argument in (0, 1].
        double u1 = 1.0 - rng.NextDouble();
        double u2 = rng.NextDouble();
        return Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
    }
}
