namespace Hull.Core.Defects.Conditions;

/// <summary>
/// A dopant's Δμ at one chemical-potential point: given by the caller, or the highest the host allows there (its
/// solubility limit against the dataset's phases of the dopant with the host's elements).
/// </summary>
/// <param name="Element">The dopant's symbol.</param>
/// <param name="DeltaMuEv">Δμ against its elemental reference, eV per atom.</param>
/// <param name="LimitingPhaseIds">The dopant phases that form first at that Δμ, sorted by id; empty when its reference limits or it was given.</param>
/// <param name="AtReference">True when the dopant's own reference (Δμ = 0) is the limit.</param>
/// <param name="Given">True when the caller gave it.</param>
public sealed record DopantPotential(string Element, double DeltaMuEv, IReadOnlyList<string> LimitingPhaseIds, bool AtReference, bool Given);
