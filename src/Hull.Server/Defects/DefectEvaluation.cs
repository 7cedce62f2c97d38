using System.Globalization;
using Hull.Core.Chemistry;
using Hull.Core.Defects;
using Hull.Core.Defects.Conditions;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Gases;
using Hull.Core.Windows;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Store;
using CoreWindow = Hull.Core.Windows.StabilityWindow;
using DefectConditionPoint = Hull.Core.Defects.Conditions.DefectConditionPoint;
using ElementReference = Hull.Core.Thermo.ElementReference;
using EntryStability = Hull.Core.Thermo.EntryStability;

namespace Hull.Server.Defects;

/// <summary>
/// A stored study read against one dataset version: the host's hull, entry and window, the elemental references
/// of every element a defect exchanges, the dopants' extended hulls, and the warnings every answer repeats. Built
/// per call from the cache; the science is Core's.
/// </summary>
public sealed class DefectEvaluation
{
    private DefectEvaluation(
        VersionRef version, DefectStudyRecord record, DefectStudy study, SystemHull hostHull, EntryStability host, CoreWindow window,
        IReadOnlyDictionary<string, double> references, IReadOnlyDictionary<string, SystemHull> dopantHulls, List<string> warnings)
    {
        Version = version;
        Record = record;
        Study = study;
        HostHull = hostHull;
        Host = host;
        Window = window;
        References = references;
        DopantHulls = dopantHulls;
        Warnings = warnings;
    }

    public VersionRef Version { get; }

    public DefectStudyRecord Record { get; }

    public DefectStudy Study { get; }

    public SystemHull HostHull { get; }

    public EntryStability Host { get; }

    public CoreWindow Window { get; }

    /// <summary>μ_i^ref (total energy per atom) of the host's elements and every dopant.</summary>
    public IReadOnlyDictionary<string, double> References { get; }

    /// <summary>Per dopant, the hull over the host's elements and it.</summary>
    public IReadOnlyDictionary<string, SystemHull> DopantHulls { get; }

    /// <summary>Doubts every answer carries (bulk against the dataset, alignment), then the call's own.</summary>
    public List<string> Warnings { get; }

    /// <summary>Reads the study version and sets it against the dataset version.</summary>
    public static async Task<DefectEvaluation> LoadAsync(
        IDatasetStore store, VersionResolver versions, HullCache cache, DefectStudyCache studies, string dataset, long version, string studyName,
        long studyVersion, string hostEntryId, CancellationToken cancellation)
    {
        if (studyVersion < 0) throw RpcErrors.InvalidArgument("study_version", $"study version {studyVersion} is negative; versions count from 1 and 0 means the latest");
        DefectStudyRecord record = Stored(() => store.GetDefectStudy(dataset, studyName, studyVersion == 0 ? null : studyVersion));
        DefectStudy study;
        try
        {
            study = studies.Get(record.ContentSha256, record.StudyJson, record.ChargeStatesCsv);
        }
        catch (DefectInputException e)
        {
            throw RpcErrors.FailedPrecondition($"stored defect study '{studyName}' version {record.Version} can no longer be read: {e.Message}",
                ErrorReasons.DatasetNotAnalysable, $"study:{studyName}");
        }

        VersionRef resolved = versions.Resolve(dataset, version);
        return await AgainstAsync(cache, resolved, record, study, hostEntryId, cancellation);
    }

    /// <summary>A study (stored or about to be) against a dataset version.</summary>
    /// <remarks>With <c>requireWindow</c> false (a study being imported), a host without a window is a warning, not an error.</remarks>
    public static async Task<DefectEvaluation> AgainstAsync(
        HullCache cache, VersionRef resolved, DefectStudyRecord record, DefectStudy study, string hostEntryId, CancellationToken cancellation,
        bool requireWindow = true)
    {
        VersionSnapshot snapshot = await cache.GetSnapshotAsync(resolved, cancellation);
        string where = $"dataset '{resolved.Dataset}' version {resolved.Version}";
        string[] hostElements = [.. study.Host.Elements.Order(StringComparer.Ordinal)];
        SystemHull hostHull = (await Hull(cache, snapshot, hostElements, cancellation)).Hull;
        EntryStability host = FindHost(hostHull, study.Host, hostEntryId, where);

        var references = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (ElementReference r in hostHull.References) references[r.Symbol] = r.TotalEnergyEvPerAtom;
        var dopantHulls = new Dictionary<string, SystemHull>(StringComparer.Ordinal);
        foreach (string dopant in study.Defects.SelectMany(d => d.AtomsExchanged.Keys).Where(e => !study.Host.Contains(e)).Distinct().Order(StringComparer.Ordinal))
        {
            SystemHull extended = (await Hull(cache, snapshot, [.. hostElements.Append(dopant).Order(StringComparer.Ordinal)], cancellation)).Hull;
            dopantHulls[dopant] = extended;
            foreach (ElementReference r in extended.References) references.TryAdd(r.Symbol, r.TotalEnergyEvPerAtom);
        }

        foreach (Defect defect in study.Defects)
        {
            foreach (string element in defect.AtomsExchanged.Keys.Where(e => !references.ContainsKey(e)))
            {
                string role = study.Host.Contains(element) ? "host element" : "dopant";
                throw RpcErrors.MissingElementalReference(element,
                    $"defect '{defect.Name}' exchanges the {role} {element}, but {where} has no elemental reference (total energy per atom) for {element}: import a pure-{element} entry with a total energy first");
            }
        }

        foreach (string element in hostElements.Where(e => !references.ContainsKey(e)))
        {
            throw RpcErrors.MissingElementalReference(element, $"the host element {element} has no elemental reference (total energy per atom) in {where}");
        }

        var warnings = new List<string>(study.Warnings);
        if (host.FormationEnergyEvPerAtom is double formation)
        {
            double datasetPerFormulaUnit = DatasetHostEnergy.PerFormulaUnitEv(study.Host, formation, references);
            if (study.CompareWithDatasetHost(datasetPerFormulaUnit) is { } mismatch) warnings.Insert(0, $"{mismatch} (entry '{host.Id}')");
        }

        CoreWindow window = StabilityWindows.Of(hostHull, host.Id);
        if (!window.Exists)
        {
            string noWindow = string.Create(CultureInfo.InvariantCulture,
                $"the host {study.Host.Formula} (entry '{host.Id}') is {host.EnergyAboveHullEvPerAtom:0.######} eV/atom above the hull of {hostHull.SystemName} in {where}: it has no stability window, so no chemical-potential point to evaluate defects at");
            if (requireWindow) throw RpcErrors.FailedPrecondition(noWindow, ErrorReasons.PreconditionFailed, $"entry:{host.Id}");
            warnings.Add(noWindow);
        }

        return new DefectEvaluation(resolved, record, study, hostHull, host, window, references, dopantHulls, warnings);
    }

    /// <summary>The study file's carrier block; FAILED_PRECONDITION naming what is missing when the file has none.</summary>
    public StudyCarriers Carriers()
    {
        StudyCarriers? carriers;
        try
        {
            carriers = DefectStudyFile.ReadCarriers(Record.StudyJson);
        }
        catch (DefectInputException e)
        {
            throw RpcErrors.FailedPrecondition($"the carriers block of defect study '{Record.StudyName}' version {Record.Version} can no longer be read: {e.Field}: {e.Reason}",
                ErrorReasons.DatasetNotAnalysable, $"study:{Record.StudyName}");
        }

        return carriers ?? throw RpcErrors.FailedPrecondition(
            $"defect study '{Record.StudyName}' version {Record.Version} has no \"carriers\" block, which carrier statistics need: import a new version whose study_json adds "
            + "\"carriers\" with the bands (conduction_states_300k_per_cm3 and valence_states_300k_per_cm3, electron_mass_ratio and hole_mass_ratio, or density_of_states)",
            ErrorReasons.PreconditionFailed, $"study:{Record.StudyName}");
    }

    /// <summary>The points of <paramref name="conditions"/> (every window vertex when null or empty), and the gas answer for gas conditions.</summary>
    public (IReadOnlyList<DefectConditionPoint> Points, DefectGasPoint? Gas) Points(DefectConditions? conditions)
    {
        var which = conditions?.WhichCase ?? DefectConditions.WhichOneofCase.None;
        IReadOnlyList<DefectConditionPoint> vertices() => DefectConditionPoints.AtVertices(Window, DopantHulls);
        switch (which)
        {
            case DefectConditions.WhichOneofCase.None:
            case DefectConditions.WhichOneofCase.AllVertices:
                return (vertices(), null);
            case DefectConditions.WhichOneofCase.Vertex:
                return ([Core(() => DefectConditionPoints.Select(vertices(), conditions!.Vertex))], null);
            case DefectConditions.WhichOneofCase.Point:
                var given = new Dictionary<string, double>(StringComparer.Ordinal);
                for (int i = 0; i < conditions!.Point.Potentials.Count; i++)
                {
                    DefectElementPotential p = conditions.Point.Potentials[i];
                    if (!ElementTable.IsSymbol(p.Element)) throw RpcErrors.InvalidArgument($"conditions.point.potentials[{i}].element", $"'{p.Element}' is not an element symbol");
                    if (!given.TryAdd(p.Element, p.DeltaMuEv)) throw RpcErrors.InvalidArgument($"conditions.point.potentials[{i}].element", $"{p.Element} is given twice");
                }

                return ([Core(() => DefectConditionPoints.Given(Window, HostHull, given, DopantHulls, Warnings))], null);
            default:
                return AtGas(conditions!.Gas);
        }
    }

    /// <summary>One point: the conditions' first (default: the window's first vertex), with a warning when there were more.</summary>
    public (DefectConditionPoint Point, DefectGasPoint? Gas) SinglePoint(DefectConditions? conditions)
    {
        var which = conditions?.WhichCase ?? DefectConditions.WhichOneofCase.None;
        (IReadOnlyList<DefectConditionPoint> points, DefectGasPoint? gas) = Points(conditions);
        if (points.Count > 1 && which != DefectConditions.WhichOneofCase.None)
        {
            Warnings.Add($"the conditions give {points.Count} points; this answer uses the first ({points[0].Label}): name one vertex to choose");
        }

        return (points[0], gas);
    }

    private (IReadOnlyList<DefectConditionPoint>, DefectGasPoint) AtGas(DefectGasConditions gas)
    {
        if (!GasTables.TryGet(gas.Gas, out GasSpecies species))
        {
            throw RpcErrors.InvalidArgument("conditions.gas.gas", $"'{gas.Gas}' is not a gas with tables here; choose one of {string.Join(", ", GasTables.All.Select(g => g.Formula))}");
        }

        string element = species.Element;
        bool inHost = Study.Host.Contains(element);
        if (!inHost && !Study.Defects.Any(d => d.AtomsExchanged.ContainsKey(element)))
        {
            throw RpcErrors.InvalidArgument("conditions.gas.gas", $"{species.Formula} fixes Δμ({element}), but neither the host {Study.Host.Formula} nor any defect of the study has {element}");
        }

        double reference = References[element];
        GasReference gasReference;
        try
        {
            gasReference = gas.Reference == DefectGasReference.ComputedMolecule
                ? GasReference.ComputedMolecule(gas.MoleculeEnergyEv, gas.ZeroPointEnergyEv)
                : GasReference.FittedElementalReference(reference, species);
        }
        catch (ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument("conditions.gas.molecule_energy_ev", e.Message);
        }

        if (!double.IsFinite(gas.PressureBar) || gas.PressureBar <= 0)
        {
            throw RpcErrors.InvalidArgument("conditions.gas.pressure_bar", string.Create(CultureInfo.InvariantCulture,
                $"the pressure of {species.Formula} must be a positive number of bar, not {gas.PressureBar}"));
        }

        ChemicalPotentialShift shift;
        try
        {
            shift = new GasReservoir(species, gasReference).Shift(gas.TemperatureK, gas.PressureBar, reference);
        }
        catch (ThermoInputException e)
        {
            // The pressure and the reference are checked above, so what is left is the temperature.
            throw RpcErrors.InvalidArgument("conditions.gas.temperature_k", e.Message);
        }

        var answer = new DefectGasPoint
        {
            Element = element, TemperatureK = gas.TemperatureK, PressureBar = gas.PressureBar,
            DeltaMuEv = shift.DeltaMuEvPerAtom, ZeroPointOffsetEv = shift.ZeroPointOffsetEvPerAtom,
        };
        string text = string.Create(CultureInfo.InvariantCulture, $"{species.Formula} at {gas.TemperatureK:0.##} K, {gas.PressureBar:G4} bar");
        var dopants = DopantHulls.Where(p => p.Key != element).ToDictionary(p => p.Key, p => p.Value, StringComparer.Ordinal);
        if (!inHost)
        {
            var fixedOutside = new Dictionary<string, double>(StringComparer.Ordinal) { [element] = shift.DeltaMuEvPerAtom };
            return (DefectConditionPoints.AtVertices(Window, dopants, fixedOutside, text), answer);
        }

        var fixedPotential = new Dictionary<string, double>(StringComparer.Ordinal) { [element] = shift.DeltaMuEvPerAtom };
        WindowSlice slice = StabilityWindows.Slice(HostHull, Host.Id, fixedPotential, allowAboveReference: true);
        if (slice.Misses)
        {
            string nearest = string.Join(", ", slice.Whole.Elements.Select((e, i) => string.Create(CultureInfo.InvariantCulture, $"Δμ({e}) = {slice.NearestPointEv![i]:0.####} eV")));
            throw RpcErrors.FailedPrecondition(string.Create(CultureInfo.InvariantCulture,
                $"{Study.Host.Formula} is not stable with {text} (Δμ({element}) = {shift.DeltaMuEvPerAtom:0.####} eV): the window's nearest point is {nearest}, {slice.DistanceEv:0.####} eV away"),
                ErrorReasons.PreconditionFailed, $"entry:{Host.Id}");
        }

        return (DefectConditionPoints.AtVertices(slice.Slice, dopants, conditionText: text), answer);
    }

    /// <summary>The defects a call asks for (all when <paramref name="names"/> is empty), in study order.</summary>
    public IReadOnlyList<Defect> Select(IReadOnlyList<string> names, string field = "defects")
    {
        if (names.Count == 0) return Study.Defects;
        for (int i = 0; i < names.Count; i++)
        {
            if (Study.Find(names[i]) is null)
            {
                throw RpcErrors.InvalidArgument($"{field}[{i}]", $"the study has no defect '{names[i]}'; its defects are {string.Join(", ", Study.Defects.Select(d => d.Name))}");
            }
        }

        return [.. Study.Defects.Where(d => names.Contains(d.Name, StringComparer.Ordinal))];
    }

    /// <summary>The calculator at one point; an element without Δμ or reference is INVALID_ARGUMENT naming it.</summary>
    public FormationEnergyCalculator Calculator(DefectConditionPoint point) =>
        Core(() => new FormationEnergyCalculator(Study, References, point.Point));

    /// <summary>Runs a Core call, turning its input errors into INVALID_ARGUMENT on their field.</summary>
    public static T Core<T>(Func<T> call)
    {
        try
        {
            return call();
        }
        catch (DefectInputException e)
        {
            throw RpcErrors.InvalidArgument(e.Field, e.Reason);
        }
    }

    /// <summary>Runs a Store call, turning a missing study into NOT_FOUND.</summary>
    public static T Stored<T>(Func<T> call)
    {
        try
        {
            return call();
        }
        catch (DefectStudyNotFoundException e)
        {
            throw RpcErrors.NotFound(e.Message, e.Version is null ? "study_name" : "study_version", ErrorReasons.ResourceNotFound);
        }
        catch (InvalidBatchException e) when (e.Field is "study_name" or "study_json" or "charge_states_csv")
        {
            throw RpcErrors.InvalidArgument(e.Field, e.Message);
        }
    }

    private static EntryStability FindHost(SystemHull hull, Composition host, string hostEntryId, string where)
    {
        if (hostEntryId.Length > 0)
        {
            EntryStability? byId = hull.Entries.FirstOrDefault(e => e.Id == hostEntryId);
            if (byId is null) throw RpcErrors.NotFound($"entry '{hostEntryId}' is not an entry of {hull.SystemName} in {where}", "host_entry_id", ErrorReasons.EntryNotFound);
            if (!byId.Composition.HasSameProportions(host))
            {
                throw RpcErrors.InvalidArgument("host_entry_id", $"entry '{hostEntryId}' is {byId.Composition.Formula}, not the study's host {host.Formula}");
            }

            return byId;
        }

        return hull.Entries
            .Where(e => e.Composition.HasSameProportions(host))
            .OrderBy(e => e.FormationEnergyEvPerAtom)
            .ThenBy(e => e.Id, StringComparer.Ordinal)
            .FirstOrDefault()
            ?? throw RpcErrors.FailedPrecondition($"{where} has no entry of the study's host {host.Formula}: import the host's entry first",
                ErrorReasons.PreconditionFailed, $"formula:{host.Formula}");
    }

    private static async Task<CachedHull> Hull(HullCache cache, VersionSnapshot snapshot, string[] elements, CancellationToken cancellation)
    {
        try
        {
            return await cache.GetHullAsync(snapshot, elements, cancellation);
        }
        catch (ThermoInputException e) when (e.Element is not null)
        {
            throw RpcErrors.MissingElementalReference(e.Element,
                $"the hull of {string.Join('-', elements)} cannot be built (missing elemental reference for {e.Element}): {e.Message}");
        }
    }
}
