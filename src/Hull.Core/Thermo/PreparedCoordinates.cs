using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// An entry's hull coordinates over its own elements (ordinal symbol order), worked out once per dataset. Over any
/// larger element system the coordinates are the same numbers in that system's columns, with zeros elsewhere: the
/// scaled integers and fractions do not depend on the absent elements. This spares every hull that contains the
/// entry the exact arithmetic.
/// </summary>
internal sealed class PreparedCoordinates
{
    private PreparedCoordinates(Rational[] atoms, Rational atomsPerFormulaUnit, long[] amounts, double[] fractions)
    {
        Atoms = atoms;
        AtomsPerFormulaUnit = atomsPerFormulaUnit;
        Amounts = amounts;
        Fractions = fractions;
    }

    /// <summary>Atoms of each own element in one formula unit as written.</summary>
    public Rational[] Atoms { get; }

    public Rational AtomsPerFormulaUnit { get; }

    /// <summary>The atoms scaled to coprime integers.</summary>
    public long[] Amounts { get; }

    /// <summary>Atom fractions of the own elements.</summary>
    public double[] Fractions { get; }

    /// <exception cref="ThermoInputException">When the integer amounts do not fit in 64 bits; names the entry and row.</exception>
    public static PreparedCoordinates Of(PhaseEntry entry, int rowIndex)
    {
        Composition composition = entry.Composition;
        var atoms = new Rational[composition.Elements.Count];
        Rational total = Rational.Zero;
        for (int e = 0; e < atoms.Length; e++)
        {
            atoms[e] = composition.AmountOf(composition.Elements[e]);
            total += atoms[e];
        }

        long[] amounts = HullPoint.ScaleToIntegers(atoms, entry.Id, rowIndex);
        return new PreparedCoordinates(atoms, total, amounts, HullPoint.FractionsOf(atoms, total));
    }
}
