using System.Globalization;
using Grpc.Core;
using Hull.Core.Defects;
using Hull.Core.Figures;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Defects;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Store;
using CorePoint = Hull.Core.Defects.Conditions.DefectConditionPoint;

namespace Hull.Server.Services;

/// <summary>
/// The defect service: stores study files beside a dataset, and evaluates a study version against a dataset
/// version (references, the host's window, the dopants' limits) through Core's defect module.
/// </summary>
public sealed class DefectGrpcService(DatasetStore store, VersionResolver versions, HullCache cache, DefectStudyCache studies) : DefectService.DefectServiceBase
{
    public override async Task<ImportDefectStudyResponse> ImportDefectStudy(ImportDefectStudyRequest request, ServerCallContext context)
    {
        DefectStudy study;
        try
        {
            // The same fingerprint the Store gives the stored version, so later calls find the study read here.
            study = studies.Get(DefectStudyFingerprint.Compute(request.StudyJson, request.ChargeStatesCsv), request.StudyJson, request.ChargeStatesCsv);
        }
        catch (DefectInputException e)
        {
            string field = e.Field.StartsWith("charge_states_csv", StringComparison.Ordinal) || e.Field.StartsWith("study_json", StringComparison.Ordinal)
                ? e.Field
                : "study_json." + e.Field;
            throw RpcErrors.InvalidArgument(field, e.Reason);
        }

        // Checked against the dataset's latest version before anything is written.
        VersionRef latest = versions.Resolve(request.Dataset, 0);
        var draft = new DefectStudyRecord(request.StudyName, 0, DateTimeOffset.UnixEpoch, request.SourceLabel, request.Note, request.StudyJson, request.ChargeStatesCsv, string.Empty);
        DefectEvaluation checkedStudy = await DefectEvaluation.AgainstAsync(cache, latest, draft, study, string.Empty, context.CancellationToken, requireWindow: false);
        DefectStudyRecord record = DefectEvaluation.Stored(() => store.SaveDefectStudy(
            request.Dataset, request.StudyName, request.StudyJson, request.ChargeStatesCsv, new BatchProvenance(request.SourceLabel, request.Note)));
        var response = new ImportDefectStudyResponse { Study = DefectWireMapping.Info(record, study) };
        response.Defects.AddRange(study.Defects.Select(DefectWireMapping.Summary));
        response.Warnings.AddRange(checkedStudy.Warnings.Select(w => $"{w} (checked against version {latest.Version})"));
        return response;
    }

    public override Task<ListDefectStudiesResponse> ListDefectStudies(ListDefectStudiesRequest request, ServerCallContext context)
    {
        var response = new ListDefectStudiesResponse();
        response.Studies.AddRange(store.ListDefectStudies(request.Dataset).Select(s => new DefectStudyListing { StudyName = s.StudyName, LatestVersion = s.LatestVersion }));
        return Task.FromResult(response);
    }

    public override Task<ExportDefectStudyResponse> ExportDefectStudy(ExportDefectStudyRequest request, ServerCallContext context)
    {
        if (request.StudyVersion < 0) throw RpcErrors.InvalidArgument("study_version", $"study version {request.StudyVersion} is negative; 0 means the latest");
        DefectStudyRecord record = DefectEvaluation.Stored(() => store.GetDefectStudy(request.Dataset, request.StudyName, request.StudyVersion == 0 ? null : request.StudyVersion));
        // The bytes are given back whatever this server makes of them; the host's summary only when it still reads them.
        DefectStudy? study = null;
        try
        {
            study = DefectStudyFile.Read(record.StudyJson, record.ChargeStatesCsv);
        }
        catch (DefectInputException)
        {
        }

        return Task.FromResult(new ExportDefectStudyResponse
        {
            Study = DefectWireMapping.Info(record, study),
            StudyJson = record.StudyJson,
            ChargeStatesCsv = record.ChargeStatesCsv,
        });
    }

    public override async Task<GetDefectFormationEnergiesResponse> GetDefectFormationEnergies(GetDefectFormationEnergiesRequest request, ServerCallContext context)
    {
        double[] fermiLevels = request.FermiLevelsEv.Count == 0 ? [0.0] : [.. request.FermiLevelsEv];
        for (int i = 0; i < fermiLevels.Length; i++)
        {
            if (!double.IsFinite(fermiLevels[i])) throw RpcErrors.InvalidArgument($"fermi_levels_ev[{i}]", $"the Fermi level must be a finite number of eV above the VBM, not {fermiLevels[i]}");
        }

        DefectEvaluation ev = await LoadAsync(request.Dataset, request.Version, request.StudyName, request.StudyVersion, request.HostEntryId, context);
        IReadOnlyList<Core.Defects.Defect> defects = ev.Select(request.Defects);
        (IReadOnlyList<CorePoint> points, DefectGasPoint? gas) = ev.Points(request.Conditions);
        var response = new GetDefectFormationEnergiesResponse
        {
            Used = WireMapping.ToWire(ev.Version),
            Study = DefectWireMapping.Info(ev.Record, ev.Study),
            HostEntryId = ev.Host.Id,
            Gas = gas,
        };
        foreach (CorePoint point in points)
        {
            FormationEnergyCalculator calculator = ev.Calculator(point);
            var atPoint = new DefectPointEnergies { Point = DefectWireMapping.Point(point, ev.Window.Elements) };
            foreach (Core.Defects.Defect defect in defects)
            {
                foreach (double fermi in fermiLevels)
                {
                    Core.Defects.FormationEnergy lowest = calculator.Lowest(defect, fermi);
                    foreach (CorrectedChargeState state in defect.ChargeStates)
                    {
                        atPoint.Energies.Add(DefectWireMapping.Energy(calculator.At(defect, state, fermi), state.Charge == lowest.Charge));
                    }
                }
            }

            response.Points.Add(atPoint);
        }

        foreach (Core.Defects.Defect defect in defects)
        {
            response.Corrections.AddRange(defect.ChargeStates.Select(s => DefectWireMapping.Correction(defect, s)));
        }

        response.Warnings.AddRange(ev.Warnings);
        return response;
    }

    public override async Task<GetChargeTransitionLevelsResponse> GetChargeTransitionLevels(GetChargeTransitionLevelsRequest request, ServerCallContext context)
    {
        DefectEvaluation ev = await LoadAsync(request.Dataset, request.Version, request.StudyName, request.StudyVersion, request.HostEntryId, context);
        IReadOnlyList<Core.Defects.Defect> defects = ev.Select(request.Defects);
        (CorePoint point, DefectGasPoint? gas) = ev.SinglePoint(request.Conditions);
        FormationEnergyCalculator calculator = ev.Calculator(point);
        double gap = ev.Study.Bulk.BandGapEv;
        var response = new GetChargeTransitionLevelsResponse
        {
            Used = WireMapping.ToWire(ev.Version),
            Study = DefectWireMapping.Info(ev.Record, ev.Study),
            HostEntryId = ev.Host.Id,
            Point = DefectWireMapping.Point(point, ev.Window.Elements),
            Gas = gas,
        };
        foreach (Core.Defects.Defect defect in defects)
        {
            IReadOnlyDictionary<int, double> intercepts = calculator.AtValenceBandMaximum(defect);
            foreach (TransitionLevel level in ChargeTransitions.Levels(defect.Name, intercepts, gap))
            {
                response.Levels.Add(DefectWireMapping.Level(level));
                if (level.Kind == TransitionLevelKind.Thermodynamic && !level.InsideGap)
                {
                    ev.Warnings.Add(string.Create(CultureInfo.InvariantCulture,
                        $"{defect.Name} ε({level.Charge:+0;-0;0}/{level.OtherCharge:+0;-0;0}) = {level.LevelEv:0.###} eV lies {(level.LevelEv < 0 ? "below the VBM" : "above the CBM")}: outside the gap"));
                }
            }

            foreach (NegativeU u in ChargeTransitions.EffectiveU(defect.Name, intercepts))
            {
                response.EffectiveU.Add(DefectWireMapping.EffectiveU(u));
                if (u.IsNegative)
                {
                    ev.Warnings.Add(string.Create(CultureInfo.InvariantCulture,
                        $"{defect.Name} is negative-U at q = {u.Charge:+0;-0;0} (U = {u.UEv:0.###} eV): charge {u.Charge:+0;-0;0} is never the lowest state, and ε({u.Charge + 1:+0;-0;0}/{u.Charge - 1:+0;-0;0}) is a two-electron level"));
                }
            }
        }

        response.Bindings.AddRange(DefectEvaluation.Core(() => ComplexBindings.All(calculator))
            .Where(b => defects.Any(d => d.Name == b.Complex))
            .Select(DefectWireMapping.Binding));
        response.Warnings.AddRange(ev.Warnings);
        return response;
    }

    public override async Task<DrawDefectFormationFigureResponse> DrawDefectFormationFigure(DrawDefectFormationFigureRequest request, ServerCallContext context)
    {
        DefectEvaluation ev = await LoadAsync(request.Dataset, request.Version, request.StudyName, request.StudyVersion, request.HostEntryId, context);
        IReadOnlyList<Core.Defects.Defect> defects = ev.Select(request.Defects);
        (CorePoint point, DefectGasPoint? gas) = ev.SinglePoint(request.Conditions);
        FormationEnergyCalculator calculator = ev.Calculator(point);
        Protos.V1.DefectConditionPoint wirePoint = DefectWireMapping.Point(point, ev.Window.Elements);
        string description = string.Join(", ", wirePoint.Potentials.Select(p => string.Create(CultureInfo.InvariantCulture, $"Δμ({p.Element}) = {p.DeltaMuEv:0.###} eV")));
        var input = new DefectFigureInput(
            ev.Study.Host.Formula,
            point.VertexNumber > 0 && gas is null ? $"window vertex {point.VertexNumber} (with {point.Label})"
                : point.VertexNumber == 0 ? "given point" : point.Label,
            description,
            ev.Study.Bulk.BandGapEv,
            request.HasFermiMinEv ? request.FermiMinEv : 0.0,
            request.HasFermiMaxEv ? request.FermiMaxEv : ev.Study.Bulk.BandGapEv,
            [.. defects.Select(d => new DefectFigureLine(d.Name, calculator.AtValenceBandMaximum(d)))],
            new FigureMetadata(ev.Version.Dataset, ev.Version.Version, ev.Version.Fingerprint),
            ev.Record.StudyName,
            ev.Record.Version);
        DefectFigureResult figure;
        try
        {
            figure = DefectFormationFigure.Draw(input);
        }
        catch (FigureInputException e)
        {
            throw RpcErrors.InvalidArgument(request.HasFermiMinEv ? "fermi_min_ev" : "fermi_max_ev", e.Message);
        }

        var response = new DrawDefectFormationFigureResponse
        {
            Used = WireMapping.ToWire(ev.Version),
            Study = DefectWireMapping.Info(ev.Record, ev.Study),
            Point = wirePoint,
            Svg = figure.Svg,
            DefectCount = figure.DefectCount,
            MarkedLevelCount = figure.MarkedLevelCount,
        };
        response.Warnings.AddRange(ev.Warnings);
        return response;
    }

    private Task<DefectEvaluation> LoadAsync(string dataset, long version, string studyName, long studyVersion, string hostEntryId, ServerCallContext context) =>
        DefectEvaluation.LoadAsync(store, versions, cache, studies, dataset, version, studyName, studyVersion, hostEntryId, context.CancellationToken);
}
