namespace Hull.Core.Thermo;

/// <summary>An open element's chemical potential as a caller gives it: the value and the scale it is on.</summary>
public sealed record ReservoirPotential(string Symbol, double ValueEvPerAtom, PotentialScale Scale = PotentialScale.RelativeToReference);
