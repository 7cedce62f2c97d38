using Hull.Core.Windows;
using Hull.Protos.V1;
using CoreWindow = Hull.Core.Windows.StabilityWindow;
using CoreVertex = Hull.Core.Windows.WindowVertex;
using WireWindow = Hull.Protos.V1.StabilityWindow;
using WireVertex = Hull.Protos.V1.WindowVertex;

namespace Hull.Server.Mapping;

/// <summary>Windows, slices and dopant limits from the science layer to the wire.</summary>
public static class WindowWireMapping
{
    public static WireWindow ToWire(CoreWindow window, string formulaAsStored, string chemicalSystem, WindowGasMapping.Display? gas = null)
    {
        var wire = new WireWindow
        {
            EntryId = window.Compound.Id,
            Formula = formulaAsStored,
            ChemicalSystem = chemicalSystem,
            Kind = ToWire(window.Kind),
            Dimension = window.Dimension,
            EnergyAboveHullEvPerAtom = window.Compound.EnergyAboveHullEvPerAtom,
            Decomposition = WireMapping.ToWire(window.Compound.Decomposition),
        };
        wire.Elements.AddRange(window.Elements);
        if (window.LoweredByEvPerAtom is double lowered) wire.LoweredByEvPerAtom = lowered;
        wire.CoexistingPhaseIds.AddRange(window.CoexistingPhases.Select(p => p.Id));
        wire.Vertices.AddRange(window.Vertices.Select(v => ToWire(v, window.Elements, gas)));
        if (window.Size is { } size)
        {
            wire.Size = new Protos.V1.WindowSize
            {
                Dimension = size.Dimension,
                MeasureInPlaneEvPowK = size.MeasureInPlaneEvPowK,
                ProjectedMeasureEvPowK = size.ProjectedMeasureEvPowK,
            };
            wire.Size.ProjectionElements.AddRange(size.ProjectionElements);
        }

        foreach (Core.Windows.ElementExtremes e in window.Extremes)
        {
            var extremes = new Protos.V1.ElementExtremes { Element = e.Element, HighestEv = e.HighestEv, LowestEv = e.LowestEv };
            extremes.HighestAtVertices.AddRange(e.HighestAtVertices);
            extremes.LowestAtVertices.AddRange(e.LowestAtVertices);
            wire.Extremes.Add(extremes);
        }

        return wire;
    }

    public static WireVertex ToWire(CoreVertex vertex, IReadOnlyList<string> elements, WindowGasMapping.Display? gas = null)
    {
        var wire = new WireVertex();
        wire.ChemicalPotentialsEv.AddRange(vertex.ChemicalPotentialsEv);
        wire.LimitingPhaseIds.AddRange(vertex.LimitingPhases.Select(p => p.Id));
        wire.ElementsAtReference.AddRange(vertex.ElementsAtReference);
        for (int i = 0; i < elements.Count; i++)
        {
            if (Core.Windows.IonVoltage.TryGetChargeNumber(elements[i], out int z))
            {
                wire.Voltages.Add(new Protos.V1.IonVoltage
                {
                    Element = elements[i],
                    ChargeNumber = z,
                    VoltsAgainstMetal = Core.Windows.IonVoltage.VoltsAgainstMetal(vertex.ChemicalPotentialsEv[i], z),
                });
            }
        }

        if (gas is not null) wire.GasConditions.AddRange(WindowGasMapping.ToWire(elements, vertex.ChemicalPotentialsEv, gas));
        return wire;
    }

    public static Protos.V1.DopantLimit ToWire(Core.Windows.DopantLimit limit, WindowGasMapping.Display? gas = null)
    {
        var wire = new Protos.V1.DopantLimit { Dopant = limit.Dopant, DopantPhaseCount = limit.DopantPhaseCount };
        wire.ExtendedElements.AddRange(limit.ExtendedElements);
        if (limit.Exists)
        {
            wire.OverallMaxEv = limit.OverallMaxEv;
            wire.OverallLimitingPhaseIds.AddRange(limit.OverallLimitingPhases.Select(p => p.Id));
        }

        foreach (Core.Windows.HostVertexDopantLimit v in limit.PerHostVertex)
        {
            var row = new Protos.V1.HostVertexDopantLimit
            {
                HostVertex = v.HostVertex,
                MaxDopantPotentialEv = v.MaxDopantPotentialEv,
                DopantAtReference = v.DopantAtReference,
            };
            row.LimitingPhaseIds.AddRange(v.LimitingPhases.Select(p => p.Id));
            wire.PerHostVertex.Add(row);
        }

        wire.ExtendedVertices.AddRange(limit.ExtendedVertices.Select(v => ToWire(v, limit.ExtendedElements, gas)));
        return wire;
    }

    private static Protos.V1.WindowKind ToWire(Core.Windows.WindowKind kind) => kind switch
    {
        Core.Windows.WindowKind.Full => Protos.V1.WindowKind.Full,
        Core.Windows.WindowKind.LowerDimensional => Protos.V1.WindowKind.LowerDimensional,
        Core.Windows.WindowKind.Lowered => Protos.V1.WindowKind.Lowered,
        Core.Windows.WindowKind.AboveHull => Protos.V1.WindowKind.AboveHull,
        _ => Protos.V1.WindowKind.Unspecified,
    };
}
