using System.Numerics;

namespace Hull.Core.Thermo;

/// <summary>A point handed to the hull engine, with the exact coordinates it was built from.</summary>
internal sealed class HullPoint
{
    public HullPoint(HullPhase phase, PhaseEntry? entry, int rowIndex, BigFraction[] componentAtoms)
    {
        Phase = phase;
        Entry = entry;
        RowIndex = rowIndex;
        ComponentAtoms = componentAtoms;
        BigFraction total = BigFraction.Zero;
        foreach (BigFraction a in componentAtoms)
        {
            total += a;
        }

        AtomsPerFormulaUnit = total;
        Amounts = ScaleToIntegers(componentAtoms, phase.Id, rowIndex);
        Fractions = componentAtoms.Select(a => (a / total).ToDouble()).ToArray();
        CompositionKey = string.Join(",", Amounts);
        IsPureComponent = Amounts.Count(a => a != 0) == 1;
    }

    public HullPhase Phase { get; }

    /// <summary>The entry, or null for a synthetic elemental reference.</summary>
    public PhaseEntry? Entry { get; }

    /// <summary>Row of the entry in the analysed list (-1 for a synthetic reference).</summary>
    public int RowIndex { get; }

    /// <summary>Atoms contributed by each component to one formula unit as written (exact).</summary>
    public BigFraction[] ComponentAtoms { get; }

    public BigFraction AtomsPerFormulaUnit { get; }

    /// <summary>The component atoms scaled to coprime integers: the engine's input and the reduced-composition key.</summary>
    public long[] Amounts { get; }

    /// <summary>Atom fractions of the components.</summary>
    public double[] Fractions { get; }

    /// <summary>Equal for points of the same reduced composition.</summary>
    public string CompositionKey { get; }

    /// <summary>True when the point is made of one component alone.</summary>
    public bool IsPureComponent { get; }

    public double FormationEnergyEvPerAtom => Phase.FormationEnergyEvPerAtom;

    /// <summary>Exact positive amounts scaled by the LCM of their denominators, then divided by their GCD.</summary>
    internal static long[] ScaleToIntegers(BigFraction[] amounts, string id, int rowIndex)
    {
        BigInteger lcm = BigInteger.One;
        foreach (BigFraction a in amounts)
        {
            lcm = lcm / BigInteger.GreatestCommonDivisor(lcm, a.Denominator) * a.Denominator;
        }

        var scaled = amounts.Select(a => a.Numerator * (lcm / a.Denominator)).ToArray();
        BigInteger gcd = BigInteger.Zero;
        foreach (BigInteger s in scaled)
        {
            gcd = BigInteger.GreatestCommonDivisor(gcd, s);
        }

        var result = new long[scaled.Length];
        for (int k = 0; k < scaled.Length; k++)
        {
            BigInteger value = gcd.IsZero ? scaled[k] : scaled[k] / gcd;
            if (value > long.MaxValue)
            {
                throw new ThermoInputException(
                    $"Entry '{id}'{(rowIndex >= 0 ? $" (row {rowIndex})" : string.Empty)}: its composition needs integer amounts beyond 64 bits "
                    + "to be written exactly on the hull's components; write it with smaller numbers.",
                    entryId: id,
                    rowIndex: rowIndex >= 0 ? rowIndex : null);
            }

            result[k] = (long)value;
        }

        return result;
    }
}
