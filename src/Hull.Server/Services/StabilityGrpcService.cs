using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Hosting;
using Hull.Server.Mapping;
using Hull.Server.Validation;
using ThermoBasis = Hull.Core.Thermo.EnergyBasis;

namespace Hull.Server.Services;

/// <summary>
/// The stability service: checks each request, resolves the dataset version, takes the needed hulls from the
/// cache and translates the science layer's results. Every answer names the version it used.
/// </summary>
public sealed class StabilityGrpcService(VersionResolver versions, HullCache cache, ServiceLimits limits)
    : StabilityService.StabilityServiceBase
{
    public override async Task<GetEntryStabilityResponse> GetEntryStability(GetEntryStabilityRequest request, ServerCallContext context)
    {
        CheckCount(request.EntryIds.Count, "entry_ids", "entry id");
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        var rows = new int[request.EntryIds.Count];
        for (int i = 0; i < rows.Length; i++)
        {
            if (!snapshot.TryFind(request.EntryIds[i], out rows[i]))
            {
                throw RpcErrors.EntryNotFound(snapshot.Version.Dataset, snapshot.Version.Version, request.EntryIds[i],
                    $"entry '{request.EntryIds[i]}' is not in dataset '{snapshot.Version.Dataset}' version {snapshot.Version.Version}",
                    $"entry_ids[{i}]");
            }
        }

        var response = new GetEntryStabilityResponse { Used = WireMapping.ToWire(snapshot.Version) };
        foreach (int row in rows)
        {
            PhaseEntry entry = snapshot.Entries[row];
            CachedHull hull = await cache.GetHullAsync(snapshot, entry.Composition.Elements, context.CancellationToken);
            response.Results.Add(WireMapping.ToWire(hull.StabilityOf(entry.Id), snapshot.FormulasAsStored[row]));
        }

        return response;
    }

    public override async Task<AssessCandidatesResponse> AssessCandidates(AssessCandidatesRequest request, ServerCallContext context)
    {
        CheckCount(request.Candidates.Count, "candidates", "candidate");
        var compositions = new Composition[request.Candidates.Count];
        var bases = new ThermoBasis[request.Candidates.Count];
        var violations = new List<FieldViolation>();
        for (int i = 0; i < compositions.Length; i++)
        {
            Candidate candidate = request.Candidates[i];
            compositions[i] = ParseFormula(candidate.Formula, $"candidates[{i}].formula", violations)!;
            if (!double.IsFinite(candidate.EnergyEv))
            {
                violations.Add(new($"candidates[{i}].energy_ev", $"the energy is {candidate.EnergyEv}; energies must be finite numbers of eV"));
            }

            if (!WireMapping.TryFromWire(candidate.Basis, out bases[i]))
            {
                violations.Add(new($"candidates[{i}].basis", BatchValidation.BasisProblem(candidate.Basis)));
            }

            if (EntryRules.CheckText(candidate.Label, "label") is { } labelProblem) violations.Add(new($"candidates[{i}].label", labelProblem));
        }

        ThrowIfAny(violations);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        var response = new AssessCandidatesResponse { Used = WireMapping.ToWire(snapshot.Version) };
        for (int i = 0; i < compositions.Length; i++)
        {
            Candidate candidate = request.Candidates[i];
            CachedHull hull = await cache.GetHullAsync(snapshot, compositions[i].Elements, context.CancellationToken);
            double formation = FormationEnergyOf(candidate, compositions[i], bases[i], hull.Hull, i);
            CandidateStability assessed = hull.Hull.Assess(compositions[i], formation);
            response.Results.Add(new CandidateAssessment
            {
                Label = candidate.Label,
                Formula = candidate.Formula,
                ChemicalSystem = hull.Hull.SystemName,
                FormationEnergyEvPerAtom = assessed.FormationEnergyEvPerAtom,
                EnergyRelativeToHullEvPerAtom = assessed.EnergyRelativeToHullEvPerAtom,
                EnergyAboveHullEvPerAtom = assessed.EnergyAboveHullEvPerAtom,
                IsOnOrBelowHull = assessed.IsOnOrBelowHull,
                Decomposition = WireMapping.ToWire(assessed.Decomposition),
            });
        }

        return response;
    }

    public override async Task<GetHullEnergiesResponse> GetHullEnergies(GetHullEnergiesRequest request, ServerCallContext context)
    {
        CheckCount(request.Formulas.Count, "formulas", "formula");
        var violations = new List<FieldViolation>();
        Composition?[] compositions = request.Formulas.Select((f, i) => ParseFormula(f, $"formulas[{i}]", violations)).ToArray();
        ThrowIfAny(violations);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        var response = new GetHullEnergiesResponse { Used = WireMapping.ToWire(snapshot.Version) };
        for (int i = 0; i < compositions.Length; i++)
        {
            Composition composition = compositions[i]!;
            CachedHull hull = await cache.GetHullAsync(snapshot, composition.Elements, context.CancellationToken);
            Core.Thermo.Decomposition decomposition = hull.Hull.DecompositionAt(composition);
            response.Results.Add(new HullEnergyResult
            {
                Formula = request.Formulas[i],
                ChemicalSystem = hull.Hull.SystemName,
                HullEnergyEvPerAtom = decomposition.HullEnergyEvPerAtom,
                Decomposition = WireMapping.ToWire(decomposition),
            });
        }

        return response;
    }

    public override async Task<GetStablePhasesResponse> GetStablePhases(GetStablePhasesRequest request, ServerCallContext context)
    {
        IReadOnlyList<string>? elements = request.ChemicalSystem.Length == 0
            ? null
            : ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        IReadOnlyList<IReadOnlyList<string>> systems = elements is null ? snapshot.MaximalSystems : [elements];
        var phases = new SortedDictionary<string, HullPhase>(StringComparer.Ordinal);
        foreach (IReadOnlyList<string> system in systems)
        {
            CachedHull hull = await cache.GetHullAsync(snapshot, system, context.CancellationToken);
            foreach (HullPhase phase in hull.Hull.StablePhases) phases.TryAdd(phase.Id, phase);
        }

        var response = new GetStablePhasesResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            ChemicalSystem = elements is null ? string.Empty : string.Join('-', elements),
        };
        response.Phases.AddRange(phases.Values.Select(WireMapping.ToWire));
        return response;
    }

    public override async Task<GetHullFacetsResponse> GetHullFacets(GetHullFacetsRequest request, ServerCallContext context)
    {
        IReadOnlyList<string> elements = ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        CachedHull hull = await cache.GetHullAsync(snapshot, elements, context.CancellationToken);
        var response = new GetHullFacetsResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            ChemicalSystem = hull.Hull.SystemName,
        };
        response.Components.AddRange(hull.Hull.Components);
        response.Facets.AddRange(hull.Hull.Facets.Select(WireMapping.ToWire));
        response.TieLines.AddRange(hull.Hull.TieLines.Select(WireMapping.ToWire));
        response.StablePhases.AddRange(hull.Hull.StablePhases.Select(WireMapping.ToWire));
        return response;
    }

    public override async Task AnalyzeDataset(AnalyzeDatasetRequest request, IServerStreamWriter<AnalyzeDatasetResponse> responseStream, ServerCallContext context)
    {
        int pageSize = DatasetGrpcService.PageSize(request.PageSize, "page_size");
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        DatasetStabilityResult analysis = await cache.GetAnalysisAsync(snapshot, context.CancellationToken);
        VersionUsed used = WireMapping.ToWire(snapshot.Version);
        int count = analysis.Entries.Count;
        int start = 0;
        do
        {
            var message = new AnalyzeDatasetResponse { Used = used, EntryCount = count };
            if (start == 0)
            {
                message.HullSystems.AddRange(analysis.HullSystems);
                message.References.AddRange(analysis.References.Select(WireMapping.ToWire));
            }

            for (int row = start; row < Math.Min(count, start + pageSize); row++)
            {
                message.Results.Add(WireMapping.ToWire(analysis.Entries[row], snapshot.FormulasAsStored[row]));
            }

            await responseStream.WriteAsync(message, context.CancellationToken);
            start += pageSize;
        }
        while (start < count);
    }

    private async Task<VersionSnapshot> SnapshotAsync(string dataset, long version, ServerCallContext context)
    {
        VersionRef resolved = versions.Resolve(dataset, version);
        return await cache.GetSnapshotAsync(resolved, context.CancellationToken);
    }

    private void CheckCount(int count, string field, string what)
    {
        if (count == 0) throw RpcErrors.InvalidArgument(field, $"no {what} given; send at least one");
        if (count > limits.MaxCompositionsPerRequest)
        {
            string message = $"{count} {what}s in one request; the limit is {limits.MaxCompositionsPerRequest} compositions per request";
            throw RpcErrors.LimitExceeded("max_compositions_per_request", limits.MaxCompositionsPerRequest, message, [new FieldViolation(field, message)]);
        }
    }

    private Composition? ParseFormula(string formula, string field, List<FieldViolation> violations)
    {
        if (!Composition.TryParse(formula, out Composition? composition, out FormulaParseException? error))
        {
            violations.Add(new(field, error.Message));
            return null;
        }

        if (composition.Elements.Count > limits.MaxComponentsPerSystem)
        {
            string message = $"'{formula}' has {composition.Elements.Count} elements; the limit is {limits.MaxComponentsPerSystem} components per chemical system";
            throw RpcErrors.LimitExceeded("max_components_per_system", limits.MaxComponentsPerSystem, message, [new FieldViolation(field, message)]);
        }

        return composition;
    }

    private static void ThrowIfAny(List<FieldViolation> violations)
    {
        if (violations.Count > 0)
        {
            throw RpcErrors.InvalidArgument(BatchValidation.Summarize("the request was refused", violations), violations);
        }
    }

    /// <summary>
    /// The candidate's formation energy per atom. A total energy needs the elemental references of the version's
    /// hull: the lowest pure-element total energies per atom; an element without one is FAILED_PRECONDITION.
    /// </summary>
    private static double FormationEnergyOf(Candidate candidate, Composition composition, ThermoBasis basis, SystemHull hull, int index)
    {
        string id = candidate.Label.Length > 0 ? candidate.Label : $"candidates[{index}]";
        var entry = new PhaseEntry(id, composition, candidate.EnergyEv, basis);
        if (!entry.IsTotalEnergy)
        {
            return FormationEnergies.Compute([entry]).FormationEnergiesEvPerAtom[0];
        }

        foreach (string element in composition.Elements)
        {
            if (!hull.References.Any(r => string.Equals(r.Symbol, element, StringComparison.Ordinal)))
            {
                throw RpcErrors.MissingElementalReference(element,
                    $"candidates[{index}] ({candidate.Formula}) is a total energy, but the dataset has no total-energy entry of pure {element} " +
                    "to serve as its elemental reference (missing elemental reference)",
                    [new FieldViolation($"candidates[{index}].basis", $"missing elemental reference for {element}")]);
            }
        }

        var references = new ElementalReferences(hull.References.Select(r => KeyValuePair.Create(r.Symbol, r.TotalEnergyEvPerAtom)));
        return FormationEnergies.Compute([entry], references).FormationEnergiesEvPerAtom[0];
    }
}
