using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;
using Hull.Core.Thermo.Temperature;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Server.Validation;

namespace Hull.Server.Services;

/// <summary>
/// The thermo service: takes the closed hull of the system a request names from the cache, prepares it with the
/// temperature models (the request's, over the stored ones) and the gas, and translates Core's hulls at (T, p),
/// decomposition temperatures, gas potentials and the temperature figure.
/// </summary>
public sealed class ThermoGrpcService(CompoundResolution compounds) : ThermoService.ThermoServiceBase
{
    public override async Task<GetGasPotentialResponse> GetGasPotential(GetGasPotentialRequest request, ServerCallContext context)
    {
        bool pressureGiven = request.Gas is { PressureBar: not 0 };
        ThermoGas gas = ThermoWireMapping.GasOf(request.Gas, required: true, pressureRequired: !request.HasDeltaMuEvPerAtom)!;
        FreeEnergyTreatment treatment = ThermoWireMapping.FromWire(request.Treatment);
        var response = new GetGasPotentialResponse
        {
            Treatment = ThermoWireMapping.ToWire(treatment),
            Reference = gas.Mode == GasReferenceMode.ComputedMoleculeEnergy ? ThermoGasReference.ComputedMolecule : ThermoGasReference.Fitted,
            Element = gas.Species.Element,
            TableSource = gas.Species.Table.Source,
            TableMinimumK = gas.Species.Table.MinimumTemperatureK,
            TableMaximumK = gas.Species.Table.MaximumTemperatureK,
        };
        double reference = request.ReferenceEvPerAtom;
        string? referenceEntry = null;
        if (request.Dataset.Length > 0)
        {
            VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
            CachedHull hull = await compounds.HullAsync(snapshot, [gas.Species.Element], context);
            Core.Thermo.ElementReference? found = hull.Hull.References.FirstOrDefault(r => r.Symbol == gas.Species.Element);
            if (found is null && gas.Mode == GasReferenceMode.ComputedMoleculeEnergy)
            {
                throw RpcErrors.InvalidArgument("gas.reference",
                    $"a computed {gas.Species.Formula} molecule needs a total-energy reference for {gas.Species.Element}, and dataset '{request.Dataset}' has none");
            }

            reference = found?.TotalEnergyEvPerAtom ?? 0.0;
            referenceEntry = found?.SourceEntryId;
            response.Used = WireMapping.ToWire(snapshot.Version);
        }

        GasReservoir reservoir = gas.Reservoir(reference);
        bool ellingham = treatment == FreeEnergyTreatment.Ellingham;
        double? entropy = gas.StandardEntropyJPerMolK;
        ChemicalPotentialShift shift = Answer(() => ellingham
            ? reservoir.StandardStateShift(request.TemperatureK, gas.PressureBar, reference, entropy)
            : reservoir.Shift(request.TemperatureK, gas.PressureBar, reference), "temperature_k");
        response.AnchorTemperatureK = reservoir.Reference.AnchorTemperatureK;
        response.ReferenceEnergyEvPerMolecule = shift.Gas.ReferenceEnergyEvPerMolecule;
        response.EnthalpyAboveAnchorEvPerMolecule = shift.Gas.EnthalpyAboveAnchorEvPerMolecule;
        response.EntropyTermEvPerMolecule = shift.Gas.EntropyTermEvPerMolecule;
        response.PressureTermEvPerMolecule = shift.Gas.PressureTermEvPerMolecule;
        if (pressureGiven || !request.HasDeltaMuEvPerAtom) response.Point = ThermoWireMapping.ToWire(shift, referenceEntry);
        if (request.HasDeltaMuEvPerAtom)
        {
            double target = request.DeltaMuEvPerAtom;
            PressureForShift pressure = Answer(() => ellingham
                ? reservoir.StandardStatePressureAt(target, request.TemperatureK, reference, entropy)
                : reservoir.PressureAt(target, request.TemperatureK, reference), "delta_mu_ev_per_atom");
            response.HasConversion = true;
            response.PressureForDeltaMuBar = pressure.PressureBar;
            response.Log10PressureForDeltaMuBar = pressure.Log10PressureBar;
            if (pressureGiven)
            {
                TemperatureSolveResult solved = Answer(() => ellingham
                    ? reservoir.StandardStateTemperatureAt(target, gas.PressureBar, reference, entropy)
                    : reservoir.TemperatureAt(target, gas.PressureBar, reference), "delta_mu_ev_per_atom");
                response.TemperatureFound = solved.IsConverged;
                response.TemperatureForDeltaMuK = solved.IsConverged ? solved.TemperatureK : 0;
                response.TemperatureSolveStatus = solved.Status switch
                {
                    TemperatureSolveStatus.Converged => "converged",
                    TemperatureSolveStatus.NoSignChangeInRange => "no temperature in the table gives this Δμ at this pressure",
                    TemperatureSolveStatus.NonFiniteValue => "a non-finite value stopped the solve",
                    _ => "step limit reached",
                };
            }
        }

        return response;
    }

    public override async Task<GetHullAtConditionsResponse> GetHullAtConditions(GetHullAtConditionsRequest request, ServerCallContext context)
    {
        IReadOnlyList<string> elements = ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        ThermoGas? gas = ThermoWireMapping.GasOf(request.Gas, required: false);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        CachedHull closed = await compounds.HullAsync(snapshot, elements, context);
        (ThermoSystem system, string modelsFrom) = Prepare(snapshot, closed.Hull, request.Models, request.Treatment, gas);
        ThermoHull hull = Answer(() => system.HullAt(request.TemperatureK), "temperature_k");
        var response = new GetHullAtConditionsResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            ChemicalSystem = closed.Hull.SystemName,
            EnergyAxis = hull.Hull.Axis.DisplayName,
            EnergyUnit = hull.Hull.Axis.Unit,
            TemperatureK = request.TemperatureK,
            Treatment = ThermoWireMapping.ToWire(system.Treatment),
            ModelsFrom = modelsFrom,
            Caution = ThermoWireMapping.Caution,
        };
        if (hull.GasShift is { } shift) response.Gas = ThermoWireMapping.ToWire(shift, ThermoWireMapping.GasReferenceEntryId(system));
        response.Components.AddRange(hull.Hull.Components);
        response.References.AddRange(hull.References.Select(ThermoWireMapping.ToWire));
        var models = ModelSet(snapshot, request.Models, gas, closed.Hull.Components).Models;
        response.Entries.AddRange(hull.Hull.Entries.Select(e => new ThermoHullEntry
        {
            EntryId = e.Id,
            Formula = snapshot.TryFind(e.Id, out int row) ? snapshot.FormulasAsStored[row] : e.Composition.Formula,
            FreeEnergyEvPerClosedAtom = e.AxisEnergyEvPerAtom,
            FormationEnergyEvPerAtom = WireMapping.FormationOf(e.FormationEnergyEvPerAtom),
            EnergyAboveHullEvPerClosedAtom = e.EnergyAboveHullEvPerAtom,
            IsHullVertex = e.IsHullVertex,
            Decomposition = WireMapping.ToWire(e.Decomposition),
            Model = models.For(e.Entry)?.Describe() ?? string.Empty,
        }));
        response.StablePhaseIds.AddRange(hull.Hull.StablePhases.Select(p => p.Id));
        response.ReservoirEntryIds.AddRange(hull.ReservoirEntryIds);
        response.UnmodelledEntryIds.AddRange(hull.UnmodelledEntryIds);
        return response;
    }

    public override async Task<FindDecompositionTemperaturesResponse> FindDecompositionTemperatures(
        FindDecompositionTemperaturesRequest request, ServerCallContext context)
    {
        ThermoGas? gas = ThermoWireMapping.GasOf(request.Gas, required: false);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        string[] extra = Extra(request.ChemicalSystem, gas);
        (CachedHull closed, string id, _) = await compounds.ResolveAsync(snapshot, request.Phase, "phase", context, extra);
        (ThermoSystem system, string modelsFrom) = Prepare(snapshot, closed.Hull, request.Models, request.Treatment, gas);
        DecompositionTemperatureResult result = Answer(() => DecompositionTemperatures.Find(system, id, request.FromK, request.ToK,
            request.ScanIntervals == 0 ? ThermoTolerances.DefaultScanIntervals : request.ScanIntervals), RangeField);
        FindDecompositionTemperaturesResponse response = ThermoWireMapping.ToWire(result, system, modelsFrom);
        response.Used = WireMapping.ToWire(snapshot.Version);
        return response;
    }

    public override async Task<DrawTemperatureFigureResponse> DrawTemperatureFigure(DrawTemperatureFigureRequest request, ServerCallContext context)
    {
        if (request.Phases.Count == 0 || request.Phases.Count > TemperatureStabilityFigure.MaximumCurves)
        {
            throw RpcErrors.InvalidArgument("phases", $"a temperature figure draws 1 to {TemperatureStabilityFigure.MaximumCurves} phases; got {request.Phases.Count}");
        }

        int samples = request.Samples == 0 ? 200 : request.Samples;
        ThermoGas? gas = ThermoWireMapping.GasOf(request.Gas, required: false);
        VersionSnapshot snapshot = await compounds.SnapshotAsync(request.Dataset, request.Version, context);
        string[] extra = Extra(request.ChemicalSystem, gas);
        var ids = new List<string>();
        var systemElements = new SortedSet<string>(extra, StringComparer.Ordinal);
        for (int i = 0; i < request.Phases.Count; i++)
        {
            (CachedHull hull, string id, _) = await compounds.ResolveAsync(snapshot, request.Phases[i], $"phases[{i}]", context, extra);
            ids.Add(id);
            systemElements.UnionWith(hull.Hull.Components);
        }

        CachedHull closed = await compounds.HullAsync(snapshot, systemElements, context);
        (ThermoSystem system, string modelsFrom) = Prepare(snapshot, closed.Hull, request.Models, request.Treatment, gas);
        var curves = new List<TemperatureCurve>();
        var response = new DrawTemperatureFigureResponse { Used = WireMapping.ToWire(snapshot.Version) };
        foreach (string id in ids)
        {
            DecompositionTemperatureResult result = Answer(() => DecompositionTemperatures.Find(system, id, request.FromK, request.ToK), RangeField);
            curves.Add(Answer(() => TemperatureCurve.Of(system, result, samples), _ => "samples"));
            FindDecompositionTemperaturesResponse phase = ThermoWireMapping.ToWire(result, system, modelsFrom);
            phase.Used = response.Used;
            response.Phases.Add(phase);
        }

        response.Svg = TemperatureStabilityFigure.Render(curves, FigureSource.Of(snapshot.Version));
        return response;
    }

    private static string[] Extra(string chemicalSystem, ThermoGas? gas) =>
        [.. chemicalSystem.Length == 0 ? [] : ChemicalSystemText.Parse(chemicalSystem, "chemical_system"), .. gas is null ? [] : new[] { gas.Species.Element }];

    private static string RangeField(ThermoInputException e) =>
        e.EntryId is not null && e.Message.Contains("cannot be followed", StringComparison.Ordinal) || e.Message.Contains("pure element", StringComparison.Ordinal) ? "phase"
        : e.Message.Contains("Scan intervals", StringComparison.Ordinal) ? "scan_intervals"
        : e.EntryId is not null ? "models"
        : "from_k";

    private (ThermoSystem System, string ModelsFrom) Prepare(VersionSnapshot snapshot, SystemHull closed,
        IReadOnlyList<ThermoSolidModel> wireModels, ThermoTreatment treatment, ThermoGas? gas)
    {
        (TemperatureModelSet models, string from) = ModelSet(snapshot, wireModels, gas, closed.Components);
        FreeEnergyTreatment core = ThermoWireMapping.FromWire(treatment);
        ThermoSystem system = Answer(() => ThermoSystem.Prepare(closed, models, core, gas), e =>
            e.Message.Contains("gas", StringComparison.OrdinalIgnoreCase) && e.EntryId is null && !e.Message.Contains("pure entry", StringComparison.Ordinal) ? "gas.gas" : "models");
        return (system, from);
    }

    /// <summary>The request's models over the stored ones, and where they came from.</summary>
    private static (TemperatureModelSet Models, string From) ModelSet(VersionSnapshot snapshot, IReadOnlyList<ThermoSolidModel> wireModels, ThermoGas? gas,
        IReadOnlyList<string> system)
    {
        TemperatureModelSet inline = ThermoWireMapping.ModelsOf(wireModels,
            id => snapshot.TryFind(id, out int row) ? snapshot.Entries[row].Composition : null, gas?.Mode);
        TemperatureModelSet stored = snapshot.StoredModelSet;
        string from = (inline.Count > 0, stored.Count > 0) switch
        {
            (true, true) => "request and stored",
            (true, false) => "request",
            (false, true) => "stored",
            _ => "none",
        };
        TemperatureModelSet models = inline.Over(stored);
        if (gas is not null)
        {
            // A stored table counted on the other zero than the gas reference would shift every reaction it enters.
            for (int row = 0; row < snapshot.Entries.Count; row++)
            {
                if (snapshot.TemperatureModels[row] is not { } anchored) continue;
                PhaseEntry entry = snapshot.Entries[row];
                if (!entry.Composition.Elements.All(system.Contains) || !ReferenceEquals(models.For(entry), anchored.Model)) continue;
                try
                {
                    anchored.RequireAnchorFor(gas.Mode, entry.Id);
                }
                catch (ThermoInputException e)
                {
                    throw RpcErrors.InvalidArgument("gas.reference", e.Message);
                }
            }
        }

        return (models, from);
    }

    private static T Answer<T>(Func<T> call, string field) => Answer(call, _ => field);

    private static T Answer<T>(Func<T> call, Func<ThermoInputException, string> fieldOf) => ScienceAnswer.Of(call, fieldOf);
}
