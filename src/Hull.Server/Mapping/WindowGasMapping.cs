using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Windows;
using Hull.Protos.V1;
using Hull.Server.Errors;
using CoreGasCondition = Hull.Core.Windows.GasCondition;
using WireGasCondition = Hull.Protos.V1.GasCondition;

namespace Hull.Server.Mapping;

/// <summary>Gas conditions of window calls: (T, p) of a gas as a fixed potential, and vertices' Δμ as (T, p).</summary>
public static class WindowGasMapping
{
    /// <summary>How the request wants gas elements' potentials shown (neither set: not at all).</summary>
    public sealed record Display(double? AtTemperatureK, double? AtPressureBar)
    {
        public static Display None { get; } = new(null, null);
    }

    /// <exception cref="Grpc.Core.RpcException">A pressure that is not a positive number, a temperature that is not finite.</exception>
    public static Display DisplayOf(WindowSettings? settings)
    {
        if (settings is null) return Display.None;
        double? t = settings.HasGasAtTemperatureK ? settings.GasAtTemperatureK : null;
        double? p = settings.HasGasAtPressureBar ? settings.GasAtPressureBar : null;
        if (t is double tk && !(double.IsFinite(tk) && tk > 0)) throw RpcErrors.InvalidArgument("settings.gas_at_temperature_k", $"the temperature must be a positive number of K, not {tk}");
        if (p is double pb && !(double.IsFinite(pb) && pb > 0)) throw RpcErrors.InvalidArgument("settings.gas_at_pressure_bar", $"the pressure must be a positive number of bar, not {pb}");
        return new Display(t, p);
    }

    /// <summary>
    /// Adds each gas's Δμ at its (T, p) to <paramref name="into"/> (element → Δμ, eV).
    /// </summary>
    /// <exception cref="Grpc.Core.RpcException">An unknown gas, a temperature outside its table, a bad pressure, an element fixed twice.</exception>
    public static void AddFixed(IReadOnlyList<GasPotential> gases, string field, IDictionary<string, double> into)
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
                deltaMu = WindowGasConditions.DeltaMu(species, g.TemperatureK, g.PressureBar);
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
            conditions = WindowGasConditions.At(elements, potentials, display.AtTemperatureK, display.AtPressureBar);
        }
        catch (ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument("settings.gas_at_temperature_k", e.Message);
        }

        foreach (CoreGasCondition c in conditions)
        {
            var wire = new WireGasCondition { Element = c.Element, Gas = c.Gas, DeltaMuEv = c.DeltaMuEvPerAtom };
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

    private static string StatusToken(TemperatureSolveStatus status) => status switch
    {
        TemperatureSolveStatus.Converged => "converged",
        TemperatureSolveStatus.NoSignChangeInRange => "no_sign_change_in_range",
        TemperatureSolveStatus.NonFiniteValue => "non_finite_value",
        _ => "step_limit_reached",
    };
}
