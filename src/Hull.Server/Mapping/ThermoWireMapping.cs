using Hull.Core.Chemistry;
using Hull.Core.Thermo.Gases;
using Hull.Core.Thermo.Solids;
using Hull.Core.Thermo.Temperature;
using Hull.Protos.V1;
using Hull.Server.Errors;
using CoreTreatment = Hull.Core.Thermo.Temperature.FreeEnergyTreatment;

namespace Hull.Server.Mapping;

/// <summary>Translates the thermo service's wire messages to Core's temperature types and back.</summary>
public static class ThermoWireMapping
{
    /// <summary>The usual caution every thermo answer carries.</summary>
    public const string Caution =
        "Released oxygen and hot oxides or cathodes are a fire hazard. These are thermodynamic estimates from computed energies; "
        + "real thermal and thermal-runaway safety work follows local rules and licensed practice.";

    public static CoreTreatment FromWire(ThermoTreatment treatment) => treatment switch
    {
        ThermoTreatment.Ellingham => CoreTreatment.Ellingham,
        ThermoTreatment.Unspecified or ThermoTreatment.TabulatedGas => CoreTreatment.TabulatedGas,
        _ => throw RpcErrors.InvalidArgument("treatment", $"unknown treatment {(int)treatment}"),
    };

    public static ThermoTreatment ToWire(CoreTreatment treatment) =>
        treatment == CoreTreatment.Ellingham ? ThermoTreatment.Ellingham : ThermoTreatment.TabulatedGas;

    /// <summary>The gas of a request; null when none is given and <paramref name="required"/> is false.</summary>
    public static ThermoGas? GasOf(ThermoGasConditions? gas, bool required, bool pressureRequired = true)
    {
        if (gas is null || gas.Gas.Length == 0)
        {
            return required ? throw RpcErrors.InvalidArgument("gas.gas", "no gas given; name one of O2, N2, H2, F2, Cl2") : null;
        }

        if (!GasTables.TryGet(gas.Gas, out GasSpecies species))
        {
            throw RpcErrors.InvalidArgument("gas.gas",
                $"no gas table for '{gas.Gas}'; known gases: {string.Join(", ", GasTables.All.Select(g => g.Formula))}");
        }

        double pressure = gas.PressureBar;
        if (!pressureRequired && pressure == 0) pressure = PhysicalConstants.StandardPressureBar;
        if (!double.IsFinite(pressure) || pressure <= 0)
        {
            throw RpcErrors.InvalidArgument("gas.pressure_bar", $"the pressure of {species.Formula} must be positive and finite; got {gas.PressureBar} bar");
        }

        GasReferenceMode mode = gas.Reference switch
        {
            ThermoGasReference.Unspecified or ThermoGasReference.Fitted => GasReferenceMode.FittedElementalReference,
            ThermoGasReference.ComputedMolecule => GasReferenceMode.ComputedMoleculeEnergy,
            _ => throw RpcErrors.InvalidArgument("gas.reference", $"unknown gas reference {(int)gas.Reference}"),
        };
        try
        {
            return new ThermoGas(species, pressure, mode, gas.MoleculeEnergyEv, gas.ZeroPointEnergyEv,
                gas.StandardEntropyJPerMolK == 0 ? null : gas.StandardEntropyJPerMolK);
        }
        catch (Core.Thermo.ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument(e.Message.Contains("entropy", StringComparison.Ordinal) ? "gas.standard_entropy_j_per_mol_k" : "gas", e.Message);
        }
    }

    /// <summary>
    /// The request's inline models, each checked through Core as a stored model is (<see cref="TemperatureModelMapping"/>):
    /// a per-entry model against its entry's formula unit (the entry must be in the version), a per-formula model
    /// against its formula.
    /// </summary>
    /// <remarks>A table on another anchor than <paramref name="gasMode"/> (when a gas is open) is refused naming the model.</remarks>
    public static TemperatureModelSet ModelsOf(IReadOnlyList<ThermoSolidModel> models, Func<string, Composition?> entryComposition,
        Core.Thermo.Gases.GasReferenceMode? gasMode)
    {
        var byId = new List<KeyValuePair<string, Core.Thermo.Solids.SolidTemperatureModel>>();
        var byFormula = new List<Core.Thermo.Solids.SolidTemperatureModel>();
        for (int i = 0; i < models.Count; i++)
        {
            ThermoSolidModel wire = models[i];
            string field = $"models[{i}]";
            if (wire.Model is null)
            {
                throw RpcErrors.InvalidArgument($"{field}.model", "no model given: a standard entropy or a free-energy table");
            }

            string target;
            Composition composition;
            EntryTemperatureModel model = wire.Model;
            switch (wire.TargetCase)
            {
                case ThermoSolidModel.TargetOneofCase.EntryId:
                    target = wire.EntryId;
                    composition = entryComposition(wire.EntryId)
                        ?? throw RpcErrors.NotFound($"entry '{wire.EntryId}' of {field} is not in the version", $"{field}.entry_id");
                    break;
                case ThermoSolidModel.TargetOneofCase.Formula:
                    if (!Composition.TryParse(wire.Formula, out Composition? parsed, out FormulaParseException? error))
                    {
                        throw RpcErrors.InvalidArgument($"{field}.formula", error.Message);
                    }

                    target = $"formula {parsed.Formula}";
                    composition = parsed;
                    if (model.Formula.Length == 0)
                    {
                        model = model.Clone();
                        model.Formula = wire.Formula;
                    }

                    break;
                default:
                    throw RpcErrors.InvalidArgument(field, "a temperature model needs its target: an entry_id or a formula");
            }

            if (!TemperatureModelMapping.TryFromWire(model, target, composition, out Store.StoredTemperatureModel? stored, out (string Field, string Problem) fault))
            {
                throw RpcErrors.InvalidArgument(fault.Field.Length == 0 ? $"{field}.model" : $"{field}.model.{fault.Field}", fault.Problem);
            }

            AnchoredSolidModel anchored = TemperatureModelMapping.ToCore(target, composition, stored!);
            if (gasMode is { } mode)
            {
                try
                {
                    anchored.RequireAnchorFor(mode, target);
                }
                catch (Core.Thermo.ThermoInputException e)
                {
                    throw RpcErrors.InvalidArgument($"{field}.model.free_energy_table.anchor", e.Message);
                }
            }

            Core.Thermo.Solids.SolidTemperatureModel core = anchored.Model;
            if (wire.TargetCase == ThermoSolidModel.TargetOneofCase.EntryId) byId.Add(KeyValuePair.Create(wire.EntryId, core));
            else byFormula.Add(core);
        }

        try
        {
            return new TemperatureModelSet(byId, byFormula);
        }
        catch (Core.Thermo.ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument("models", e.Message);
        }
    }

    public static ThermoGasPoint ToWire(ChemicalPotentialShift shift, string? referenceEntryId) => new()
    {
        Gas = shift.Gas.GasFormula,
        Element = shift.Element,
        TemperatureK = shift.Gas.TemperatureK,
        PressureBar = shift.Gas.PressureBar,
        MuEvPerMolecule = shift.Gas.EvPerMolecule,
        MuEvPerAtom = shift.MuEvPerAtom,
        DatasetReferenceEvPerAtom = shift.DatasetReferenceEvPerAtom,
        DatasetReferenceEntryId = referenceEntryId ?? string.Empty,
        DeltaMuEvPerAtom = shift.DeltaMuEvPerAtom,
        ZeroPointOffsetEvPerAtom = shift.ZeroPointOffsetEvPerAtom,
    };

    public static Protos.V1.ThermoReference ToWire(ReferenceAtTemperature reference) => new()
    {
        Element = reference.Element,
        TemperatureK = reference.TemperatureK,
        EntryId = reference.EntryId,
        FreeEnergyEvPerAtom = reference.FreeEnergyEvPerAtom,
        AnchorEntryId = reference.AnchorEntryId,
        ChangedFromAnchor = reference.ChangedFromAnchor,
    };

    public static Protos.V1.ThermoCrossing ToWire(DecompositionCrossing crossing) => new()
    {
        TemperatureK = crossing.TemperatureK,
        Direction = crossing.Direction == CrossingDirection.DecomposesAbove
            ? ThermoCrossingDirection.DecomposesAbove : ThermoCrossingDirection.FormsAbove,
        BracketLowK = crossing.BracketLowK,
        BracketHighK = crossing.BracketHighK,
        Method = crossing.Method == CrossingMethod.ExactLinearPiece ? "exact linear piece" : "Brent in scan bracket",
        Iterations = crossing.Iterations,
        Converged = crossing.Converged,
        Competitors = WireMapping.ToWire(crossing.Competitors),
        GasReleasedMoleculesPerFormulaUnit = crossing.GasReleasedMoleculesPerFormulaUnit,
    };

    public static FindDecompositionTemperaturesResponse ToWire(DecompositionTemperatureResult result, ThermoSystem system, string modelsFrom)
    {
        var wire = new FindDecompositionTemperaturesResponse
        {
            PhaseId = result.PhaseId,
            Formula = result.Formula,
            ChemicalSystem = system.Closed.SystemName,
            Treatment = ToWire(result.Treatment),
            FromK = result.FromK,
            ToK = result.ToK,
            EnergyAtFromEvPerClosedAtom = result.EnergyAtFromEvPerClosedAtom,
            EnergyAtToEvPerClosedAtom = result.EnergyAtToEvPerClosedAtom,
            StableAtFrom = result.StableAtFrom,
            StableAtTo = result.StableAtTo,
            ScanIntervals = result.ScanIntervals,
            EnergyUnit = system.Gas is null ? "eV/atom" : "eV per closed-element atom",
            ModelsFrom = modelsFrom,
            Caution = Caution,
        };
        if (system.GasShiftAt(result.FromK) is { } shift) wire.Gas = ToWire(shift, GasReferenceEntryId(system));
        wire.Crossings.AddRange(result.Crossings.Select(ToWire));
        wire.Breakpoints.AddRange(result.Breakpoints.Select(b =>
        {
            var w = new ThermoBreakpoint { TemperatureK = b.TemperatureK, EnergyEvPerClosedAtom = b.EnergyEvPerClosedAtom };
            w.CompetitorIdsBelow.AddRange(b.CompetitorIdsBelow);
            w.CompetitorIdsAbove.AddRange(b.CompetitorIdsAbove);
            return w;
        }));
        wire.ReferenceChanges.AddRange(result.ReferenceChanges.Select(c => new ThermoReferenceChange
        {
            Element = c.Element, TemperatureK = c.TemperatureK, FromEntryId = c.FromEntryId, ToEntryId = c.ToEntryId,
        }));
        wire.UnmodelledEntryIds.AddRange(result.UnmodelledEntryIds);
        return wire;
    }

    /// <summary>The entry that sets the dataset's reference for the gas's element, when one does.</summary>
    public static string? GasReferenceEntryId(ThermoSystem system) => system.Gas is null ? null
        : system.Closed.References.FirstOrDefault(r => r.Symbol == system.Gas.Species.Element)?.SourceEntryId;
}
