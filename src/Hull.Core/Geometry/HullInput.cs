namespace Hull.Core.Geometry;

/// <summary>
/// The checked input of a hull computation: the energy of each point, its composition's id, and per distinct
/// composition the amount row in lowest terms, the atom fractions and one representative point (the lowest energy;
/// the lowest index among exact ties). Both hull engines start from it, so they accept and refuse exactly the same
/// input.
/// </summary>
/// <remarks>
/// Amounts and fractions are kept once per distinct composition, rows back to back in one array each, and no input
/// array is kept: nothing the caller changes later reaches the engines, and a large input with repeated
/// compositions needs little memory.
/// </remarks>
internal sealed class HullInput
{
    private HullInput(int componentCount, double[] energies, int[] compositionOf, int compositionCount,
        long[] reducedRows, double[] compositionFractions, int[] candidates)
    {
        ComponentCount = componentCount;
        Energies = energies;
        CompositionOf = compositionOf;
        CompositionCount = compositionCount;
        _reducedRows = reducedRows;
        CompositionFractions = compositionFractions;
        CandidatesInInputOrder = candidates;
        _sortedCandidates = new Lazy<int[]>(() => SortByComposition(candidates, this));
    }

    public int ComponentCount { get; }

    /// <summary>
    /// Atom fractions of each composition: composition c's are [c * ComponentCount, (c + 1) * ComponentCount). May
    /// hold unused room after the last.
    /// </summary>
    public double[] CompositionFractions { get; }

    /// <summary>Atom fractions of point i (those of its composition).</summary>
    public ReadOnlySpan<double> FractionsOf(int point) => CompositionFractions.AsSpan(CompositionOf[point] * ComponentCount, ComponentCount);

    /// <summary>Energy per atom of each point, eV/atom.</summary>
    public double[] Energies { get; }

    /// <summary>Composition id of each point, from 0 to <see cref="CompositionCount"/> - 1 in order of first occurrence.</summary>
    public int[] CompositionOf { get; }

    /// <summary>Number of distinct compositions.</summary>
    public int CompositionCount { get; }

    // The amount rows of the distinct compositions in lowest terms, back to back: composition c's are
    // [c * ComponentCount, (c + 1) * ComponentCount), with possibly unused room after the last.
    private readonly long[] _reducedRows;

    /// <summary>Point i's amounts reduced to lowest terms (the row of its composition).</summary>
    public ReadOnlySpan<long> Row(int point) => _reducedRows.AsSpan(CompositionOf[point] * ComponentCount, ComponentCount);

    /// <summary>Amount of component k in composition c's reduced row.</summary>
    public long CompositionAmount(int composition, int component) => _reducedRows[composition * ComponentCount + component];

    /// <summary>The representative point of point i's composition.</summary>
    public int RepresentativeOf(int point) => CandidatesInInputOrder[CompositionOf[point]];

    private readonly Lazy<int[]> _sortedCandidates;

    /// <summary>The representative points, one per composition, ordered by composition (exact lexicographic fractions).</summary>
    public int[] Candidates => _sortedCandidates.Value;

    /// <summary>
    /// The representative points in the order their compositions first occur in the input, so indexed by composition
    /// id: enough where the input order is already canonical (a dataset's hulls), and cheaper than sorting.
    /// </summary>
    public int[] CandidatesInInputOrder { get; }

    /// <exception cref="ArgumentException">Inconsistent sizes, negative or all-zero amounts, amounts summing past
    /// 64 bits, or energies not finite or beyond ±<see cref="HullTolerances.MaxEnergyMagnitudeEvPerAtom"/>; the message
    /// names the point and component.</exception>
    /// <param name="amounts">Amount rows, one per point.</param>
    /// <param name="energiesEvPerAtom">Energy per atom of each point.</param>
    public static HullInput Check(IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom)
    {
        ArgumentNullException.ThrowIfNull(amounts);
        ArgumentNullException.ThrowIfNull(energiesEvPerAtom);
        if (amounts.Count == 0) throw new ArgumentException("The hull needs at least one point.", nameof(amounts));
        if (amounts.Count != energiesEvPerAtom.Count)
        {
            throw new ArgumentException($"{amounts.Count} amount rows but {energiesEvPerAtom.Count} energies.", nameof(energiesEvPerAtom));
        }
        int n = amounts[0]?.Length ?? 0;
        if (n == 0) throw new ArgumentException("Point 0 has no components.", nameof(amounts));
        return CheckRows(new JaggedRows(amounts, n), amounts.Count, n, energiesEvPerAtom);
    }

    /// <summary>
    /// As <see cref="Check(IReadOnlyList{long[]}, IReadOnlyList{double})"/> for amounts stored row after row in
    /// one array (<paramref name="componentCount"/> per point), which saves a large input one small array per point.
    /// </summary>
    public static HullInput Check(long[] amountsRowMajor, int componentCount, IReadOnlyList<double> energiesEvPerAtom)
    {
        ArgumentNullException.ThrowIfNull(amountsRowMajor);
        ArgumentNullException.ThrowIfNull(energiesEvPerAtom);
        if (componentCount <= 0) throw new ArgumentException($"{componentCount} components; at least one is needed.", nameof(componentCount));
        if (amountsRowMajor.Length % componentCount != 0)
        {
            throw new ArgumentException($"{amountsRowMajor.Length} amounts are not whole rows of {componentCount} components.", nameof(amountsRowMajor));
        }
        int count = amountsRowMajor.Length / componentCount;
        if (count == 0) throw new ArgumentException("The hull needs at least one point.", nameof(amountsRowMajor));
        if (count != energiesEvPerAtom.Count)
        {
            throw new ArgumentException($"{count} amount rows but {energiesEvPerAtom.Count} energies.", nameof(energiesEvPerAtom));
        }
        return CheckRows(new FlatRows(amountsRowMajor, componentCount), count, componentCount, energiesEvPerAtom);
    }

    /// <summary>
    /// The input of points already checked and grouped by the caller: every row non-negative, not all zero, adding
    /// up within 64 bits, every energy finite and within ±<see cref="HullTolerances.MaxEnergyMagnitudeEvPerAtom"/>;
    /// <paramref name="compositionOf"/> numbers the compositions from 0 in order of first occurrence, and
    /// <paramref name="reducedRows"/> holds each composition's row in lowest terms (composition c's at
    /// [c * componentCount, (c + 1) * componentCount)). The same input <see cref="Check(IReadOnlyList{long[]}, IReadOnlyList{double})"/>
    /// builds from those points, without the checks and the hashing of every row: a dataset's hulls share their
    /// entries, which are checked and grouped once for all of them. The arrays are taken over.
    /// </summary>
    internal static HullInput FromGrouped(int componentCount, double[] energiesEvPerAtom, int[] compositionOf, int compositionCount, long[] reducedRows)
    {
        var fractions = new double[compositionCount * componentCount];
        for (int c = 0; c < compositionCount; c++)
        {
            ReadOnlySpan<long> row = reducedRows.AsSpan(c * componentCount, componentCount);
            // As DistinctCompositions: amount / total, each rounded once.
            long total = 0;
            foreach (long v in row) total += v;
            for (int k = 0; k < componentCount; k++) fractions[c * componentCount + k] = (double)row[k] / total;
        }
        var candidates = ChooseRepresentatives(compositionOf, compositionCount, energiesEvPerAtom);
        return new HullInput(componentCount, energiesEvPerAtom, compositionOf, compositionCount, reducedRows, fractions, candidates);
    }

    /// <summary>Where the rows come from: one array per point, or one array for all.</summary>
    private interface IRowSource
    {
        /// <summary>Point i's row; throws ArgumentException naming the point when it has none or the wrong length.</summary>
        ReadOnlySpan<long> Row(int i);

        /// <summary>As <see cref="Row"/>, false instead of throwing.</summary>
        bool TryRow(int i, out ReadOnlySpan<long> row);
    }

    private readonly struct JaggedRows(IReadOnlyList<long[]> rows, int n) : IRowSource
    {
        public ReadOnlySpan<long> Row(int i)
        {
            var row = rows[i] ?? throw new ArgumentException($"Point {i} has no amounts.", "amounts");
            if (row.Length != n) throw new ArgumentException($"Point {i} has {row.Length} components; point 0 has {n}.", "amounts");
            return row;
        }

        public bool TryRow(int i, out ReadOnlySpan<long> row)
        {
            var array = rows[i];
            row = array;
            return array is not null && array.Length == n;
        }
    }

    private readonly struct FlatRows(long[] amounts, int n) : IRowSource
    {
        public ReadOnlySpan<long> Row(int i) => amounts.AsSpan(i * n, n);

        public bool TryRow(int i, out ReadOnlySpan<long> row)
        {
            row = amounts.AsSpan(i * n, n);
            return true;
        }
    }

    /// <summary>
    /// From this many points on, the checks and the grouping by composition run at the same time on two cores; below
    /// it, starting a second worker costs more than it saves, and the many small hulls of a dataset are already built
    /// in parallel one level up.
    /// </summary>
    private const int TwoWorkersFromPoints = 16_384;

    private static HullInput CheckRows<TRows>(TRows source, int count, int n, IReadOnlyList<double> energiesEvPerAtom)
        where TRows : struct, IRowSource
    {
        var energies = new double[count];
        var compositionOf = new int[count];
        var distinct = new DistinctCompositions(n, count);
        if (count >= TwoWorkersFromPoints && Environment.ProcessorCount > 1)
        {
            // Grouping reads the rows the checks read, so it runs beside them; it skips rows the checks refuse, and
            // the checks' first error (the lowest point index, as in one pass) is the one reported.
            var grouping = Task.Run(() => GroupCheckedRows(source, count, distinct, compositionOf));
            try
            {
                CheckRowsAndEnergies(source, count, n, energiesEvPerAtom, energies);
            }
            finally
            {
                grouping.Wait();
            }
        }
        else
        {
            CheckRowsAndEnergies(source, count, n, energiesEvPerAtom, energies);
            GroupCheckedRows(source, count, distinct, compositionOf);
        }

        var candidates = ChooseRepresentatives(compositionOf, distinct.Count, energies);
        return new HullInput(n, energies, compositionOf, distinct.Count, distinct.ReducedRows, distinct.Fractions, candidates);
    }

    /// <summary>Checks every row and energy in point order, throwing for the first fault; copies the energies.</summary>
    private static void CheckRowsAndEnergies<TRows>(TRows source, int count, int n, IReadOnlyList<double> energiesEvPerAtom, double[] energies)
        where TRows : struct, IRowSource
    {
        double[]? energyArray = energiesEvPerAtom as double[];
        for (int i = 0; i < count; i++)
        {
            ReadOnlySpan<long> row = source.Row(i);
            long total = 0;
            for (int k = 0; k < n; k++)
            {
                if (row[k] < 0) throw new ArgumentException($"Point {i}: amount of component {k} is negative ({row[k]}).", "amounts");
                if (row[k] > long.MaxValue - total)
                {
                    throw new ArgumentException($"Point {i}: the amounts add up past the 64-bit integer range; scale the formula down.", "amounts");
                }
                total += row[k];
            }
            if (total == 0) throw new ArgumentException($"Point {i}: every amount is zero.", "amounts");
            double e = energyArray is null ? energiesEvPerAtom[i] : energyArray[i];
            if (!double.IsFinite(e)) throw new ArgumentException($"Point {i}: energy is not a finite number ({e}).", nameof(energiesEvPerAtom));
            if (Math.Abs(e) > HullTolerances.MaxEnergyMagnitudeEvPerAtom)
            {
                throw new ArgumentException(
                    string.Create(System.Globalization.CultureInfo.InvariantCulture,
                        $"Point {i}: energy {e:G4} eV/atom is outside ±{HullTolerances.MaxEnergyMagnitudeEvPerAtom:G} eV/atom, where the hull tolerance of {HullTolerances.EnergyEvPerAtom:G} eV/atom is still above rounding."),
                    nameof(energiesEvPerAtom));
            }
            energies[i] = e;
        }
    }

    /// <summary>
    /// The composition id of every row, in point order. A row the checks refuse (missing, negative or all zero)
    /// gets no id; its id is never read, as the checks throw.
    /// </summary>
    private static void GroupCheckedRows<TRows>(TRows source, int count, DistinctCompositions distinct, int[] compositionOf)
        where TRows : struct, IRowSource
    {
        for (int i = 0; i < count; i++)
        {
            compositionOf[i] = -1;
            if (!source.TryRow(i, out var row)) continue;
            bool positive = false, negative = false;
            foreach (long v in row)
            {
                positive |= v > 0;
                negative |= v < 0;
            }
            if (positive && !negative) compositionOf[i] = distinct.Add(row);
        }
    }

    /// <summary>Checks composition fractions asked about: one per component, finite, non-negative, summing to 1.</summary>
    /// <exception cref="ArgumentException">Wrong length, negative or non-finite fractions, or a sum other than 1.</exception>
    public static void CheckFractions(ReadOnlySpan<double> fractions, int componentCount)
    {
        if (fractions.Length != componentCount) throw new ArgumentException($"Expected {componentCount} fractions, got {fractions.Length}.", nameof(fractions));
        double sum = 0;
        for (int k = 0; k < componentCount; k++)
        {
            if (!double.IsFinite(fractions[k]) || fractions[k] < 0) throw new ArgumentException($"Fraction {k} is {fractions[k]}; fractions must be finite and non-negative.", nameof(fractions));
            sum += fractions[k];
        }
        // Fractions typed or computed by a caller carry rounding of order 1e-15 per term; 1e-9 accepts those and
        // still rejects a composition that is genuinely off the simplex.
        if (Math.Abs(sum - 1.0) > 1e-9) throw new ArgumentException($"Fractions sum to {sum}, not 1.", nameof(fractions));
    }

    /// <summary>
    /// The pure point of each component (the representative of the composition made of that component alone).
    /// </summary>
    /// <exception cref="ArgumentException">A component has no pure point.</exception>
    public int[] PureComponentPoints()
    {
        int n = ComponentCount;
        var pure = new int[n];
        var hasPure = new bool[n];
        foreach (int c in CandidatesInInputOrder)
        {
            var row = Row(c);
            int nonzero = -1, nonzeroCount = 0;
            for (int k = 0; k < n; k++)
            {
                if (row[k] != 0) { nonzero = k; nonzeroCount++; }
            }
            if (nonzeroCount == 1) { pure[nonzero] = c; hasPure[nonzero] = true; }
        }
        for (int k = 0; k < n; k++)
        {
            if (!hasPure[k])
            {
                throw new ArgumentException($"No point consists of component {k} alone; every component needs a pure end point to anchor the hull.");
            }
        }
        return pure;
    }

    /// <summary>The representative point of each composition, indexed by composition id.</summary>
    private static int[] ChooseRepresentatives(int[] compositionOf, int compositions, double[] energies)
    {
        var best = new int[compositions];
        Array.Fill(best, -1);
        for (int i = 0; i < compositionOf.Length; i++)
        {
            int c = compositionOf[i];
            // Strictly lower wins, so the lowest index stays among exact ties.
            if (best[c] < 0 || energies[i] < energies[best[c]]) best[c] = i;
        }
        return best;
    }

    private static int[] SortByComposition(int[] candidates, HullInput input)
    {
        int n = input.ComponentCount;
        var exact = Comparer<int>.Create((a, b) =>
        {
            int c = CompareLexicographic(input.Row(a), input.Row(b), input.FractionsOf(a), input.FractionsOf(b));
            return c != 0 ? c : a.CompareTo(b);
        });
        // By each fraction as a number in turn (plain sorts of doubles), splitting into runs of values not clearly
        // apart; between runs the rounded order is the exact one, and only what is left is compared exactly.
        var sorted = (int[])candidates.Clone();
        var keys = new double[sorted.Length];
        SortRuns(0, sorted.Length, 0);
        return sorted;

        void SortRuns(int from, int to, int component)
        {
            if (component == n)
            {
                Array.Sort(sorted, from, to - from, exact);
                return;
            }
            for (int i = from; i < to; i++) keys[i] = input.FractionsOf(sorted[i])[component];
            Array.Sort(keys, sorted, from, to - from);
            for (int start = from; start < to;)
            {
                int end = start + 1;
                while (end < to && keys[end] - keys[end - 1] <= ClearDifference) end++;
                if (end - start > 1) SortRuns(start, end, component + 1);
                start = end;
            }
        }
    }

    /// <summary>
    /// Two rounded fractions further apart than this are in the right order: each is within 1.2e-16 relative of its
    /// exact value.
    /// </summary>
    private const double ClearDifference = 1e-12;

    /// <summary>
    /// Orders compositions by their fractions, exactly: the rounded fractions decide where they differ clearly,
    /// the amounts cross-multiplied in 128-bit integers decide the rest.
    /// </summary>
    private static int CompareLexicographic(ReadOnlySpan<long> a, ReadOnlySpan<long> b, ReadOnlySpan<double> fractionsA, ReadOnlySpan<double> fractionsB)
    {
        for (int k = 0; k < a.Length; k++)
        {
            double d = fractionsA[k] - fractionsB[k];
            if (d > ClearDifference) return 1;
            if (d < -ClearDifference) return -1;
            if (a[k] == 0 && b[k] == 0) continue;
            Int128 totalA = 0, totalB = 0;
            foreach (long v in a) totalA += v;
            foreach (long v in b) totalB += v;
            for (; k < a.Length; k++)
            {
                int c = ((Int128)a[k] * totalB).CompareTo((Int128)b[k] * totalA);
                if (c != 0) return c;
            }
            return 0;
        }
        return 0;
    }
}
