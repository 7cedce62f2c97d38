namespace Hull.Core.Thermo.Temperature;

/// <summary>
/// The elemental reference of one closed element at a temperature: its pure entry of lowest free energy per atom
/// there (<see cref="FreeEnergyEvPerAtom"/>, on the formation-energy scale of the dataset), and whether that is
/// another entry than the lowest at the anchor (a polymorph that wins at this temperature).
/// </summary>
public sealed record ReferenceAtTemperature(
    string Element,
    double TemperatureK,
    string EntryId,
    double FreeEnergyEvPerAtom,
    string AnchorEntryId)
{
    /// <summary>True when the reference at this temperature is not the one at the anchor.</summary>
    public bool ChangedFromAnchor => !string.Equals(EntryId, AnchorEntryId, StringComparison.Ordinal);
}
