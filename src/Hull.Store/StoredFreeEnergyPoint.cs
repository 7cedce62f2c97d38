namespace Hull.Store;

/// <summary>One stored point of a G(T) table: temperature in K and G(T) − E of one formula unit in eV.</summary>
public readonly record struct StoredFreeEnergyPoint(double TemperatureK, double ThermalFreeEnergyEv);
