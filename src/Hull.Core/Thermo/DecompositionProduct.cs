using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>One hull phase in a decomposition, with its share of the atoms and its reaction coefficient.</summary>
public sealed class DecompositionProduct
{
    internal DecompositionProduct(HullPhase phase, double atomFraction, double formulaUnits, Rational? exactFormulaUnits)
    {
        Phase = phase;
        AtomFraction = atomFraction;
        FormulaUnits = formulaUnits;
        ExactFormulaUnits = exactFormulaUnits;
    }

    /// <summary>The product phase.</summary>
    public HullPhase Phase { get; }

    /// <summary>Fraction of the atoms that end up in this phase (the fractions of a decomposition sum to 1).</summary>
    public double AtomFraction { get; }

    /// <summary>Formula units of this phase (as written) made from one formula unit of the decomposed composition.</summary>
    public double FormulaUnits { get; }

    /// <summary>
    /// <see cref="FormulaUnits"/> as an exact fraction, when the reaction was balanced exactly and the value fits in
    /// 64 bits; null otherwise (then the value rests on the floating-point hull weights).
    /// </summary>
    public Rational? ExactFormulaUnits { get; }
}
