namespace Hull.Core.Defects;

/// <summary>A vertex of the extended polytope as a chemical-potential point, with the phases that bound it.</summary>
/// <param name="Index">Its position among the extended vertices.</param>
/// <param name="Point">Δμ of every element there.</param>
/// <param name="LimitingPhaseIds">The competing phases whose limits meet there, sorted by id.</param>
public sealed record SolubilityVertex(int Index, ChemicalPotentialPoint Point, IReadOnlyList<string> LimitingPhaseIds);
