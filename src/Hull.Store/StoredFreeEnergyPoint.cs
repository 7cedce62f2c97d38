namespace Hull.Store;

/// <summary>One stored row of a G(T) table: temperature in K and G(T) − H(anchor) of one formula unit in eV.</summary>
public readonly record struct StoredFreeEnergyPoint(double TemperatureK, double FreeEnergyAboveAnchorEv);
