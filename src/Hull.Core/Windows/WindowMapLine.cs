namespace Hull.Core.Windows;

/// <summary>What a line of a window map stands for.</summary>
public enum WindowMapLineKind
{
    /// <summary>A competing phase's formation limit.</summary>
    CompetingPhase,

    /// <summary>A phase the compound coexists with throughout (a lower-dimensional window lies on it), or the
    /// compound's own equality on a two-element map.</summary>
    Coexisting,

    /// <summary>An element at its reference, Δμ = 0.</summary>
    ElementReference,
}

/// <summary>
/// One constraint of a window drawn on a map: the allowed side is A·x + B·y ≤ C, with x and y the map's two
/// potentials (eV) and every other potential substituted (fixed by the section, or the dependent one through the
/// compound's own equality). Immutable.
/// </summary>
/// <param name="Kind">What the line stands for.</param>
/// <param name="Id">The phase's entry id, or the element symbol for a reference line.</param>
/// <param name="Label">The formula of the phase as written, or the element symbol.</param>
/// <param name="A">Coefficient of x.</param>
/// <param name="B">Coefficient of y.</param>
/// <param name="C">Right-hand side, eV.</param>
/// <param name="Bounds">True when the line is tight at one or more of the drawn window's vertices.</param>
public sealed record WindowMapLine(WindowMapLineKind Kind, string Id, string Label, double A, double B, double C, bool Bounds);
