namespace Hull.Core.Windows;

/// <summary>
/// The potential of an ion-conducting element shown as a cell voltage against its own metal, V = −Δμ/z (Δμ in eV
/// per atom, z the ion's charge number, e = 1 in these units).
/// </summary>
public static class IonVoltage
{
    // common practice: the usual charge numbers of the mobile ions of battery electrodes.
    private static readonly Dictionary<string, int> Charges = new(StringComparer.Ordinal)
    {
        ["Li"] = 1, ["Na"] = 1, ["K"] = 1, ["Mg"] = 2, ["Ca"] = 2, ["Zn"] = 2,
    };

    /// <summary>True for an element shown as a voltage, with its charge number.</summary>
    public static bool TryGetChargeNumber(string element, out int chargeNumber) => Charges.TryGetValue(element, out chargeNumber);

    /// <summary>Volts against the element's metal for a Δμ in eV/atom.</summary>
    public static double VoltsAgainstMetal(double chemicalPotentialEv, int chargeNumber) =>
        chargeNumber > 0 ? -chemicalPotentialEv / chargeNumber : throw new ArgumentOutOfRangeException(nameof(chargeNumber));
}
