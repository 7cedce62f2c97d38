using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Reactions;

/// <summary>A product of a reaction, in formula units (as written) per atom of mixture.</summary>
public sealed record ReactionProduct(HullPhase Phase, Rational FormulaUnitsPerMixtureAtom);
