using Google.Protobuf.WellKnownTypes;
using Hull.Core.Defects;
using Hull.Core.Defects.Conditions;
using Hull.Protos.V1;
using Hull.Store;
using CoreDefect = Hull.Core.Defects.Defect;
using CoreFormationEnergy = Hull.Core.Defects.FormationEnergy;

namespace Hull.Server.Mapping;

/// <summary>Defect studies and their results from Core's types to the wire.</summary>
public static class DefectWireMapping
{
    /// <summary>The study version's provenance, with the host's formula and levels when <paramref name="study"/> is given.</summary>
    public static DefectStudyInfo Info(DefectStudyRecord record, DefectStudy? study) => new()
    {
        StudyName = record.StudyName,
        StudyVersion = record.Version,
        CommittedAt = Timestamp.FromDateTimeOffset(record.CommittedAtUtc),
        SourceLabel = record.SourceLabel,
        Note = record.Note,
        ContentSha256 = record.ContentSha256,
        HostFormula = study?.Host.Formula ?? string.Empty,
        BandGapEv = study?.Bulk.BandGapEv ?? 0,
        VbmEv = study?.Bulk.VbmEv ?? 0,
    };

    public static DefectSummary Summary(CoreDefect defect)
    {
        var summary = new DefectSummary
        {
            Name = defect.Name,
            Kind = defect.Kind.ToString().ToLowerInvariant(),
            SiteSet = defect.SiteSet,
            Degeneracy = defect.Degeneracy,
        };
        summary.Atoms.AddRange(defect.AtomsExchanged.Select(p => new DefectAtomChange { Element = p.Key, Count = p.Value }));
        summary.Charges.AddRange(defect.ChargeStates.Select(s => s.Charge));
        summary.Constituents.AddRange(defect.Constituents);
        return summary;
    }

    /// <summary>The point with its potentials: host elements first (window order), then the dopants.</summary>
    public static Protos.V1.DefectConditionPoint Point(Core.Defects.Conditions.DefectConditionPoint point, IReadOnlyList<string> hostElements)
    {
        var wire = new Protos.V1.DefectConditionPoint { Label = point.Label, VertexNumber = point.VertexNumber };
        IEnumerable<string> order = hostElements.Concat(point.Point.DeltaMuEv.Keys.Where(k => !hostElements.Contains(k)).Order(StringComparer.Ordinal));
        wire.Potentials.AddRange(order.Select(e => new DefectElementPotential { Element = e, DeltaMuEv = point.Point.DeltaMuEv[e] }));
        wire.CoexistingPhaseIds.AddRange(point.CoexistingPhaseIds);
        foreach (DopantPotential d in point.Dopants)
        {
            var dopant = new DefectDopantPotential { Element = d.Element, DeltaMuEv = d.DeltaMuEv, AtReference = d.AtReference, Given = d.Given };
            dopant.LimitingPhaseIds.AddRange(d.LimitingPhaseIds);
            wire.Dopants.Add(dopant);
        }

        return wire;
    }

    public static Protos.V1.DefectFormationEnergy Energy(CoreFormationEnergy e, bool lowest) => new()
    {
        Defect = e.Defect,
        Charge = e.Charge,
        FermiLevelEv = e.FermiLevelEv,
        FormationEnergyEv = e.TotalEv,
        SupercellDifferenceEv = e.SupercellDifferenceEv,
        ChemicalPotentialEv = e.ChemicalPotentialEv,
        ElectronReservoirEv = e.ElectronReservoirEv,
        ImageChargeEv = e.ImageChargeEv,
        AlignmentEv = e.AlignmentEv,
        CorrectionEv = e.CorrectionEv,
        Lowest = lowest,
    };

    public static DefectChargeStateCorrection Correction(CoreDefect defect, CorrectedChargeState state)
    {
        AlignmentResult? a = state.Correction.Alignment;
        return new DefectChargeStateCorrection
        {
            Defect = defect.Name,
            Charge = state.Charge,
            ImageChargeEv = state.Correction.ImageChargeEv,
            AlignmentEv = state.Correction.AlignmentEv,
            AlignmentMethod = (a?.Method ?? AlignmentMethod.None) switch
            {
                AlignmentMethod.Given => "given",
                AlignmentMethod.PlanarAverage => "planar",
                AlignmentMethod.AtomicSites => "sites",
                _ => "none",
            },
            ShiftVolts = a?.ShiftVolts ?? 0,
            SpreadVolts = a?.SpreadVolts ?? 0,
            PointsUsed = a?.PointsUsed ?? 0,
            SignCorrelation = a?.SignCorrelation ?? double.NaN,
            SamplingRadiusAngstrom = a?.SamplingRadiusAngstrom ?? 0,
        };
    }

    public static DefectTransitionLevel Level(TransitionLevel l) => new()
    {
        Defect = l.Defect,
        Charge = l.Charge,
        OtherCharge = l.OtherCharge,
        LevelEv = l.LevelEv,
        Thermodynamic = l.Kind == TransitionLevelKind.Thermodynamic,
        InsideGap = l.InsideGap,
        FormationEnergyEv = l.FormationEnergyEv,
    };

    public static DefectEffectiveU EffectiveU(NegativeU u) => new() { Defect = u.Defect, Charge = u.Charge, UEv = u.UEv, Negative = u.IsNegative };

    public static DefectComplexBinding Binding(ComplexBinding b)
    {
        var wire = new DefectComplexBinding { Complex = b.Complex, Charge = b.Charge, BindingEnergyEv = b.BindingEnergyEv };
        wire.Parts.AddRange(b.Parts.Select(p => new DefectPartCharge { Defect = p.Defect, Charge = p.Charge }));
        return wire;
    }

    /// <summary>A charge-neutrality solution: E_F, carriers, every charge state and total, the form and why it stopped.</summary>
    public static FermiSolution Solution(FermiLevelSolution solution)
    {
        var wire = new FermiSolution
        {
            Status = solution.Status switch
            {
                FermiSolveStatus.Converged => "converged",
                FermiSolveStatus.NoNeutralLevel => "no_neutral_level",
                _ => "iteration_limit",
            },
            TemperatureK = solution.TemperatureK,
            FermiLevelEv = solution.FermiLevelEv,
            ValenceEdgeEv = solution.Edges.ValenceEv,
            ConductionEdgeEv = solution.Edges.ConductionEv,
            ElectronsPerCm3 = solution.ElectronsPerCubicCentimetre,
            HolesPerCm3 = solution.HolesPerCubicCentimetre,
            ExtraDonorsPerCm3 = solution.ExtraDonorsPerCubicCentimetre,
            ExtraAcceptorsPerCm3 = solution.ExtraAcceptorsPerCubicCentimetre,
            Statistics = solution.Statistics == CarrierStatistics.Boltzmann ? "boltzmann" : "fermi_dirac",
            Form = solution.Form switch
            {
                null => "frozen",
                ConcentrationForm.SiteBlocking => "site_blocking",
                _ => "dilute",
            },
            NetChargePerCm3 = solution.NetChargePerCubicCentimetre,
            RelativeChargeImbalance = solution.RelativeChargeImbalance,
            Iterations = solution.Iterations,
        };
        wire.ChargeStates.AddRange(solution.ChargeStates.Select(c => new FermiChargeState
        {
            Defect = c.Defect, Charge = c.Charge, FormationEnergyEv = c.FormationEnergyEv, PerCm3 = c.PerCubicCentimetre,
        }));
        wire.Defects.AddRange(solution.Defects.Select(d => new FermiDefectTotal { Defect = d.Defect, SiteSet = d.SiteSet, PerCm3 = d.PerCubicCentimetre, SiteFraction = d.SiteFraction }));
        return wire;
    }
}
