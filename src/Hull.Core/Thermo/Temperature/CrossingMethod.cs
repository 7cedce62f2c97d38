namespace Hull.Core.Thermo.Temperature;

/// <summary>How a crossing temperature was found.</summary>
public enum CrossingMethod
{
    /// <summary>The zero of one straight piece of a piecewise-linear energy, found exactly between its breakpoints.</summary>
    ExactLinearPiece,

    /// <summary>Brent's method in a bracket found by scanning; <see cref="DecompositionCrossing.Converged"/> says whether it reached the tolerance.</summary>
    BrentInScanBracket,
}
