namespace Hull.Core.Thermo.Solids;

/// <summary>One row of a tabulated free energy: G(T) − H(anchor) per formula unit, eV, at a temperature, K.</summary>
public sealed record FreeEnergyPoint(double TemperatureK, double FreeEnergyAboveAnchorEvPerFormulaUnit);
