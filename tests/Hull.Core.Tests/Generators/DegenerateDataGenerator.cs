namespace Hull.Core.Tests.Generators;

/// <summary>
/// Degenerate thermodynamic data of the kind real phase sets produce: compositions on rational lattices (small
/// integer amounts), pure components at exactly 0 eV/atom, polymorphs with the same composition (some with the
/// same energy), points built to lie exactly on the plane of other points, many points on one plane, and negative
/// formation energies on a mixing bowl so that many phases are stable.
/// </summary>
public static class DegenerateDataGenerator
{
    /// <summary>Largest total of a lattice composition's amounts, so fraction denominators are at most 12.</summary>
    public const int MaxLatticeTotal = 12;

    /// <summary>Energies of lattice points are rounded to this many decimals (eV/atom), as tabulated data are.</summary>
    private const int EnergyDecimals = 4;

    public static PointSet Generate(int components, int count, int seed)
    {
        if (components < 2) throw new ArgumentOutOfRangeException(nameof(components));
        var rng = new Random(seed);
        var b = new Builder();

        // Pairwise mixing energies (eV/atom): a regular-solution-like bowl sum_ij W_ij x_i x_j, so a 50/50 binary
        // sits between -0.5 and -0.03 eV/atom, the usual range of formation energies.
        var w = new double[components, components];
        for (int i = 0; i < components; i++)
        for (int j = i + 1; j < components; j++) w[i, j] = -2.0 + 1.9 * rng.NextDouble();
        double Bowl(long[] a)
        {
            double total = a.Sum(v => (double)v), e = 0;
            for (int i = 0; i < components; i++)
            for (int j = i + 1; j < components; j++) e += w[i, j] * (a[i] / total) * (a[j] / total);
            return e;
        }

        // Pure components at exactly zero, some with a higher polymorph and some with an equal-energy twin written
        // at another scale.
        for (int k = 0; k < components; k++) b.Add(Pure(components, k, 1), 0.0, "pure");
        for (int k = 0; k < components; k += 2)
        {
            b.Add(Pure(components, k, 2 + rng.Next(3)), rng.Next(2) == 0 ? 0.0 : Math.Round(0.2 * rng.NextDouble(), EnergyDecimals), "pure polymorph");
        }

        // Lattice compounds on the bowl; a third exactly on it, the rest above by a noise of tabulated precision.
        int lattice = count * 40 / 100;
        var low = new List<int>(Enumerable.Range(0, components));
        for (int i = 0; i < lattice; i++)
        {
            var a = LatticeAmounts(components, rng);
            bool onBowl = rng.Next(3) == 0;
            double e = Math.Round(Bowl(a) + (onBowl ? 0.0 : 0.15 * Math.Abs(Gaussian(rng))), EnergyDecimals);
            int index = b.Add(a, e, onBowl ? "lattice on bowl" : "lattice above bowl");
            if (onBowl) low.Add(index);
        }

        // Polymorphs: the same composition at another scale, with the same energy or a higher one.
        int polymorphs = count * 10 / 100;
        for (int i = 0; i < polymorphs; i++)
        {
            int source = b.RandomNonPure(rng);
            long scale = 2 + rng.Next(2);
            bool equal = rng.Next(3) != 0;
            b.Add(b.Amounts[source].Select(v => v * scale).ToArray(),
                equal ? b.Energies[source] : Math.Round(b.Energies[source] + 0.1 * rng.NextDouble(), EnergyDecimals),
                equal ? "equal-energy twin" : "higher polymorph");
        }

        // Points on the plane of 2 to 4 low points: amounts sum_i c_i a_i with small integers c_i, energy the
        // atom-weighted mean (atom weight of point i is c_i * total_i / sum_j c_j * total_j).
        int onPlane = count * 15 / 100;
        for (int i = 0; i < onPlane; i++)
        {
            int parts = 2 + rng.Next(Math.Min(3, components - 1));
            var chosen = Enumerable.Range(0, parts).Select(_ => low[rng.Next(low.Count)]).Distinct().ToArray();
            var a = new long[components];
            double atoms = 0, energy = 0;
            foreach (int p in chosen)
            {
                long c = 1 + rng.Next(3);
                long total = b.Amounts[p].Sum();
                for (int k = 0; k < components; k++) a[k] += c * b.Amounts[p][k];
                atoms += c * total;
                energy += c * total * b.Energies[p];
            }
            b.Add(a, energy / atoms, $"on plane of {chosen.Length} low points");
        }

        // Many points on one plane E = sum_k mu_k x_k: nearly level, a little above the bowl at a random centre, so
        // it cuts the bowl and the points inside the cut form one flat face of the hull while the rest lie above.
        int coplanar = count * 20 / 100;
        double level = Bowl(LatticeAmounts(components, rng)) + 0.03;
        var mu = Enumerable.Range(0, components).Select(_ => level + 0.1 * (rng.NextDouble() - 0.5)).ToArray();
        for (int i = 0; i < coplanar; i++)
        {
            var a = LatticeAmounts(components, rng);
            double total = a.Sum(v => (double)v), e = 0;
            for (int k = 0; k < components; k++) e += mu[k] * (a[k] / total);
            b.Add(a, e, "coplanar");
        }

        // The rest: unstable compounds with positive formation energy.
        while (b.Amounts.Count < count)
        {
            b.Add(LatticeAmounts(components, rng), Math.Round(0.3 * rng.NextDouble(), EnergyDecimals), "positive");
        }

        return new PointSet(components, b.Amounts, b.Energies, b.Kinds).Shuffled(seed ^ 0x5eed, out _);
    }

    /// <summary>
    /// Small integer amounts with total 2..12 spread over 2..5 components (binaries and ternaries most often,
    /// as in real compound lists).
    /// </summary>
    public static long[] LatticeAmounts(int components, Random rng)
    {
        int total = 2 + rng.Next(MaxLatticeTotal - 1);
        int maxSupport = Math.Min(Math.Min(components, total), 5);
        int support = 2 + (int)Math.Floor((maxSupport - 1) * Math.Pow(rng.NextDouble(), 2));
        var which = Enumerable.Range(0, components).ToArray();
        rng.Shuffle(which);
        // Split total into `support` positive parts at distinct cut points.
        var cuts = Enumerable.Range(1, total - 1).ToArray();
        rng.Shuffle(cuts);
        var sorted = cuts.Take(support - 1).Append(0).Append(total).Order().ToArray();
        var a = new long[components];
        for (int s = 0; s < support; s++) a[which[s]] = sorted[s + 1] - sorted[s];
        return a;
    }

    private static long[] Pure(int components, int k, long amount)
    {
        var a = new long[components];
        a[k] = amount;
        return a;
    }

    private static double Gaussian(Random rng) =>
        Math.Sqrt(-2.0 * Math.Log(1.0 - rng.NextDouble())) * Math.Cos(2.0 * Math.PI * rng.NextDouble());

    private sealed class Builder
    {
        public List<long[]> Amounts { get; } = [];
        public List<double> Energies { get; } = [];
        public List<string> Kinds { get; } = [];

        public int Add(long[] amounts, double energy, string kind)
        {
            Amounts.Add(amounts);
            Energies.Add(energy);
            Kinds.Add(kind);
            return Amounts.Count - 1;
        }

        public int RandomNonPure(Random rng)
        {
            while (true)
            {
                int i = rng.Next(Amounts.Count);
                if (Amounts[i].Count(v => v != 0) > 1) return i;
            }
        }
    }
}
