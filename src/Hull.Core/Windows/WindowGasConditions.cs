using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;

namespace Hull.Core.Windows;

/// <summary>
/// Gas elements' potentials in windows as (T, p) of an ideal-gas reservoir, through <see cref="GasReservoir"/>. By
/// default the dataset's elemental reference is taken as a fitted reference standing for H°(298.15 K) (the usual
/// meaning of a formation-energy dataset's references); in that mode Δμ does not depend on the reference's value:
/// Δμ = ½{[H°(T) − H°(298.15 K)] − T S°(T) + k_B T ln(p/p°)} for a diatomic gas. A gas given as a computed
/// molecule (<see cref="WindowGasMolecule"/>) is read against the dataset's reference instead.
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

    /// <summary>Δμ of the gas's element at (T, p), eV/atom; through <paramref name="molecule"/> when one is given for it.</summary>
    /// <exception cref="ThermoInputException">A temperature outside the gas's table, a pressure that is not positive.</exception>
    public static double DeltaMu(GasSpecies gas, double temperatureK, double pressureBar, WindowGasMolecule? molecule = null)
    {
        (GasReservoir reservoir, double reference) = Reservoir(gas, molecule);
        return reservoir.Shift(temperatureK, pressureBar, reference).DeltaMuEvPerAtom;
    }

    /// <summary>
    /// Every gas element's Δμ at one point of a window, as the pressure at <paramref name="atTemperatureK"/> and/or the
    /// temperature at <paramref name="atPressureBar"/> (searched over the gas's whole table); a gas element with an
    /// entry in <paramref name="molecules"/> (by element) is read through that computed molecule.
    /// </summary>
    /// <exception cref="ThermoInputException">A temperature outside a gas's table, a pressure that is not positive.</exception>
    public static IReadOnlyList<GasCondition> At(IReadOnlyList<string> elements, IReadOnlyList<double> potentialsEv, double? atTemperatureK, double? atPressureBar,
        IReadOnlyDictionary<string, WindowGasMolecule>? molecules = null)
    {
        var conditions = new List<GasCondition>();
        if (atTemperatureK is null && atPressureBar is null) return conditions;
        for (int i = 0; i < elements.Count; i++)
        {
            if (!TryGetGas(elements[i], out GasSpecies gas)) continue;
            WindowGasMolecule? molecule = molecules is not null && molecules.TryGetValue(elements[i], out WindowGasMolecule? m) ? m : null;
            (GasReservoir reservoir, double reference) = Reservoir(gas, molecule);
            double mu = potentialsEv[i];
            PressureForShift? pressure = atTemperatureK is double t ? reservoir.PressureAt(mu, t, reference) : null;
            TemperatureSolveResult? temperature = atPressureBar is double p ? reservoir.TemperatureAt(mu, p, reference) : null;
            conditions.Add(new GasCondition(elements[i], gas.Formula, mu, pressure, temperature, molecule is not null));
        }

        return conditions;
    }

    /// <summary>The reservoir of a gas and the dataset reference its Δμ is measured from.</summary>
    /// <exception cref="ThermoInputException">A molecule given for another gas.</exception>
    private static (GasReservoir Reservoir, double ReferenceEvPerAtom) Reservoir(GasSpecies gas, WindowGasMolecule? molecule)
    {
        if (molecule is null) return (new GasReservoir(gas, GasReference.FittedElementalReference(AnyReferenceEvPerAtom, gas)), AnyReferenceEvPerAtom);
        if (!ReferenceEquals(molecule.Species, gas))
        {
            throw new ThermoInputException($"A {molecule.Species.Formula} molecule cannot set the {gas.Formula} reservoir.", element: gas.Element);
        }

        return (molecule.Reservoir, molecule.DatasetReferenceEvPerAtom);
    }
}
