namespace Hull.Core.Defects;

/// <summary>A dopant's solubility over the extended polytope's vertices and a temperature sweep.</summary>
/// <param name="Dopant">The dopant element.</param>
/// <param name="MaxDeltaMuEv">The highest Δμ of the dopant in the host's window (eV per atom).</param>
/// <param name="LimitingPhaseIds">The phases that form first at that highest Δμ.</param>
/// <param name="Vertices">The extended polytope's vertices (highest Δμ of the dopant first).</param>
/// <param name="Temperatures">Per growth temperature, every vertex solved and the most soluble one.</param>
/// <param name="Cautions">Hazard reminders for the dopant and the limiting phases; empty when none applies.</param>
public sealed record DopantSolubilityResult(
    string Dopant,
    double MaxDeltaMuEv,
    IReadOnlyList<string> LimitingPhaseIds,
    IReadOnlyList<SolubilityVertex> Vertices,
    IReadOnlyList<SolubilityAtTemperature> Temperatures,
    IReadOnlyList<string> Cautions);
