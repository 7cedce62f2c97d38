namespace Hull.Core.Defects.Conditions;

/// <summary>
/// One chemical-potential point a study is evaluated at, with what fixes it: a vertex of the host's window (its
/// number and the phases the host coexists with there), a slice vertex at a gas condition, or a point given outright.
/// </summary>
/// <param name="Point">Δμ of every element (host elements and dopants) and the point's label.</param>
/// <param name="VertexNumber">1-based vertex number in the window or slice; 0 for a given point.</param>
/// <param name="CoexistingPhaseIds">Competing phases at their formation limit here, sorted by id (elements at their reference are named in the label).</param>
/// <param name="Dopants">Where each dopant's Δμ came from, in element order.</param>
public sealed record DefectConditionPoint(
    ChemicalPotentialPoint Point,
    int VertexNumber,
    IReadOnlyList<string> CoexistingPhaseIds,
    IReadOnlyList<DopantPotential> Dopants)
{
    public string Label => Point.Label;
}
