using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Windows;

/// <summary>
/// Gas elements' potentials in windows as (T, p) of an ideal-gas reservoir, through <see cref="GasReservoir"/> with the
/// dataset's elemental reference taken as a fitted reference standing for H°(298.15 K) (the usual meaning of a
/// formation-energy dataset's references). In that mode Δμ does not depend on the reference's value:
/// Δμ = ½{[H°(T) − H°(298.15 K)] − T S°(T) + k_B T ln(p/p°)} for a diatomic gas.
/// </summary>
public static class WindowGasConditions
{
    // The reference value cancels in the fitted mode (E_ref = 2 × it, Δμ = μ/atom − it); 0 stands for any.
    private const double AnyReferenceEvPerAtom = 0;

    /// <summary>The gas whose reservoir sets this element's potential (O → O2, ...), when the gas module has one.</summary>
    public static bool TryGetGas(string element, out GasSpecies gas)
    {
        gas = GasTables.All.FirstOrDefault(g => string.Equals(g.Element, element, StringComparison.Ordinal))!;
        return gas is not null;
    }

    /// <summary>Δμ of the gas's element at (T, p), eV/atom.</summary>
    /// <exception cref="ThermoInputException">A temperature outside the gas's table, a pressure that is not positive.</exception>
    public static double DeltaMu(GasSpecies gas, double temperatureK, double pressureBar) =>
        Reservoir(gas).Shift(temperatureK, pressureBar, AnyReferenceEvPerAtom).DeltaMuEvPerAtom;

    /// <summary>
    /// Every gas element's Δμ at one point of a window, as the pressure at <paramref name="atTemperatureK"/> and/or the
    /// temperature at <paramref name="atPressureBar"/> (searched over the gas's whole table).
    /// </summary>
    /// <exception cref="ThermoInputException">A temperature outside a gas's table, a pressure that is not positive.</exception>
    public static IReadOnlyList<GasCondition> At(IReadOnlyList<string> elements, IReadOnlyList<double> potentialsEv, double? atTemperatureK, double? atPressureBar)
    {
        var conditions = new List<GasCondition>();
        if (atTemperatureK is null && atPressureBar is null) return conditions;
        for (int i = 0; i < elements.Count; i++)
        {
            if (!TryGetGas(elements[i], out GasSpecies gas)) continue;
            GasReservoir reservoir = Reservoir(gas);
            double mu = potentialsEv[i];
            PressureForShift? pressure = atTemperatureK is double t ? reservoir.PressureAt(mu, t, AnyReferenceEvPerAtom) : null;
            TemperatureSolveResult? temperature = atPressureBar is double p ? reservoir.TemperatureAt(mu, p, AnyReferenceEvPerAtom) : null;
            conditions.Add(new GasCondition(elements[i], gas.Formula, mu, pressure, temperature));
        }

        return conditions;
    }

    private static GasReservoir Reservoir(GasSpecies gas) => new(gas, GasReference.FittedElementalReference(AnyReferenceEvPerAtom, gas));
}
