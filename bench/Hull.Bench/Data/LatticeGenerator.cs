namespace Hull.Bench.Data;

/// <summary>
/// Seeded points of one n-component system on rational lattices: one pure point per component at energy 0, then
/// entries that each pick a subsystem of k = 2..n components (k uniform, components uniform), a formula-unit size
/// N uniform in [k, maxAtoms], and positive integer amounts summing to N (uniform among such splits). Energies are
/// the convex background plus the chosen distribution's deviation.
/// </summary>
public static class LatticeGenerator
{
    /// <summary>Formula units of at most 12 atoms: the common case; many entries share a composition (polymorphs).</summary>
    public const int SmallCellMaxAtoms = 12;

    /// <summary>Formula units up to 60 atoms: larger denominators, almost every entry has its own composition.</summary>
    public const int LargeCellMaxAtoms = 60;

    public static PointSet Generate(int components, int entries, int maxAtoms, EnergyDistribution distribution, int seed)
    {
        if (components < 2) throw new ArgumentOutOfRangeException(nameof(components));
        if (entries < components) throw new ArgumentOutOfRangeException(nameof(entries));
        var rng = new Random(seed);
        var background = InteractionBackground.Random(components, rng);
        var amounts = new long[entries][];
        var energies = new double[entries];
        for (int k = 0; k < components; k++)
        {
            amounts[k] = new long[components];
            amounts[k][k] = 1;
            energies[k] = 0.0;
        }
        var identity = Enumerable.Range(0, components).ToArray();
        var order = Enumerable.Range(0, components).ToArray();
        for (int i = components; i < entries; i++)
        {
            int k = 2 + rng.Next(components - 1);
            rng.Shuffle(order);
            int atoms = k + rng.Next(Math.Max(1, maxAtoms - k + 1));
            var parts = PositiveSplit(atoms, k, rng);
            var row = new long[components];
            for (int j = 0; j < k; j++) row[order[j]] = parts[j];
            amounts[i] = row;
            energies[i] = background.EvPerAtom(row, identity) + InteractionBackground.Deviation(distribution, rng);
        }
        return new PointSet(components, amounts, energies);
    }

    /// <summary>Uniform split of <paramref name="total"/> into <paramref name="parts"/> positive integers (k-1 distinct cuts).</summary>
    public static long[] PositiveSplit(int total, int parts, Random rng)
    {
        var cuts = new SortedSet<int>();
        while (cuts.Count < parts - 1) cuts.Add(1 + rng.Next(total - 1));
        var result = new long[parts];
        int previous = 0, j = 0;
        foreach (int c in cuts) { result[j++] = c - previous; previous = c; }
        result[j] = total - previous;
        return result;
    }
}
