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
public sealed class StabilityGrpcService(VersionResolver versions, HullCache cache, ServiceLimits limits, Orleans.IGrainFactory? grains = null,
    Microsoft.Extensions.Logging.ILogger<StabilityGrpcService>? logger = null)
    : StabilityService.StabilityServiceBase
{
    public override async Task<GetEntryStabilityResponse> GetEntryStability(GetEntryStabilityRequest request, ServerCallContext context)
    {
        CheckCount(request.EntryIds.Count, "entry_ids", "entry id");
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        int[] rows = StabilityAnswers.RowsOf(request, snapshot);
        var response = new GetEntryStabilityResponse { Used = WireMapping.ToWire(snapshot.Version) };
        EndMemberBasis? basis = EndMemberList.Read(request.EndMembers, snapshot, "end_members");
        if (basis is not null)
        {
            CachedHull pseudo = await cache.GetEndMemberHullAsync(snapshot, basis, context.CancellationToken, references);
            for (int i = 0; i < rows.Length; i++)
            {
                if (!pseudo.TryStabilityOf(request.EntryIds[i], out Core.Thermo.EntryStability stability))
                {
                    throw RpcErrors.WithViolations(StatusCode.FailedPrecondition,
                        $"entry '{request.EntryIds[i]}' ({snapshot.FormulasAsStored[rows[i]]}) is not a non-negative combination of the end-members {pseudo.Hull.SystemName}",
                        [new FieldViolation($"entry_ids[{i}]", "not on the end-members' hull")]);
                }

                response.Results.Add(WireMapping.ToWire(stability, snapshot.FormulasAsStored[rows[i]]));
            }

            response.Coverage.Add(WireMapping.ToWire(pseudo.Hull.Coverage));
            response.References.AddRange(pseudo.Hull.References.Select(WireMapping.ToWire));
            return response;
        }

        if (grains is not null && await Cluster.ClusteredStability.EntryStabilityAsync(grains, request, snapshot, rows, references, logger, context.CancellationToken) is { } clustered)
        {
            return clustered;
        }

        return await StabilityAnswers.EntryStabilityAsync(request, snapshot, rows, Hulls(snapshot, references, context));
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

            if (WireMapping.TryFromWire(candidate.Basis, out bases[i]))
            {
                if (compositions[i] is not null && double.IsFinite(candidate.EnergyEv) && BatchValidation.FormationRangeProblem(candidate.EnergyEv, bases[i], compositions[i]) is { } range)
                {
                    violations.Add(new($"candidates[{i}].energy_ev", range));
                }
            }
            else
            {
                violations.Add(new($"candidates[{i}].basis", BatchValidation.BasisProblem(candidate.Basis)));
            }

            if (EntryRules.CheckText(candidate.Label, "label") is { } labelProblem) violations.Add(new($"candidates[{i}].label", labelProblem));
        }

        ThrowIfAny(violations);
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        if (grains is not null &&
            await Cluster.ClusteredStability.AssessCandidatesAsync(grains, request, compositions, snapshot, references, logger, context.CancellationToken) is { } clustered)
        {
            return clustered;
        }

        return await StabilityAnswers.AssessCandidatesAsync(request, compositions, bases, snapshot, references, Hulls(snapshot, references, context));
    }

    public override async Task<GetHullEnergiesResponse> GetHullEnergies(GetHullEnergiesRequest request, ServerCallContext context)
    {
        CheckCount(request.Formulas.Count, "formulas", "formula");
        var violations = new List<FieldViolation>();
        Composition?[] compositions = request.Formulas.Select((f, i) => ParseFormula(f, $"formulas[{i}]", violations)).ToArray();
        ThrowIfAny(violations);
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        if (grains is null)
        {
            return (await HullEnergies.AnswerAsync(request, compositions!, references, snapshot, cache, null, context.CancellationToken)).Response;
        }

        return await Cluster.ClusteredHullEnergies.AnswerAsync(grains, cache, request, compositions!, snapshot, references, logger, context.CancellationToken);
    }

    public override async Task<GetStablePhasesResponse> GetStablePhases(GetStablePhasesRequest request, ServerCallContext context)
    {
        IReadOnlyList<string>? elements = request.ChemicalSystem.Length == 0
            ? null
            : ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        if (await EndMemberHullAsync(request.EndMembers, request.ChemicalSystem, snapshot, references, context) is { } pseudo)
        {
            var onEndMembers = new GetStablePhasesResponse { Used = WireMapping.ToWire(snapshot.Version), ChemicalSystem = pseudo.Hull.SystemName };
            onEndMembers.Phases.AddRange(pseudo.Hull.StablePhases.Select(WireMapping.ToWire));
            onEndMembers.Coverage.Add(WireMapping.ToWire(pseudo.Hull.Coverage));
            onEndMembers.References.AddRange(pseudo.Hull.References.Select(WireMapping.ToWire));
            return onEndMembers;
        }

        if (elements is not null)
        {
            if (grains is not null &&
                await Cluster.ClusteredStability.StablePhasesAsync(grains, request, elements, snapshot, references, logger, context.CancellationToken) is { } clustered)
            {
                return clustered;
            }

            return StabilityAnswers.StablePhases(snapshot, elements, await cache.GetHullAsync(snapshot, elements, context.CancellationToken, references));
        }

        var response = new GetStablePhasesResponse { Used = WireMapping.ToWire(snapshot.Version), ChemicalSystem = string.Empty };

        // The whole dataset from its analysis: a vertex is a vertex in every hull that holds it, and the synthetic
        // corners are the elements no hull system has an entry of. A system that cannot be analysed is reported, not
        // fatal.
        DatasetStabilityResult analysis = await cache.GetAnalysisAsync(snapshot, context.CancellationToken, references);
        response.Phases.AddRange(StablePhaseUnion.Of(analysis).Select(WireMapping.ToWire));
        response.Coverage.AddRange(analysis.Coverage.Select(WireMapping.ToWire));
        response.References.AddRange(analysis.References.Select(WireMapping.ToWire));
        response.SystemProblems.AddRange(analysis.Problems.Select(WireMapping.ToWire));
        return response;
    }

    public override async Task<GetHullFacetsResponse> GetHullFacets(GetHullFacetsRequest request, ServerCallContext context)
    {
        IReadOnlyList<string>? elements = request.EndMembers.Count > 0 ? null : ChemicalSystemText.Parse(request.ChemicalSystem, "chemical_system");
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        if (await EndMemberHullAsync(request.EndMembers, request.ChemicalSystem, snapshot, references, context) is { } pseudo)
        {
            return StabilityAnswers.Facets(snapshot, pseudo);
        }

        if (grains is not null &&
            await Cluster.ClusteredStability.FacetsAsync(grains, request, elements!, snapshot, references, logger, context.CancellationToken) is { } clustered)
        {
            return clustered;
        }

        return StabilityAnswers.Facets(snapshot, await cache.GetHullAsync(snapshot, elements!, context.CancellationToken, references));
    }

    public override async Task AnalyzeDataset(AnalyzeDatasetRequest request, IServerStreamWriter<AnalyzeDatasetResponse> responseStream, ServerCallContext context)
    {
        int pageSize = DatasetGrpcService.PageSize(request.PageSize, "page_size");
        ElementalReferenceList references = ElementalReferenceList.Parse(request.ElementalReferences);
        VersionSnapshot snapshot = await SnapshotAsync(request.Dataset, request.Version, context);
        DatasetStabilityResult analysis = await cache.GetAnalysisAsync(snapshot, context.CancellationToken, references);
        VersionUsed used = WireMapping.ToWire(snapshot.Version);
        int count = analysis.Entries.Count;
        long unanswered = analysis.Problems.Sum(p => (long)p.UnansweredEntryIds.Count);
        var coverageBySystem = analysis.Coverage.ToDictionary(c => c.HullSystem, StringComparer.Ordinal);
        var coverageSent = new HashSet<string>(StringComparer.Ordinal);
        int start = 0;
        do
        {
            var message = new AnalyzeDatasetResponse { Used = used, EntryCount = count, UnansweredEntryCount = unanswered };
            if (start == 0)
            {
                message.HullSystems.AddRange(analysis.HullSystems);
                message.References.AddRange(analysis.References.Select(WireMapping.ToWire));
                message.SystemProblems.AddRange(analysis.Problems.Select(WireMapping.ToWire));
            }

            for (int k = start; k < Math.Min(count, start + pageSize); k++)
            {
                Core.Thermo.EntryStability entry = analysis.Entries[k];
                message.Results.Add(WireMapping.ToWire(entry, snapshot.FormulasAsStored[entry.RowIndex]));
                // Once per hull system, in the message with its first result.
                if (coverageSent.Add(entry.HullSystem) && coverageBySystem.TryGetValue(entry.HullSystem, out Core.Thermo.SystemCoverage? coverage))
                {
                    message.Coverage.Add(WireMapping.ToWire(coverage));
                }
            }

            await responseStream.WriteAsync(message, context.CancellationToken);
            start += pageSize;
        }
        while (start < count);
    }

    /// <summary>The hull over the request's end-members, or null when it names none.</summary>
    private async Task<CachedHull?> EndMemberHullAsync(IReadOnlyList<EndMember> endMembers, string chemicalSystem,
        VersionSnapshot snapshot, ElementalReferenceList references, ServerCallContext context)
    {
        if (endMembers.Count == 0) return null;
        if (chemicalSystem.Length > 0)
        {
            throw RpcErrors.InvalidArgument("chemical_system",
                $"give either chemical_system ('{chemicalSystem}') or end_members, not both: the end-members define the hull's components");
        }

        EndMemberBasis basis = EndMemberList.Read(endMembers, snapshot, "end_members")!;
        return await cache.GetEndMemberHullAsync(snapshot, basis, context.CancellationToken, references);
    }

    private async Task<VersionSnapshot> SnapshotAsync(string dataset, long version, ServerCallContext context)
    {
        VersionRef resolved = versions.Resolve(dataset, version);
        return await cache.GetSnapshotAsync(resolved, context.CancellationToken);
    }

    /// <summary>This server's hulls of the call's version, from its own cache.</summary>
    private SystemHullSource Hulls(VersionSnapshot snapshot, ElementalReferenceList references, ServerCallContext context) =>
        elements => cache.GetHullAsync(snapshot, elements, context.CancellationToken, references);

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
    /// The hull systems and references an answer used, for its coverage and reference lists (each sorted by name,
    /// the first reference of a symbol kept). Most answers use one hull and no reference of their own: those take the
    /// hull's ready wire lists without building anything.
    /// </summary>
    internal sealed class HullsUsed
    {
        private CachedHull? _only;
        private SortedDictionary<string, Protos.V1.SystemCoverage>? _coverage;
        private SortedDictionary<string, Protos.V1.ElementReference>? _references;

        public void Add(CachedHull hull)
        {
            if (_only is null && _coverage is null)
            {
                _only = hull;
                return;
            }

            if (ReferenceEquals(hull, _only)) return;
            Spread();
            _coverage!.TryAdd(hull.Hull.SystemName, hull.WireCoverage);
            foreach ((string symbol, Protos.V1.ElementReference reference) in hull.WireReferences) _references!.TryAdd(symbol, reference);
        }

        public void AddReference(Core.Thermo.ElementReference reference)
        {
            Spread();
            if (!_references!.ContainsKey(reference.Symbol)) _references.Add(reference.Symbol, WireMapping.ToWire(reference));
        }

        /// <summary>Coverage and references as another server's answer carried them (a cluster member's part of a request).</summary>
        public void Add(IEnumerable<Protos.V1.SystemCoverage> coverage, IEnumerable<Protos.V1.ElementReference> references)
        {
            Spread();
            foreach (Protos.V1.SystemCoverage c in coverage) _coverage!.TryAdd(c.ChemicalSystem, c);
            foreach (Protos.V1.ElementReference r in references) _references!.TryAdd(r.Symbol, r);
        }

        public IEnumerable<Protos.V1.SystemCoverage> Coverage =>
            _coverage is not null ? _coverage.Values : _only is null ? [] : [_only.WireCoverage];

        public IEnumerable<Protos.V1.ElementReference> References =>
            _references is not null ? _references.Values : _only is null ? [] : _only.WireReferences.Select(r => r.Value);

        // From one hull's ready lists to the general, keyed form.
        private void Spread()
        {
            if (_coverage is not null) return;
            _coverage = new SortedDictionary<string, Protos.V1.SystemCoverage>(StringComparer.Ordinal);
            _references = new SortedDictionary<string, Protos.V1.ElementReference>(StringComparer.Ordinal);
            if (_only is null) return;
            _coverage.Add(_only.Hull.SystemName, _only.WireCoverage);
            foreach ((string symbol, Protos.V1.ElementReference reference) in _only.WireReferences) _references.Add(symbol, reference);
            _only = null;
        }
    }
}
