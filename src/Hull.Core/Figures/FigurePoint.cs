namespace Hull.Core.Figures;

/// <summary>One phase to draw: an entry (or a synthetic elemental reference) at its composition and energy.</summary>
/// <param name="Id">Entry id, or the element symbol of a synthetic reference.</param>
/// <param name="Formula">Formula as written, drawn with subscripts.</param>
/// <param name="Fractions">Atom fractions of the hull's components, in component order (sum 1).</param>
/// <param name="EnergyEvPerAtom">The hull-axis energy of the phase.</param>
/// <param name="EnergyAboveHullEvPerAtom">Distance above the hull (0 on it).</param>
/// <param name="IsStable">True for a hull vertex.</param>
public sealed record FigurePoint(
    string Id, string Formula, IReadOnlyList<double> Fractions, double EnergyEvPerAtom, double EnergyAboveHullEvPerAtom, bool IsStable);
