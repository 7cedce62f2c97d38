using Google.Protobuf.WellKnownTypes;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Store;
using ThermoBasis = Hull.Core.Thermo.EnergyBasis;
using WireBasis = Hull.Protos.V1.EnergyBasis;
using WireDecomposition = Hull.Protos.V1.Decomposition;
using WireEntryStability = Hull.Protos.V1.EntryStability;
using WirePhaseFacet = Hull.Protos.V1.PhaseFacet;
using WireTieLine = Hull.Protos.V1.TieLine;

namespace Hull.Server.Mapping;

/// <summary>Translations between the wire messages, the store's records and the science layer's results.</summary>
public static class WireMapping
{
    /// <summary>The wire's basis as the engine's; false for UNSPECIFIED or a number the contract does not define.</summary>
    public static bool TryFromWire(WireBasis basis, out ThermoBasis mapped)
    {
        switch (basis)
        {
            case WireBasis.TotalPerFormulaUnit: mapped = ThermoBasis.TotalPerFormulaUnit; return true;
            case WireBasis.TotalPerAtom: mapped = ThermoBasis.TotalPerAtom; return true;
            case WireBasis.FormationPerFormulaUnit: mapped = ThermoBasis.FormationPerFormulaUnit; return true;
            case WireBasis.FormationPerAtom: mapped = ThermoBasis.FormationPerAtom; return true;
            default: mapped = default; return false;
        }
    }

    public static WireBasis ToWire(ThermoBasis basis) => basis switch
    {
        ThermoBasis.TotalPerFormulaUnit => WireBasis.TotalPerFormulaUnit,
        ThermoBasis.TotalPerAtom => WireBasis.TotalPerAtom,
        ThermoBasis.FormationPerFormulaUnit => WireBasis.FormationPerFormulaUnit,
        ThermoBasis.FormationPerAtom => WireBasis.FormationPerAtom,
        _ => throw new ArgumentOutOfRangeException(nameof(basis), basis, "not a defined energy basis"),
    };

    /// <summary>
    /// The basis of a stored row. The store's schema admits only the known tokens, so an unreadable one is a fault
    /// of the file, not of the caller.
    /// </summary>
    /// <exception cref="InvalidDataException">When the stored token is not a basis.</exception>
    public static ThermoBasis BasisOf(EntryRow row) =>
        EnergyBasisTokens.TryParse(row.Basis, out ThermoBasis basis)
            ? basis
            : throw new InvalidDataException($"stored entry '{row.Id}' has the unknown energy basis '{row.Basis}'");

    public static Entry ToWire(EntryRow row)
    {
        var entry = new Entry
        {
            Id = row.Id,
            Formula = row.Formula,
            EnergyEv = row.EnergyEv,
            Basis = ToWire(BasisOf(row)),
            Note = row.Metadata ?? string.Empty,
            CorrelationGroup = row.CorrelationGroup ?? string.Empty,
            Method = row.Method ?? string.Empty,
        };
        if (row.SigmaEvPerAtom is { } sigma) entry.EnergySigmaEvPerAtom = sigma;
        if (row.TemperatureModel is { } model) entry.TemperatureModel = TemperatureModelMapping.ToWire(model);
        return entry;
    }

    public static Protos.V1.DatasetSummary ToWire(Store.DatasetSummary summary) => new()
    {
        Name = summary.Name,
        Description = summary.Description,
        CreatedAt = Timestamp.FromDateTimeOffset(summary.CreatedAtUtc),
        LatestVersion = summary.LatestVersion,
        EntryCount = summary.EntryCount,
    };

    public static DatasetVersion ToWire(DatasetVersionInfo version) => new()
    {
        Version = version.Version,
        CommittedAt = Timestamp.FromDateTimeOffset(version.CommittedAtUtc),
        SourceLabel = version.SourceLabel,
        Note = version.Note,
        BatchEntryCount = version.BatchEntryCount,
        InsertedCount = version.Inserted,
        ReplacedCount = version.Replaced,
        EntryCount = version.EntryCount,
    };

    public static VersionUsed ToWire(VersionRef version)
    {
        var used = new VersionUsed { Dataset = version.Dataset, Version = version.Version, ContentSha256 = version.Fingerprint };
        if (version.Corrections is { } corrections) used.Corrections = ToWire(corrections);
        return used;
    }

    /// <summary>The set a version was derived with, as answers name it.</summary>
    public static CorrectionsUsed ToWire(VersionCorrections corrections) => new()
    {
        SetName = corrections.SetName, SetVersion = corrections.SetVersion, SourceVersion = corrections.SourceVersion,
    };

    /// <summary>
    /// A formation energy for the wire. The service builds closed hulls over formation energies only, where every
    /// phase carries one; a missing one is a fault of the service, not of the request.
    /// </summary>
    public static double FormationOf(double? formationEnergyEvPerAtom) =>
        formationEnergyEvPerAtom ?? throw new InvalidOperationException("a hull phase without formation energy reached the formation-energy wire fields");

    public static WireDecomposition ToWire(Core.Thermo.Decomposition decomposition)
    {
        var wire = new WireDecomposition
        {
            HullEnergyEvPerAtom = decomposition.HullEnergyEvPerAtom,
            Reaction = decomposition.ToReactionString(),
        };
        foreach (Core.Thermo.DecompositionProduct product in decomposition.Products)
        {
            wire.Products.Add(new Protos.V1.DecompositionProduct
            {
                PhaseId = product.Phase.Id,
                IsElementalReference = product.Phase.IsSynthetic,
                Formula = product.Phase.Composition.Formula,
                AtomFraction = product.AtomFraction,
                FormulaUnits = product.FormulaUnits,
                FormulaUnitsExact = product.ExactFormulaUnits?.ToString() ?? string.Empty,
                FormationEnergyEvPerAtom = FormationOf(product.Phase.FormationEnergyEvPerAtom),
            });
        }

        return wire;
    }

    public static WireEntryStability ToWire(Core.Thermo.EntryStability stability, string formulaAsStored)
    {
        var wire = new WireEntryStability
        {
            EntryId = stability.Id,
            Formula = formulaAsStored,
            ChemicalSystem = stability.HullSystem,
            FormationEnergyEvPerAtom = FormationOf(stability.FormationEnergyEvPerAtom),
            EnergyAboveHullEvPerAtom = stability.EnergyAboveHullEvPerAtom,
            IsOnHull = stability.IsOnHull,
            IsHullVertex = stability.IsHullVertex,
            Decomposition = ToWire(stability.Decomposition),
        };
        if (stability.DecompositionEnergyEvPerAtom is double decompositionEnergy)
        {
            wire.DecompositionEnergyEvPerAtom = decompositionEnergy;
        }

        return wire;
    }

    public static StablePhase ToWire(HullPhase phase) => new()
    {
        PhaseId = phase.Id,
        Formula = phase.Composition.Formula,
        FormationEnergyEvPerAtom = FormationOf(phase.FormationEnergyEvPerAtom),
        IsElementalReference = phase.IsSynthetic,
    };

    public static WirePhaseFacet ToWire(Core.Thermo.PhaseFacet facet)
    {
        var wire = new WirePhaseFacet();
        wire.PhaseIds.AddRange(facet.Phases.Select(p => p.Id));
        for (int k = 0; k < facet.Components.Count; k++)
        {
            wire.ChemicalPotentials.Add(new ComponentPotential
            {
                Component = facet.Components[k],
                ChemicalPotentialEvPerAtom = facet.ChemicalPotentialsEvPerAtom[k],
            });
        }

        return wire;
    }

    public static WireTieLine ToWire(Core.Thermo.TieLine tieLine) => new()
    {
        FirstPhaseId = tieLine.First.Id,
        SecondPhaseId = tieLine.Second.Id,
    };

    public static Protos.V1.ElementReference ToWire(Core.Thermo.ElementReference reference) => new()
    {
        Symbol = reference.Symbol,
        TotalEnergyEvPerAtom = reference.TotalEnergyEvPerAtom,
        SourceEntryId = reference.SourceEntryId ?? string.Empty,
        GivenByCaller = reference.IsExplicit,
    };

    public static Protos.V1.SystemCoverage ToWire(Core.Thermo.SystemCoverage coverage)
    {
        var wire = new Protos.V1.SystemCoverage
        {
            ChemicalSystem = coverage.HullSystem,
            EntryCount = coverage.EntryCount,
            CompetingPhaseCount = coverage.CompoundEntryCount,
        };
        foreach (ComponentCoverage component in coverage.Components.OrderBy(c => c.Name, StringComparer.Ordinal))
        {
            var element = new ElementCoverage
            {
                Symbol = component.Name,
                PureEntryCount = component.PureEntryCount,
                ZeroByDefinition = component.IsZeroByDefinition,
            };
            if (component.Reference is not null) element.Reference = ToWire(component.Reference);
            wire.Elements.Add(element);
        }

        return wire;
    }

    /// <summary>Most entry ids listed in one system problem: enough to act on, small enough for one message.</summary>
    public const int MaxIdsPerProblem = 1000;

    public static Protos.V1.SystemProblem ToWire(Core.Thermo.SystemProblem problem)
    {
        var wire = new Protos.V1.SystemProblem
        {
            ChemicalSystem = problem.ChemicalSystem,
            UnansweredEntryCount = problem.UnansweredEntryIds.Count,
            Message = problem.Message,
        };
        wire.ElementsWithoutReference.AddRange(problem.ElementsWithoutReference);
        wire.CauseEntryIds.AddRange(problem.Causes.Select(c => c.EntryId).Order(StringComparer.Ordinal).Take(MaxIdsPerProblem));
        wire.UnansweredEntryIds.AddRange(problem.UnansweredEntryIds.Order(StringComparer.Ordinal).Take(MaxIdsPerProblem));
        return wire;
    }
}
