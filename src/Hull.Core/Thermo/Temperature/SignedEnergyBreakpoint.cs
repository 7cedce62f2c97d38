namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// A temperature where the signed decomposition energy of a phase changes slope because its competitors change (a
/// vertex of the piecewise-linear function under the Ellingham treatment), with the value there.
/// </summary>
public sealed record SignedEnergyBreakpoint(double TemperatureK, double EnergyEvPerClosedAtom, IReadOnlyList<string> CompetitorIdsBelow, IReadOnlyList<string> CompetitorIdsAbove);
