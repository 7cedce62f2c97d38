namespace Hull.Core.Thermo.Gases;

/// <summary>
/// The gas pressure at which its element has a given Δμ at a given temperature. <see cref="Log10PressureBar"/> stays
/// finite when <see cref="PressureBar"/> under- or overflows a double (very low or very high Δμ).
/// </summary>
public sealed record PressureForShift(string GasFormula, double TemperatureK, double DeltaMuEvPerAtom, double Log10PressureBar)
{
    /// <summary>p in bar; 0 or +∞ when out of the range of a double (see <see cref="Log10PressureBar"/>).</summary>
    public double PressureBar => Math.Pow(10.0, Log10PressureBar);
}
