namespace Hull.Core.Thermo.Solids;

/// <summary>
/// One row of a tabulated G(T): a temperature and the thermal free energy of one formula unit there, i.e. G(T)
/// minus the entry's energy per formula unit, on the table's <see cref="FreeEnergyAnchor"/>.
/// </summary>
/// <param name="TemperatureK">Temperature, K; finite and positive (checked by <see cref="FreeEnergyTableModel"/>).</param>
/// <param name="ThermalFreeEnergyEvPerFormulaUnit">G(T) − E per formula unit, eV; finite.</param>
public readonly record struct FreeEnergyPoint(double TemperatureK, double ThermalFreeEnergyEvPerFormulaUnit);
