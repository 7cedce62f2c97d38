using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Windows;
using Hull.Protos.V1;
using Hull.Server.Errors;
using CoreGasCondition = Hull.Core.Windows.GasCondition;
using WindowGasMolecule = Hull.Core.Windows.WindowGasMolecule;
using WireGasMolecule = Hull.Protos.V1.WindowGasMolecule;
using ElementReference = Hull.Core.Thermo.ElementReference;
using WireGasCondition = Hull.Protos.V1.GasCondition;

namespace Hull.Server.Mapping;

/// <summary>Gas conditions of window calls: (T, p) of a gas as a fixed potential, and vertices' Δμ as (T, p).</summary>
public static class WindowGasMapping
{
    /// <summary>
    /// How the request wants gas elements' potentials shown (neither temperature nor pressure set: not at all), and
    /// which gases are read through a computed molecule (by element; empty until <see cref="Against"/> gives them
    /// the dataset's references).
    /// </summary>
    public sealed record Display(double? AtTemperatureK, double? AtPressureBar, IReadOnlyDictionary<string, WindowGasMolecule> Molecules)
    {
        private static readonly IReadOnlyDictionary<string, WindowGasMolecule> NoMolecules = new Dictionary<string, WindowGasMolecule>();

        public static Display None { get; } = new(null, null, NoMolecules);

        /// <summary>The request's computed molecules, checked for gas and energies; their dataset references come later.</summary>
        internal IReadOnlyList<(int Index, GasSpecies Species, double MoleculeEnergyEv, double ZeroPointEnergyEv)> Requested { get; init; } = [];

        /// <summary>
        /// The display with each requested molecule measured from the dataset's reference for its element.
        /// </summary>
        /// <param name="references">The elemental references of the hulls the answer uses.</param>
        /// <param name="elements">The answer's elements (the system's, and any dopant's).</param>
        /// <param name="where">The dataset version, for the error text.</param>
        /// <exception cref="Grpc.Core.RpcException">A molecule's element outside the answer (INVALID_ARGUMENT), or without a reference in the dataset (FAILED_PRECONDITION).</exception>
        public Display Against(IEnumerable<ElementReference> references, IReadOnlyCollection<string> elements, string where)
        {
            if (Requested.Count == 0) return this;
            var byElement = new Dictionary<string, double>(StringComparer.Ordinal);
            foreach (ElementReference r in references) byElement.TryAdd(r.Symbol, r.TotalEnergyEvPerAtom);
            var molecules = new Dictionary<string, WindowGasMolecule>(StringComparer.Ordinal);
            foreach ((int index, GasSpecies species, double energy, double zeroPoint) in Requested)
            {
                string field = $"settings.gas_molecules[{index}]";
                if (!elements.Contains(species.Element))
                {
                    throw RpcErrors.InvalidArgument($"{field}.gas", $"a {species.Formula} molecule is given, but {species.Element} is not an element of this answer ({string.Join(", ", elements)})");
                }

                if (!byElement.TryGetValue(species.Element, out double reference))
                {
                    throw RpcErrors.MissingElementalReference(species.Element,
                        $"a computed {species.Formula} molecule ({field}) is measured from the dataset's total-energy reference for {species.Element}, but {where} has none: "
                        + $"import a pure-{species.Element} entry with a total energy, or leave {species.Formula} out of gas_molecules");
                }

                molecules[species.Element] = Core(() => WindowGasMolecule.Of(species, energy, zeroPoint, reference), $"{field}.molecule_energy_ev");
            }

            return this with { Molecules = molecules };
        }
    }

    /// <exception cref="Grpc.Core.RpcException">
    /// A pressure that is not a positive number, a temperature that is not finite; a molecule of an unknown gas, given
    /// twice, or with a non-finite energy or a negative zero-point energy.
    /// </exception>
    public static Display DisplayOf(WindowSettings? settings)
    {
        if (settings is null) return Display.None;
        double? t = settings.HasGasAtTemperatureK ? settings.GasAtTemperatureK : null;
        double? p = settings.HasGasAtPressureBar ? settings.GasAtPressureBar : null;
        if (t is double tk && !(double.IsFinite(tk) && tk > 0)) throw RpcErrors.InvalidArgument("settings.gas_at_temperature_k", $"the temperature must be a positive number of K, not {tk}");
        if (p is double pb && !(double.IsFinite(pb) && pb > 0)) throw RpcErrors.InvalidArgument("settings.gas_at_pressure_bar", $"the pressure must be a positive number of bar, not {pb}");
        var requested = new List<(int, GasSpecies, double, double)>();
        for (int i = 0; i < settings.GasMolecules.Count; i++)
        {
            WireGasMolecule m = settings.GasMolecules[i];
            string field = $"settings.gas_molecules[{i}]";
            if (!GasTables.TryGet(m.Gas, out GasSpecies species))
            {
                throw RpcErrors.InvalidArgument($"{field}.gas", $"'{m.Gas}' is not a gas with tables here; a computed molecule is for one of {string.Join(", ", GasTables.All.Select(s => s.Formula))}");
            }

            if (requested.Any(r => r.Item2 == species)) throw RpcErrors.InvalidArgument($"{field}.gas", $"{species.Formula}'s molecule is given twice");
            string energyField = double.IsFinite(m.MoleculeEnergyEv) ? $"{field}.zero_point_energy_ev" : $"{field}.molecule_energy_ev";
            _ = Core(() => GasReference.ComputedMolecule(m.MoleculeEnergyEv, m.ZeroPointEnergyEv), energyField);
            requested.Add((i, species, m.MoleculeEnergyEv, m.ZeroPointEnergyEv));
        }

        return new Display(t, p, Display.None.Molecules) { Requested = requested };
    }

    /// <summary>
    /// Adds each gas's Δμ at its (T, p) to <paramref name="into"/> (element → Δμ, eV), through the display's
    /// computed molecule for that gas when there is one.
    /// </summary>
    /// <exception cref="Grpc.Core.RpcException">An unknown gas, a temperature outside its table, a bad pressure, an element fixed twice.</exception>
    public static void AddFixed(IReadOnlyList<GasPotential> gases, string field, IDictionary<string, double> into, Display display)
    {
        for (int i = 0; i < gases.Count; i++)
        {
            GasPotential g = gases[i];
            if (!GasTables.TryGet(g.Gas, out GasSpecies species))
            {
                throw RpcErrors.InvalidArgument($"{field}[{i}].gas", $"'{g.Gas}' is not a gas with tables here; choose one of {string.Join(", ", GasTables.All.Select(s => s.Formula))}");
            }

            if (!double.IsFinite(g.PressureBar) || g.PressureBar <= 0)
            {
                throw RpcErrors.InvalidArgument($"{field}[{i}].pressure_bar", $"the pressure of {species.Formula} must be a positive number of bar, not {g.PressureBar}");
            }

            double deltaMu;
            try
            {
                deltaMu = WindowGasConditions.DeltaMu(species, g.TemperatureK, g.PressureBar, display.Molecules.GetValueOrDefault(species.Element));
            }
            catch (ThermoInputException e)
            {
                throw RpcErrors.InvalidArgument($"{field}[{i}].temperature_k", e.Message);
            }

            if (!into.TryAdd(species.Element, deltaMu))
            {
                throw RpcErrors.InvalidArgument($"{field}[{i}].gas", $"{species.Element} is fixed twice (by a potential and by {species.Formula}, or by two gases)");
            }
        }
    }

    /// <summary>The gas conditions of one vertex, as the display asks.</summary>
    /// <exception cref="Grpc.Core.RpcException">The display's temperature lies outside a gas's table.</exception>
    public static IEnumerable<WireGasCondition> ToWire(IReadOnlyList<string> elements, IReadOnlyList<double> potentials, Display display)
    {
        IReadOnlyList<CoreGasCondition> conditions;
        try
        {
            conditions = WindowGasConditions.At(elements, potentials, display.AtTemperatureK, display.AtPressureBar, display.Molecules);
        }
        catch (ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument("settings.gas_at_temperature_k", e.Message);
        }

        foreach (CoreGasCondition c in conditions)
        {
            var wire = new WireGasCondition { Element = c.Element, Gas = c.Gas, DeltaMuEv = c.DeltaMuEvPerAtom, ComputedMolecule = c.ComputedMolecule };
            if (c.Pressure is { } p)
            {
                wire.PressureBar = p.PressureBar;
                wire.Log10PressureBar = p.Log10PressureBar;
            }

            if (c.Temperature is { } t)
            {
                if (t.IsConverged) wire.TemperatureK = t.TemperatureK;
                wire.TemperatureStatus = StatusToken(t.Status);
            }

            yield return wire;
        }
    }

    /// <summary>Runs a Core check and turns its input error into INVALID_ARGUMENT on <paramref name="field"/>.</summary>
    private static T Core<T>(Func<T> check, string field)
    {
        try
        {
            return check();
        }
        catch (ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument(field, e.Message);
        }
    }

    private static string StatusToken(TemperatureSolveStatus status) => status switch
    {
        TemperatureSolveStatus.Converged => "converged",
        TemperatureSolveStatus.NoSignChangeInRange => "no_sign_change_in_range",
        TemperatureSolveStatus.NonFiniteValue => "non_finite_value",
        _ => "step_limit_reached",
    };
}
