using Hull.Core.Chemistry;

namespace Hull.Bench.Data;

/// <summary>One generated dataset row: element symbols with integer amounts of one formula unit, and its total energy (eV per formula unit).</summary>
public sealed record DatasetRow(string Id, string[] Elements, long[] Amounts, double TotalEnergyEvPerFormulaUnit);

/// <summary>
/// A seeded dataset over the first <c>elements</c> elements of the periodic table (Z = 1..60 for the suite):
/// every element appears once as a pure entry, the rest are compounds in random binary, ternary or quaternary
/// systems (each order with probability 1/3). Elements are drawn with weight 1/(1 + rank) over a seeded random
/// ranking, modelling the uneven coverage of real databases (a few elements, like oxygen in oxide-heavy sets, occur
/// in many entries; most are rare). A compound has a formula unit of N atoms, N uniform in [k, 12], split into
/// positive integer amounts uniformly. Energies are totals per formula unit, built from a per-element reference
/// total energy (uniform in [-9, -1.5] eV/atom, the range of elemental DFT total energies) plus the convex
/// interaction background over the compound's elements plus the chosen distribution's deviation, so the analysis
/// has to turn totals into formation energies first.
/// </summary>
public static class DatasetGenerator
{
    public const int MaxAtomsPerFormulaUnit = 12;

    public static IReadOnlyList<DatasetRow> Generate(int elementCount, int entries, EnergyDistribution distribution, int seed)
    {
        if (elementCount < 4 || elementCount > ElementTable.All.Count) throw new ArgumentOutOfRangeException(nameof(elementCount));
        var rng = new Random(seed);
        string[] symbols = Enumerable.Range(1, elementCount).Select(z => ElementTable.ByAtomicNumber(z).Symbol).ToArray();
        var background = InteractionBackground.Random(elementCount, rng);
        var referenceEvPerAtom = new double[elementCount];
        for (int e = 0; e < elementCount; e++) referenceEvPerAtom[e] = -9.0 + 7.5 * rng.NextDouble();
        var rank = Enumerable.Range(0, elementCount).ToArray();
        rng.Shuffle(rank);
        var weight = new double[elementCount];
        for (int e = 0; e < elementCount; e++) weight[e] = 1.0 / (1 + rank[e]);

        var rows = new List<DatasetRow>(entries);
        for (int e = 0; e < elementCount; e++)
        {
            rows.Add(new DatasetRow($"el-{symbols[e]}", [symbols[e]], [1], referenceEvPerAtom[e]));
        }
        var chosen = new int[4];
        for (int i = rows.Count; i < entries; i++)
        {
            int k = 2 + rng.Next(3);
            DrawDistinct(weight, k, rng, chosen);
            Array.Sort(chosen, 0, k);
            int atoms = k + rng.Next(MaxAtomsPerFormulaUnit - k + 1);
            long[] amounts = LatticeGenerator.PositiveSplit(atoms, k, rng);
            var index = chosen.AsSpan(0, k);
            double formation = background.EvPerAtom(amounts, index) + InteractionBackground.Deviation(distribution, rng);
            double totalPerAtom = formation;
            for (int j = 0; j < k; j++) totalPerAtom += (double)amounts[j] / atoms * referenceEvPerAtom[index[j]];
            string[] els = index.ToArray().Select(e => symbols[e]).ToArray();
            rows.Add(new DatasetRow($"c{i}", els, amounts, totalPerAtom * atoms));
        }
        return rows;
    }

    /// <summary>Weighted sampling of k distinct indices without replacement.</summary>
    private static void DrawDistinct(double[] weight, int k, Random rng, int[] into)
    {
        int got = 0;
        while (got < k)
        {
            double total = 0;
            for (int e = 0; e < weight.Length; e++) if (!Taken(into, got, e)) total += weight[e];
            double u = rng.NextDouble() * total;
            int pick = -1;
            for (int e = 0; e < weight.Length; e++)
            {
                if (Taken(into, got, e)) continue;
                pick = e;
                u -= weight[e];
                if (u < 0) break;
            }
            into[got++] = pick;
        }
    }

    private static bool Taken(int[] into, int count, int e)
    {
        for (int j = 0; j < count; j++) if (into[j] == e) return true;
        return false;
    }
}
