namespace Hull.Core.Tests.Generators;

/// <summary>
/// Generated hull input: integer amounts of each component per point and the energy per atom of each point
/// (eV/atom), with a label per point saying how it was made (shown when a check fails).
/// </summary>
public sealed class PointSet
{
    public PointSet(int componentCount, IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom, IReadOnlyList<string> kinds)
    {
        if (amounts.Count != energiesEvPerAtom.Count || amounts.Count != kinds.Count) throw new ArgumentException("Sizes differ.");
        ComponentCount = componentCount;
        Amounts = amounts;
        EnergiesEvPerAtom = energiesEvPerAtom;
        Kinds = kinds;
    }

    public int ComponentCount { get; }
    public IReadOnlyList<long[]> Amounts { get; }
    public IReadOnlyList<double> EnergiesEvPerAtom { get; }
    public IReadOnlyList<string> Kinds { get; }
    public int Count => Amounts.Count;

    /// <summary>Composition fractions of point i: amount / total, each rounded once.</summary>
    public double[] Fractions(int i)
    {
        var row = Amounts[i];
        double total = 0;
        foreach (long a in row) total += a;
        return row.Select(a => a / total).ToArray();
    }

    /// <summary>The same points in a random order; <c>order[newIndex] = oldIndex</c>.</summary>
    public PointSet Shuffled(int seed, out int[] order)
    {
        var rng = new Random(seed);
        order = Enumerable.Range(0, Count).ToArray();
        rng.Shuffle(order);
        var o = order;
        return new PointSet(ComponentCount,
            o.Select(i => (long[])Amounts[i].Clone()).ToList(),
            o.Select(i => EnergiesEvPerAtom[i]).ToList(),
            o.Select(i => Kinds[i]).ToList());
    }

    /// <summary>Point i as C# source, for pasting a failing input into a test.</summary>
    public string Describe(int i) =>
        $"#{i} [{Kinds[i]}] amounts {{{string.Join(", ", Amounts[i])}}} energy {EnergiesEvPerAtom[i]:R}";
}
