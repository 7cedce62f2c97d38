using Hull.Core.Chemistry;
using Hull.Protos.V1;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Store;
using Hull.Core.Thermo;
using Hull.Server.Mapping;
using ThermoBasis = Hull.Core.Thermo.EnergyBasis;
using WireBasis = Hull.Protos.V1.EnergyBasis;
using DuplicatePolicy = Hull.Store.DuplicatePolicy;

namespace Hull.Server.Validation;

/// <summary>
/// Checks an import request row by row before anything is written, collecting every fault with its field path
/// ("entries[12].formula"), so that one answer lists what to fix. A batch with any fault is refused whole.
/// </summary>
public static class BatchValidation
{
    /// <summary>The rows to store, or an RpcException listing every fault (INVALID_ARGUMENT, or RESOURCE_EXHAUSTED
    /// when the only faults are rows past the component limit).</summary>
    public static (IReadOnlyList<EntryRow> Rows, DuplicatePolicy Policy) Validate(ImportEntriesRequest request, ServiceLimits limits)
    {
        var violations = new List<FieldViolation>();
        if (DatasetName.Check(request.Dataset) is { } nameProblem) violations.Add(new("dataset", nameProblem));
        DuplicatePolicy policy = CheckHeader(request.DuplicatePolicy, request.SourceLabel, request.Note, violations);
        return (CheckRows(request.Entries, limits, violations), policy);
    }

    /// <summary>The session's settings, or INVALID_ARGUMENT listing every fault.</summary>
    public static DuplicatePolicy Validate(BeginImportRequest request)
    {
        var violations = new List<FieldViolation>();
        if (DatasetName.Check(request.Dataset) is { } nameProblem) violations.Add(new("dataset", nameProblem));
        DuplicatePolicy policy = CheckHeader(request.DuplicatePolicy, request.SourceLabel, request.Note, violations);
        if (violations.Count > 0) throw RpcErrors.InvalidArgument(Summarize("the import was not started", violations), violations);
        return policy;
    }

    /// <summary>The rows of one staged batch, checked as an ImportEntries batch is.</summary>
    public static IReadOnlyList<EntryRow> Validate(StageEntriesRequest request, ServiceLimits limits)
    {
        var violations = new List<FieldViolation>();
        if (request.SessionId.Length == 0) violations.Add(new("session_id", "no session id; BeginImport gives one"));
        return CheckRows(request.Entries, limits, violations);
    }

    private static DuplicatePolicy CheckHeader(Protos.V1.DuplicatePolicy wirePolicy, string sourceLabel, string note, List<FieldViolation> violations)
    {
        DuplicatePolicy policy = DuplicatePolicy.Reject;
        switch (wirePolicy)
        {
            case Protos.V1.DuplicatePolicy.Reject: policy = DuplicatePolicy.Reject; break;
            case Protos.V1.DuplicatePolicy.Replace: policy = DuplicatePolicy.Replace; break;
            default:
                violations.Add(new("duplicate_policy", "choose DUPLICATE_POLICY_REJECT or DUPLICATE_POLICY_REPLACE"));
                break;
        }

        if (EntryRules.CheckText(sourceLabel, "source label") is { } labelProblem) violations.Add(new("source_label", labelProblem));
        if (EntryRules.CheckText(note, "note", allowLineBreaks: true) is { } noteProblem) violations.Add(new("note", noteProblem));
        return policy;
    }

    private static IReadOnlyList<EntryRow> CheckRows(IList<Entry> entries, ServiceLimits limits, List<FieldViolation> violations)
    {
        var limitViolations = new List<FieldViolation>();
        if (entries.Count == 0) violations.Add(new("entries", "the batch is empty; an import needs at least one entry"));

        var rows = new List<EntryRow>(entries.Count);
        var firstRowById = new Dictionary<string, int>(entries.Count, StringComparer.Ordinal);
        for (int i = 0; i < entries.Count; i++)
        {
            Entry entry = entries[i];
            string at = $"entries[{i}]";
            int before = violations.Count;

            if (EntryRules.CheckId(entry.Id) is { } idProblem)
            {
                violations.Add(new($"{at}.id", idProblem));
            }
            else if (!firstRowById.TryAdd(entry.Id, i))
            {
                violations.Add(new($"{at}.id", $"id '{entry.Id}' repeats entries[{firstRowById[entry.Id]}]; ids must be unique within a batch"));
            }

            if (!Composition.TryParse(entry.Formula, out Composition? composition, out FormulaParseException? parseError))
            {
                violations.Add(new($"{at}.formula", parseError.Message));
            }
            else if (composition.Elements.Count > limits.MaxComponentsPerSystem)
            {
                limitViolations.Add(new($"{at}.formula",
                    $"'{entry.Formula}' has {composition.Elements.Count} elements; the limit is {limits.MaxComponentsPerSystem} components per chemical system"));
            }

            if (!double.IsFinite(entry.EnergyEv))
            {
                violations.Add(new($"{at}.energy_ev", $"the energy is {Describe(entry.EnergyEv)}; energies must be finite numbers of eV"));
            }

            if (!WireMapping.TryFromWire(entry.Basis, out ThermoBasis basis))
            {
                violations.Add(new($"{at}.basis", BasisProblem(entry.Basis)));
            }
            else if (composition is not null && double.IsFinite(entry.EnergyEv) && FormationRangeProblem(entry.EnergyEv, basis, composition) is { } range)
            {
                violations.Add(new($"{at}.energy_ev", range));
            }

            if (EntryRules.CheckText(entry.Note, "note", allowLineBreaks: true) is { } entryNoteProblem)
            {
                violations.Add(new($"{at}.note", entryNoteProblem));
            }

            if (entry.HasEnergySigmaEvPerAtom && !(double.IsFinite(entry.EnergySigmaEvPerAtom) && entry.EnergySigmaEvPerAtom >= 0))
            {
                violations.Add(new($"{at}.energy_sigma_ev_per_atom",
                    $"the energy uncertainty is {Describe(entry.EnergySigmaEvPerAtom)}; it must be a finite, non-negative number of eV/atom"));
            }

            if (entry.CorrelationGroup.Length > 0 && EntryRules.CheckText(entry.CorrelationGroup, "correlation group") is { } groupProblem)
            {
                violations.Add(new($"{at}.correlation_group", groupProblem));
            }

            if (EntryRules.CheckMethod(entry.Method) is { } methodProblem)
            {
                violations.Add(new($"{at}.method", methodProblem));
            }

            StoredTemperatureModel? model = null;
            if (entry.TemperatureModel is not null && composition is not null && EntryRules.CheckId(entry.Id) is null &&
                !TemperatureModelMapping.TryFromWire(entry.TemperatureModel, entry.Id, composition, out model, out var fault))
            {
                violations.Add(new(fault.Field.Length == 0 ? $"{at}.temperature_model" : $"{at}.temperature_model.{fault.Field}", fault.Problem));
            }

            if (violations.Count == before && violations.Count < RpcErrors.MaxViolationsReported)
            {
                rows.Add(new EntryRow(entry.Id, entry.Formula, entry.EnergyEv, EnergyBasisTokens.ToToken(basis), entry.Note, model,
                    entry.HasEnergySigmaEvPerAtom ? entry.EnergySigmaEvPerAtom : null,
                    entry.CorrelationGroup.Length > 0 ? entry.CorrelationGroup : null,
                    entry.Method.Length > 0 ? entry.Method : null));
            }
        }

        if (violations.Count > 0)
        {
            var all = violations.Concat(limitViolations).ToList();
            throw RpcErrors.InvalidArgument(Summarize("the batch was refused; nothing was written", all), all, ErrorReasons.InvalidEntry);
        }

        if (limitViolations.Count > 0)
        {
            throw RpcErrors.LimitExceeded("max_components_per_system", limits.MaxComponentsPerSystem,
                Summarize("the batch was refused; nothing was written", limitViolations), limitViolations);
        }

        return rows;
    }

    /// <summary>
    /// For a formation energy (per atom, or per formula unit divided by its atoms) outside
    /// <see cref="FormationEnergyRange"/>: what is wrong; null otherwise and for total energies, whose implied
    /// formation energy needs the references (checked against the dataset by the import's reference check).
    /// </summary>
    public static string? FormationRangeProblem(double energyEv, ThermoBasis basis, Composition composition)
    {
        double perAtom = basis switch
        {
            ThermoBasis.FormationPerAtom => energyEv,
            ThermoBasis.FormationPerFormulaUnit => energyEv / composition.AtomsPerFormulaUnit.ToDouble(),
            _ => 0.0,
        };
        return FormationEnergyRange.Contains(perAtom)
            ? null
            : $"{FormationEnergyRange.Describe(perAtom)}; check the number and its energy basis (total energies are given as total_per_atom or total_per_formula_unit)";
    }

    public static string BasisProblem(WireBasis basis) => basis == WireBasis.Unspecified
        ? "the energy basis is not given; say whether the energy is a total or formation energy, per formula unit or per atom"
        : $"{(int)basis} is not a defined energy basis";

    private static string Describe(double value) =>
        double.IsNaN(value) ? "NaN" : double.IsPositiveInfinity(value) ? "+Infinity" : "-Infinity";

    /// <summary>"what: first fault (and N more)".</summary>
    public static string Summarize(string what, IReadOnlyList<FieldViolation> violations)
    {
        FieldViolation first = violations[0];
        string more = violations.Count > 1 ? $" (and {violations.Count - 1} more problem{(violations.Count > 2 ? "s" : string.Empty)})" : string.Empty;
        return $"{what}: {first.Field}: {first.Description}{more}";
    }
}
