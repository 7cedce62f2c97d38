namespace Hull.Core.Thermo.Temperature;

/// <summary>Where, in a temperature range, an element's lowest free-energy pure entry changes from one to another.</summary>
public sealed record ReferenceChange(string Element, double TemperatureK, string FromEntryId, string ToEntryId);
