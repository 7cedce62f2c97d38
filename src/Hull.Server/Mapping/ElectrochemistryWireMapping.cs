using Hull.Core.Thermo;
using Hull.Core.Thermo.Electrochemistry;
using Hull.Core.Thermo.Reactions;
using Hull.Protos.V1;
using CoreEntryStability = Hull.Core.Thermo.EntryStability;
using CoreProduct = Hull.Core.Thermo.Reactions.ReactionProduct;
using CoreReactionPoint = Hull.Core.Thermo.Reactions.ReactionPoint;
using CoreVoltagePlateau = Hull.Core.Thermo.Electrochemistry.VoltagePlateau;
using CoreVoltageProfile = Hull.Core.Thermo.Electrochemistry.VoltageProfile;

namespace Hull.Server.Mapping;

/// <summary>Open-element hulls, voltage profiles, reaction profiles and ion windows from the science layer to the wire.</summary>
public static class ElectrochemistryWireMapping
{
    public static OpenHullEntry ToOpenHullEntry(CoreEntryStability entry, string formulaAsStored) => new()
    {
        EntryId = entry.Id,
        Formula = formulaAsStored,
        GrandPotentialEvPerClosedAtom = entry.AxisEnergyEvPerAtom,
        FormationEnergyEvPerAtom = WireMapping.FormationOf(entry.FormationEnergyEvPerAtom),
        EnergyAboveHullEvPerClosedAtom = entry.EnergyAboveHullEvPerAtom,
        IsHullVertex = entry.IsHullVertex,
        Decomposition = WireMapping.ToWire(entry.Decomposition),
    };

    public static ProfilePhase ToWire(HullPhase phase) => new()
    {
        PhaseId = phase.Id,
        Formula = phase.Composition.Formula,
        IsElementalReference = phase.IsSynthetic,
    };

    public static Protos.V1.VoltageProfile ToWire(CoreVoltageProfile profile)
    {
        var wire = new Protos.V1.VoltageProfile
        {
            Ion = profile.Ion,
            ChargeNumber = profile.ChargeNumber,
            HostFormula = profile.Host.Formula,
            FullyInsertedFormula = profile.FullyInserted.Formula,
            ChemicalSystem = profile.ChemicalSystem,
            AverageVoltsAgainstMetal = profile.AverageVoltsAgainstMetal,
            IonsPerHostInserted = profile.IonsPerHostInserted,
            CapacityPerHostMassMahPerG = profile.CapacityPerHostMassMilliampHoursPerGram,
            CapacityPerInsertedMassMahPerG = profile.CapacityPerInsertedMassMilliampHoursPerGram,
            EnergyDensityPerHostMassWhPerKg = profile.EnergyDensityPerHostMassWattHoursPerKilogram,
            EnergyDensityPerInsertedMassWhPerKg = profile.EnergyDensityPerInsertedMassWattHoursPerKilogram,
            EndsAtIonMetal = profile.EndsAtIonMetal,
            Caveat = profile.Caveat,
        };
        foreach (CoreVoltagePlateau p in profile.Plateaus)
        {
            var plateau = new Protos.V1.VoltagePlateau
            {
                IonsPerHostFrom = p.IonsPerHostFrom,
                IonsPerHostTo = p.IonsPerHostTo,
                VoltsAgainstMetal = p.VoltsAgainstMetal,
                IonChemicalPotentialEvPerAtom = p.IonChemicalPotentialEvPerAtom,
                IsConversion = p.IsConversion,
            };
            plateau.Phases.AddRange(p.Phases.Select(q => ToWire(q.Phase)));
            wire.Plateaus.Add(plateau);
        }

        return wire;
    }

    public static Reactant ToReactant(CoreEntryStability reactant, string formulaAsStored) => new()
    {
        EntryId = reactant.Id,
        Formula = formulaAsStored,
        EnergyAboveHullEvPerAtom = reactant.EnergyAboveHullEvPerAtom,
        IsHullVertex = reactant.IsHullVertex,
    };

    public static Protos.V1.ReactionPoint ToWire(CoreReactionPoint point)
    {
        var wire = new Protos.V1.ReactionPoint
        {
            AtomFractionOfFirst = point.AtomFractionOfFirst.ToDouble(),
            AtomFractionExact = point.AtomFractionOfFirst.ToString(),
            FormulaUnitFractionOfFirst = point.FormulaUnitFractionOfFirst,
            ReactionEnergyEvPerAtom = point.ReactionEnergyEvPerAtom,
            ReactionEnergyEvPerFormulaUnit = point.ReactionEnergyEvPerFormulaUnit,
        };
        foreach (CoreProduct product in point.Products)
        {
            wire.Products.Add(new Protos.V1.ReactionProduct
            {
                Phase = ToWire(product.Phase),
                FormulaUnitsPerMixtureAtom = product.FormulaUnitsPerMixtureAtom.ToDouble(),
                FormulaUnitsExact = product.FormulaUnitsPerMixtureAtom.ToString(),
            });
        }

        return wire;
    }

    public static GetElectrochemicalWindowResponse ToWire(IonStabilityWindow window, string formulaAsStored, string system)
    {
        var wire = new GetElectrochemicalWindowResponse
        {
            ChemicalSystem = system,
            EntryId = window.Phase.Id,
            Formula = formulaAsStored,
            Ion = window.Ion,
            ChargeNumber = window.ChargeNumber,
            Exists = window.Exists,
            EnergyAboveHullEvPerAtom = window.Phase.EnergyAboveHullEvPerAtom,
            Caveat = window.Caveat,
        };
        if (window.ReductionLimitVolts is double low) wire.ReductionLimitVolts = low;
        if (window.HighestIonPotentialEvPerAtom is double highest) wire.HighestIonPotentialEvPerAtom = highest;
        if (window.OxidationLimitVolts is double high) wire.OxidationLimitVolts = high;
        if (window.LowestIonPotentialEvPerAtom is double lowest) wire.LowestIonPotentialEvPerAtom = lowest;
        if (window.ReductionProducts is { } reduced) wire.ReductionProducts = WireMapping.ToWire(reduced);
        if (window.OxidationProducts is { } oxidised) wire.OxidationProducts = WireMapping.ToWire(oxidised);
        return wire;
    }
}
