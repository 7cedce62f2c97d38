using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Lines;

/// <summary>
/// One phase of a straight path's segment across the hull: how many formula units of it (as written) the point
/// S + s·D of the path holds, units(s) = <see cref="UnitsAtZero"/> + s·<see cref="UnitsPerParameter"/>, exactly.
/// </summary>
public sealed record HullLinePhase(HullPhase Phase, Rational UnitsAtZero, Rational UnitsPerParameter, Rational AxisAtomsPerFormulaUnit)
{
    /// <summary>Formula units at path parameter <paramref name="s"/> (exact).</summary>
    public Rational UnitsAt(Rational s) => UnitsAtZero + (s * UnitsPerParameter);
}
