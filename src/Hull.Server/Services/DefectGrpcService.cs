using System.Globalization;
using Grpc.Core;
using Hull.Core.Defects;
using Hull.Core.Figures;
using Hull.Core.Thermo;
using Hull.Core.Windows;
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
public sealed class DefectGrpcService(IDatasetStore store, VersionResolver versions, HullCache cache, DefectStudyCache studies) : DefectService.DefectServiceBase
{
    /// <summary>Points along a Δμ path of the carrier figure when the caller gives none, and the most it draws.</summary>
    private const int DefaultPathPoints = 41, MaxPathPoints = 1001;

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
            FigureSource.Of(ev.Version),
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

    public override async Task<FermiLevelResponse> SolveFermiLevel(FermiLevelRequest request, ServerCallContext context)
    {
        CarrierStatistics statistics = CarrierOptions.Statistics(request.Statistics);
        ConcentrationForm form = CarrierOptions.Form(request.Form);
        DefectEvaluation ev = await LoadAsync(request.Dataset, request.Version, request.StudyName, request.StudyVersion, request.HostEntryId, context);
        CarrierModel model = ev.Carriers().Model(statistics, form);
        (IReadOnlyList<CorePoint> points, DefectGasPoint? gas) = ev.Points(request.Conditions);
        double gap = ev.Study.Bulk.BandGapEv;
        // At a gas condition the gas's temperature is the natural default: the defects form where the gas is.
        double temperature = CarrierOptions.Temperature(model, gap, request.TemperatureK == 0 && gas is not null ? gas.TemperatureK : request.TemperatureK, "temperature_k");
        double? operating = request.HasOperatingTemperatureK ? CarrierOptions.Temperature(model, gap, request.OperatingTemperatureK, "operating_temperature_k") : null;
        var response = new FermiLevelResponse
        {
            Used = WireMapping.ToWire(ev.Version),
            Study = DefectWireMapping.Info(ev.Record, ev.Study),
            HostEntryId = ev.Host.Id,
            Gas = gas,
        };
        foreach (CorePoint point in points)
        {
            DefectEnsemble ensemble = DefectEvaluation.Core(() => DefectEnsemble.FromCalculator(ev.Calculator(point)));
            var atPoint = new FermiPointSolution { Point = DefectWireMapping.Point(point, ev.Window.Elements) };
            if (operating is { } operatingK)
            {
                QuenchSolution quench = DefectEvaluation.Core(() => Quenching.Solve(ensemble, model, temperature, operatingK));
                atPoint.Equilibrium = DefectWireMapping.Solution(quench.Growth);
                atPoint.Quenched = DefectWireMapping.Solution(quench.Operating);
                ev.Warnings.AddRange(CarrierOptions.Doubts(quench.Growth, point.Label).Concat(CarrierOptions.Doubts(quench.Operating, $"{point.Label} quenched")));
            }
            else
            {
                FermiLevelSolution solution = DefectEvaluation.Core(() => ChargeNeutrality.Solve(ensemble, model, temperature));
                atPoint.Equilibrium = DefectWireMapping.Solution(solution);
                ev.Warnings.AddRange(CarrierOptions.Doubts(solution, point.Label));
            }

            response.Points.Add(atPoint);
        }

        response.Warnings.AddRange(ev.Warnings);
        return response;
    }

    public override async Task<DefectSolubilityResponse> GetDopantSolubility(DefectSolubilityRequest request, ServerCallContext context)
    {
        CarrierStatistics statistics = CarrierOptions.Statistics(request.Statistics);
        ConcentrationForm form = CarrierOptions.Form(request.Form);
        if (request.TemperaturesK.Count == 0) throw RpcErrors.InvalidArgument("temperatures_k", "give at least one growth temperature (K)");
        DefectEvaluation ev = await LoadAsync(request.Dataset, request.Version, request.StudyName, request.StudyVersion, request.HostEntryId, context);
        CarrierModel model = ev.Carriers().Model(statistics, form);
        double gap = ev.Study.Bulk.BandGapEv;
        double[] temperatures = [.. request.TemperaturesK.Select((t, i) => CarrierOptions.Temperature(model, gap, t, $"temperatures_k[{i}]"))];
        string dopants = ev.DopantHulls.Count == 0 ? "none" : string.Join(", ", ev.DopantHulls.Keys);
        string dopant = request.Dopant.Length > 0 ? request.Dopant
            : ev.DopantHulls.Count == 1 ? ev.DopantHulls.Keys.Single()
            : throw RpcErrors.InvalidArgument("dopant", $"name the dopant: the study's dopants are {dopants}");
        if (!ev.DopantHulls.TryGetValue(dopant, out SystemHull? extended))
        {
            throw RpcErrors.InvalidArgument("dopant", $"'{dopant}' is not a dopant of the study (an element a defect adds that the host {ev.Study.Host.Formula} lacks); its dopants: {dopants}");
        }

        var others = new Dictionary<string, double>(StringComparer.Ordinal);
        for (int i = 0; i < request.OtherPotentials.Count; i++)
        {
            DefectElementPotential p = request.OtherPotentials[i];
            if (!ev.DopantHulls.ContainsKey(p.Element) || p.Element == dopant)
            {
                throw RpcErrors.InvalidArgument($"other_potentials[{i}].element", $"'{p.Element}' is not one of the study's other dopants ({string.Join(", ", ev.DopantHulls.Keys.Where(k => k != dopant).DefaultIfEmpty("none"))})");
            }

            if (!double.IsFinite(p.DeltaMuEv) || !others.TryAdd(p.Element, p.DeltaMuEv))
            {
                throw RpcErrors.InvalidArgument($"other_potentials[{i}]", $"{p.Element}: given twice or not a finite Δμ");
            }
        }

        foreach (string missing in ev.DopantHulls.Keys.Where(k => k != dopant && !others.ContainsKey(k)))
        {
            throw RpcErrors.InvalidArgument("other_potentials", $"the study's defects also add {missing}, outside the host + {dopant} window: give its Δμ in other_potentials");
        }

        Core.Windows.DopantLimit limit;
        try
        {
            limit = DopantLimits.Of(ev.HostHull, extended, ev.Host.Id, dopant);
        }
        catch (WindowInputException e)
        {
            throw RpcErrors.FailedPrecondition(e.Message, ErrorReasons.PreconditionFailed, $"entry:{ev.Host.Id}");
        }

        DopantSolubilityResult result = DefectEvaluation.Core(() => DopantSolubility.Evaluate(ev.Study, ev.References, limit, model, temperatures, others));
        var response = new DefectSolubilityResponse
        {
            Used = WireMapping.ToWire(ev.Version),
            Study = DefectWireMapping.Info(ev.Record, ev.Study),
            HostEntryId = ev.Host.Id,
            Dopant = dopant,
            MaxDeltaMuEv = result.MaxDeltaMuEv,
        };
        response.LimitingPhaseIds.AddRange(result.LimitingPhaseIds);
        foreach (SolubilityVertex v in result.Vertices)
        {
            var vertex = new DefectSolubilityVertex { VertexNumber = v.Index + 1 };
            vertex.Potentials.AddRange(limit.ExtendedElements.Concat(others.Keys.Order(StringComparer.Ordinal))
                .Select(e => new DefectElementPotential { Element = e, DeltaMuEv = v.Point.DeltaMuEv[e] }));
            vertex.LimitingPhaseIds.AddRange(v.LimitingPhaseIds);
            response.Vertices.Add(vertex);
        }

        foreach (SolubilityAtTemperature t in result.Temperatures)
        {
            var atT = new DefectSolubilityAtTemperature { TemperatureK = t.TemperatureK, MostSolubleVertex = t.MostSolubleVertex + 1, MaxDopantPerCm3 = t.MostSolubleVertex < 0 ? 0 : t.MaxDopantPerCubicCentimetre };
            foreach (VertexSolubility v in t.PerVertex)
            {
                atT.Vertices.Add(new DefectSolubilityAtVertex { VertexNumber = v.VertexIndex + 1, DopantPerCm3 = v.DopantPerCubicCentimetre, Solution = DefectWireMapping.Solution(v.Solution) });
                ev.Warnings.AddRange(CarrierOptions.Doubts(v.Solution, $"extended vertex {v.VertexIndex + 1}"));
            }

            response.Temperatures.Add(atT);
        }

        response.Cautions.AddRange(result.Cautions);
        response.Warnings.AddRange(ev.Warnings);
        return response;
    }

    public override async Task<DefectCarrierFigureResponse> DrawCarrierFigure(DefectCarrierFigureRequest request, ServerCallContext context)
    {
        CarrierStatistics statistics = CarrierOptions.Statistics(request.Statistics);
        ConcentrationForm form = CarrierOptions.Form(request.Form);
        bool alongPath = request.PathTo is not null;
        if (alongPath && request.TemperaturesK.Count != 1)
        {
            throw RpcErrors.InvalidArgument("temperatures_k", $"a carrier figure along a path takes one temperature (K), not {request.TemperaturesK.Count}");
        }

        if (!alongPath && request.TemperaturesK.Count < 2) throw RpcErrors.InvalidArgument("temperatures_k", "a carrier figure needs two or more rising temperatures (K)");
        int pathPoints = request.PathPoints == 0 ? DefaultPathPoints : request.PathPoints;
        if (alongPath && pathPoints is < 2 or > MaxPathPoints)
        {
            throw RpcErrors.InvalidArgument("path_points", $"a path takes 2 to {MaxPathPoints} points (0 = {DefaultPathPoints}), not {request.PathPoints}");
        }

        DefectEvaluation ev = await LoadAsync(request.Dataset, request.Version, request.StudyName, request.StudyVersion, request.HostEntryId, context);
        CarrierModel model = ev.Carriers().Model(statistics, form);
        double gap = ev.Study.Bulk.BandGapEv;
        double[] temperatures = [.. request.TemperaturesK.Select((t, i) => CarrierOptions.Temperature(model, gap, t, $"temperatures_k[{i}]"))];
        for (int i = 1; i < temperatures.Length; i++)
        {
            if (!(temperatures[i] > temperatures[i - 1])) throw RpcErrors.InvalidArgument($"temperatures_k[{i}]", "the temperatures of a figure must rise");
        }

        double? operating = request.HasOperatingTemperatureK ? CarrierOptions.Temperature(model, gap, request.OperatingTemperatureK, "operating_temperature_k") : null;
        (CorePoint point, DefectGasPoint? _) = ev.SinglePoint(request.Conditions);
        FermiLevelSolution SolveAt(CorePoint at, double t)
        {
            DefectEnsemble ensemble = DefectEvaluation.Core(() => DefectEnsemble.FromCalculator(ev.Calculator(at)));
            FermiLevelSolution s = operating is { } op
                ? DefectEvaluation.Core(() => Quenching.Solve(ensemble, model, t, op)).Operating
                : DefectEvaluation.Core(() => ChargeNeutrality.Solve(ensemble, model, t));
            ev.Warnings.AddRange(CarrierOptions.Doubts(s, at.Label));
            return s;
        }

        string where = point.VertexNumber > 0 ? $"window vertex {point.VertexNumber} ({point.Label})" : point.Label;
        string how = operating is { } q ? string.Create(CultureInfo.InvariantCulture, $"grown and quenched to {q:0.##} K") : "in equilibrium";
        var x = new List<double>();
        var solutions = new List<FermiLevelSolution>();
        string title;
        CarrierFigureAxis axis;
        if (alongPath)
        {
            (CorePoint end, DefectGasPoint? _) = ev.SinglePoint(request.PathTo);
            string endName = end.VertexNumber > 0 ? $"window vertex {end.VertexNumber} ({end.Label})" : end.Label;
            // Both ends lie in the host's window and each dopant's ceiling is concave in the host's Δμ, so every point
            // between them (dopants' Δμ interpolated too) stays inside what the window and the ceilings allow.
            foreach ((double fraction, ChemicalPotentialPoint at) in DefectEvaluation.Core(() => ChemicalPotentialPath.Between(point.Point, end.Point, pathPoints)))
            {
                x.Add(fraction);
                solutions.Add(SolveAt(point with { Point = at, VertexNumber = 0 }, temperatures[0]));
            }

            title = string.Create(CultureInfo.InvariantCulture, $" from {where} to {endName} at {temperatures[0]:0.##} K, {how}");
            axis = CarrierFigureAxis.Path(point.VertexNumber > 0 ? $"vertex {point.VertexNumber}" : point.Label, end.VertexNumber > 0 ? $"vertex {end.VertexNumber}" : end.Label);
        }
        else
        {
            foreach (double t in temperatures)
            {
                x.Add(t);
                solutions.Add(SolveAt(point, t));
            }

            title = operating is { } op2
                ? string.Create(CultureInfo.InvariantCulture, $" at {where}, grown at each temperature and quenched to {op2:0.##} K")
                : $" at {where}, in equilibrium";
            axis = operating is null ? CarrierFigureAxis.Temperature : new CarrierFigureAxis("Growth temperature", "K");
        }

        string svg;
        try
        {
            svg = CarrierFigure.Render([(ev.Study.Host.Formula, true), (title, false)], axis, x, solutions, FigureSource.Of(ev.Version));
        }
        catch (FigureInputException e)
        {
            throw RpcErrors.InvalidArgument("temperatures_k", e.Message);
        }

        var response = new DefectCarrierFigureResponse
        {
            Used = WireMapping.ToWire(ev.Version),
            Study = DefectWireMapping.Info(ev.Record, ev.Study),
            Point = DefectWireMapping.Point(point, ev.Window.Elements),
            Svg = svg,
        };
        response.Warnings.AddRange(ev.Warnings);
        return response;
    }

    private Task<DefectEvaluation> LoadAsync(string dataset, long version, string studyName, long studyVersion, string hostEntryId, ServerCallContext context) =>
        DefectEvaluation.LoadAsync(store, versions, cache, studies, dataset, version, studyName, studyVersion, hostEntryId, context.CancellationToken);
}
