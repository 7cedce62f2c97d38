using System.Globalization;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo.Corrections;

/// <summary>
/// A fitted reference energy for one element (eV/atom, on the entries' total-energy scale). Applied, the lowest
/// total-energy elemental entry of the element is moved to it (its other elemental entries keep their differences
/// to that one), so every formation energy is measured from the fitted value instead of the computed element.
/// </summary>
public sealed record FittedElementReference
{
    /// <exception cref="ThermoInputException">An unknown symbol or a non-finite energy.</exception>
    public FittedElementReference(string symbol, double energyEvPerAtom)
    {
        if (!ElementTable.IsSymbol(symbol))
        {
            throw new ThermoInputException($"Fitted reference: '{symbol}' is not an element symbol.", element: symbol);
        }

        if (!double.IsFinite(energyEvPerAtom))
        {
            throw new ThermoInputException(
                string.Create(CultureInfo.InvariantCulture, $"Fitted reference of {symbol}: the energy is not finite ({energyEvPerAtom} eV/atom)."),
                element: symbol);
        }

        Symbol = symbol;
        EnergyEvPerAtom = energyEvPerAtom;
    }

    public string Symbol { get; }

    /// <summary>The fitted total energy of the element in its reference state, eV/atom.</summary>
    public double EnergyEvPerAtom { get; }
}
