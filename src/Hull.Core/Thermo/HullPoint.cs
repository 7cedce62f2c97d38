using Hull.Core.Chemistry;
using System.Numerics;

namespace Hull.Core.Thermo;

/// <summary>A point handed to the hull engine, with the exact coordinates it was built from.</summary>
/// <remarks>
/// Only the integer amounts are needed to build a hull; the exact atoms and the atom fractions are needed only for
/// the entries a hull reports, so a point made from prepared coordinates derives them on first use.
/// </remarks>
internal sealed class HullPoint
{
    private Rational[]? _componentAtoms;
    private double[]? _fractions;
    private readonly PreparedCoordinates? _prepared;
    private readonly int[]? _columns;

    /// <summary>A point from its exact component atoms (any component space).</summary>
    public HullPoint(HullPhase phase, PhaseEntry? entry, int rowIndex, Rational[] componentAtoms)
    {
        Phase = phase;
        AxisEnergyEvPerAtom = phase.AxisEnergyEvPerAtom;
        Entry = entry;
        RowIndex = rowIndex;
        SortRank = -1;
        CompositionKey = -1;
        CompositionFirstRank = -1;
        _componentAtoms = componentAtoms;
        Rational total = Rational.Zero;
        foreach (Rational a in componentAtoms)
        {
            total += a;
        }

        AtomsPerFormulaUnit = total;
        Amounts = ScaleToIntegers(componentAtoms, phase.Id, rowIndex);
        PureComponent = PureComponentOf(Amounts);
    }

    /// <summary>
    /// A point over elements from coordinates prepared once for its entry: <paramref name="columns"/>[e] is the hull
    /// column of the entry's element e. <paramref name="sortRank"/> orders the points of one dataset by id;
    /// <paramref name="compositionKey"/> and <paramref name="compositionFirstRank"/> are the <see cref="CompositionKey"/>
    /// and <see cref="CompositionFirstRank"/>, or -1.
    /// </summary>
    public HullPoint(
        HullPhase phase, PhaseEntry entry, int rowIndex, PreparedCoordinates prepared, int[] columns, int componentCount, int sortRank,
        int compositionKey, int compositionFirstRank)
    {
        CompositionKey = compositionKey;
        CompositionFirstRank = compositionFirstRank;
        Phase = phase;
        AxisEnergyEvPerAtom = phase.AxisEnergyEvPerAtom;
        Entry = entry;
        RowIndex = rowIndex;
        SortRank = sortRank;
        _prepared = prepared;
        _columns = columns;
        AtomsPerFormulaUnit = prepared.AtomsPerFormulaUnit;
        var amounts = new long[componentCount];
        for (int e = 0; e < columns.Length; e++)
        {
            amounts[columns[e]] = prepared.Amounts[e];
        }

        Amounts = amounts;
        PureComponent = columns.Length == 1 ? columns[0] : -1;
    }

    private HullPoint(HullPoint other, HullPhase phase)
    {
        Phase = phase;
        AxisEnergyEvPerAtom = phase.AxisEnergyEvPerAtom;
        Entry = other.Entry;
        RowIndex = other.RowIndex;
        SortRank = other.SortRank;
        // The energy is another one, not checked with the dataset's.
        CompositionKey = -1;
        CompositionFirstRank = -1;
        _componentAtoms = other._componentAtoms;
        _fractions = other._fractions;
        _prepared = other._prepared;
        _columns = other._columns;
        AtomsPerFormulaUnit = other.AtomsPerFormulaUnit;
        Amounts = other.Amounts;
        PureComponent = other.PureComponent;
    }

    /// <summary>The same point (composition, entry, row, rank) at another energy on another axis; coordinates are shared.</summary>
    public HullPoint WithAxisEnergy(double axisEnergyEvPerAtom) =>
        new(this, new HullPhase(Phase.Id, Phase.IsSynthetic, Phase.Composition, axisEnergyEvPerAtom, Phase.FormationEnergyEvPerAtom));

    public HullPhase Phase { get; }

    /// <summary>The entry, or null for a synthetic elemental reference.</summary>
    public PhaseEntry? Entry { get; }

    /// <summary>Row of the entry in the analysed list (-1 for a synthetic reference).</summary>
    public int RowIndex { get; }

    /// <summary>Rank of the id among the ids of one dataset (ordinal order), or -1 when not known.</summary>
    public int SortRank { get; }

    /// <summary>
    /// Id of the point's reduced composition among a dataset's compositions, the same in every hull of the dataset,
    /// or -1. Given only when every entry of the dataset passed the engine's input checks, so that a hull of such
    /// points groups them by this id instead of checking and hashing their rows.
    /// </summary>
    public int CompositionKey { get; }

    /// <summary>
    /// With a <see cref="CompositionKey"/>: the id rank of the dataset's first entry of that composition (the
    /// composition's place in a hull of every entry, where a hull holds only some of them); otherwise -1.
    /// </summary>
    public int CompositionFirstRank { get; }

    /// <summary>Atoms contributed by each component to one formula unit as written (exact).</summary>
    public Rational[] ComponentAtoms => _componentAtoms ??= Expand(_prepared!.Atoms, Rational.Zero);

    public Rational AtomsPerFormulaUnit { get; }

    /// <summary>The component atoms scaled to coprime integers: the engine's input and the reduced-composition key.</summary>
    public long[] Amounts { get; }

    /// <summary>Atom fractions of the components.</summary>
    public double[] Fractions => _fractions ??= _prepared is null ? FractionsOf(ComponentAtoms, AtomsPerFormulaUnit) : Expand(_prepared.Fractions, 0.0);

    /// <summary>The only component with a nonzero amount, or -1 when there are several.</summary>
    public int PureComponent { get; }

    /// <summary>True when the point is made of one component alone.</summary>
    public bool IsPureComponent => PureComponent >= 0;

    /// <summary>
    /// The energy the hull is built over (the axis energy per counted atom), its phase's, kept here too: a dataset's
    /// hulls read it for every point they hold, and one object fewer to reach is a cache miss fewer.
    /// </summary>
    public double AxisEnergyEvPerAtom { get; }

    /// <summary>True when both points have the same reduced composition (equal coprime amounts).</summary>
    public bool HasSameCompositionAs(HullPoint other) => Amounts.AsSpan().SequenceEqual(other.Amounts);

    /// <summary>Atom fractions a / total of exact amounts, each rounded once to the nearest double.</summary>
    internal static double[] FractionsOf(Rational[] atoms, Rational total)
    {
        var fractions = new double[atoms.Length];
        for (int k = 0; k < atoms.Length; k++)
        {
            fractions[k] = (atoms[k] / total).ToDouble();
        }

        return fractions;
    }

    /// <summary>Exact positive amounts scaled by the LCM of their denominators, then divided by their GCD.</summary>
    internal static long[] ScaleToIntegers(Rational[] amounts, string id, int rowIndex)
    {
        BigInteger lcm = BigInteger.One;
        foreach (Rational a in amounts)
        {
            lcm = lcm / BigInteger.GreatestCommonDivisor(lcm, a.Denominator) * a.Denominator;
        }

        var scaled = new BigInteger[amounts.Length];
        BigInteger gcd = BigInteger.Zero;
        for (int k = 0; k < amounts.Length; k++)
        {
            scaled[k] = amounts[k].Numerator * (lcm / amounts[k].Denominator);
            gcd = BigInteger.GreatestCommonDivisor(gcd, scaled[k]);
        }

        var result = new long[scaled.Length];
        for (int k = 0; k < scaled.Length; k++)
        {
            BigInteger value = gcd.IsZero ? scaled[k] : scaled[k] / gcd;
            if (value > long.MaxValue)
            {
                throw new ThermoInputException(
                    $"Entry '{id}': its composition needs integer amounts beyond 64 bits "
                    + "to be written exactly on the hull's components; write it with smaller numbers.",
                    entryId: id,
                    rowIndex: rowIndex >= 0 ? rowIndex : null);
            }

            result[k] = (long)value;
        }

        return result;
    }

    private static int PureComponentOf(long[] amounts)
    {
        int pure = -1;
        for (int k = 0; k < amounts.Length; k++)
        {
            if (amounts[k] != 0)
            {
                if (pure >= 0)
                {
                    return -1;
                }

                pure = k;
            }
        }

        return pure;
    }

    private T[] Expand<T>(T[] own, T zero)
    {
        var values = new T[Amounts.Length];
        Array.Fill(values, zero);
        for (int e = 0; e < _columns!.Length; e++)
        {
            values[_columns[e]] = own[e];
        }

        return values;
    }
}
