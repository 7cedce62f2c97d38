using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Mapping;
using Hull.Server.Validation;
using ThermoBasis = Hull.Core.Thermo.EnergyBasis;

namespace Hull.Server.Services;

/// <summary>The hull of a chemical system (its elements, in the order the cache keys them) over the call's version.</summary>
internal delegate Task<CachedHull> SystemHullSource(IReadOnlyList<string> elements);

/// <summary>
/// The stability answers built on chemical-system hulls, over one version and the hulls a caller hands them: the one
/// code a lone server runs, and the one a cluster's holder of a system's hull runs for its part of a request.
/// </summary>
internal static class StabilityAnswers
{
    /// <summary>The snapshot row of each requested entry; NOT_FOUND naming the first entry the version lacks.</summary>
    public static int[] RowsOf(GetEntryStabilityRequest request, VersionSnapshot snapshot)
    {
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

        return rows;
    }

    /// <summary>Each entry's stability in the hull of its own chemical system.</summary>
    public static async Task<GetEntryStabilityResponse> EntryStabilityAsync(
        GetEntryStabilityRequest request, VersionSnapshot snapshot, int[] rows, SystemHullSource hulls)
    {
        var response = new GetEntryStabilityResponse { Used = WireMapping.ToWire(snapshot.Version) };
        var used = new StabilityGrpcService.HullsUsed();
        foreach (int row in rows)
        {
            PhaseEntry entry = snapshot.Entries[row];
            CachedHull hull = await hulls(entry.Composition.Elements);
            used.Add(hull);
            response.Results.Add(hull.WireStabilityOf(entry.Id, snapshot.FormulasAsStored[row]));
        }

        response.Coverage.AddRange(used.Coverage);
        response.References.AddRange(used.References);
        return response;
    }

    /// <summary>
    /// The candidates' formulas and bases of a request another server has already checked (a cluster member's part).
    /// </summary>
    public static (Composition[] Compositions, ThermoBasis[] Bases) ParseChecked(AssessCandidatesRequest request)
    {
        var compositions = new Composition[request.Candidates.Count];
        var bases = new ThermoBasis[compositions.Length];
        for (int i = 0; i < compositions.Length; i++)
        {
            if (!Composition.TryParse(request.Candidates[i].Formula, out Composition? composition, out FormulaParseException? error) ||
                !WireMapping.TryFromWire(request.Candidates[i].Basis, out bases[i]))
            {
                throw new ArgumentException($"candidates[{i}]: {error?.Message ?? "unknown basis"}", nameof(request));
            }

            compositions[i] = composition;
        }

        return (compositions, bases);
    }

    /// <summary>Each checked candidate against the hull of its chemical system: formation energy, distance and decomposition.</summary>
    public static async Task<AssessCandidatesResponse> AssessCandidatesAsync(
        AssessCandidatesRequest request, Composition[] compositions, ThermoBasis[] bases, VersionSnapshot snapshot,
        ElementalReferenceList references, SystemHullSource systemHulls)
    {
        var response = new AssessCandidatesResponse { Used = WireMapping.ToWire(snapshot.Version) };
        var violations = new List<FieldViolation>();
        var used = new StabilityGrpcService.HullsUsed();
        var hulls = new CachedHull[compositions.Length];
        var formations = new double[compositions.Length];
        for (int i = 0; i < compositions.Length; i++)
        {
            hulls[i] = await systemHulls(compositions[i].Elements);
            used.Add(hulls[i]);
            formations[i] = FormationEnergyOf(request.Candidates[i], compositions[i], bases[i], hulls[i].Hull, references, i, used);
            if (!FormationEnergyRange.Contains(formations[i]))
            {
                violations.Add(new($"candidates[{i}].energy_ev",
                    $"{FormationEnergyRange.Describe(formations[i])} (implied by the total energy and the elemental references); check the number and its basis"));
            }
        }

        if (violations.Count > 0) throw RpcErrors.InvalidArgument(BatchValidation.Summarize("the request was refused", violations), violations);
        for (int i = 0; i < compositions.Length; i++)
        {
            Candidate candidate = request.Candidates[i];
            CachedHull hull = hulls[i];
            CandidateStability assessed = hull.Hull.Assess(compositions[i], formations[i]);
            response.Results.Add(new CandidateAssessment
            {
                Label = candidate.Label,
                Formula = candidate.Formula,
                ChemicalSystem = hull.Hull.SystemName,
                FormationEnergyEvPerAtom = WireMapping.FormationOf(assessed.FormationEnergyEvPerAtom),
                EnergyRelativeToHullEvPerAtom = assessed.EnergyRelativeToHullEvPerAtom,
                EnergyAboveHullEvPerAtom = assessed.EnergyAboveHullEvPerAtom,
                IsOnOrBelowHull = assessed.IsOnOrBelowHull,
                Decomposition = WireMapping.ToWire(assessed.Decomposition),
            });
        }

        response.Coverage.AddRange(used.Coverage);
        response.References.AddRange(used.References);
        return response;
    }

    /// <summary>The stable phases of one chemical system's hull, by id.</summary>
    public static GetStablePhasesResponse StablePhases(VersionSnapshot snapshot, IReadOnlyList<string> elements, CachedHull hull)
    {
        var response = new GetStablePhasesResponse { Used = WireMapping.ToWire(snapshot.Version), ChemicalSystem = string.Join('-', elements) };
        response.Phases.AddRange(hull.Hull.StablePhases.OrderBy(p => p.Id, StringComparer.Ordinal).Select(WireMapping.ToWire));
        response.Coverage.Add(WireMapping.ToWire(hull.Hull.Coverage));
        response.References.AddRange(hull.Hull.References.Select(WireMapping.ToWire));
        return response;
    }

    /// <summary>A hull's facets, tie-lines and stable phases.</summary>
    public static GetHullFacetsResponse Facets(VersionSnapshot snapshot, CachedHull hull)
    {
        var response = new GetHullFacetsResponse
        {
            Used = WireMapping.ToWire(snapshot.Version),
            ChemicalSystem = hull.Hull.SystemName,
        };
        response.Components.AddRange(hull.Hull.Components);
        response.Facets.AddRange(hull.Hull.Facets.Select(WireMapping.ToWire));
        response.TieLines.AddRange(hull.Hull.TieLines.Select(WireMapping.ToWire));
        response.StablePhases.AddRange(hull.Hull.StablePhases.Select(WireMapping.ToWire));
        response.Coverage.Add(WireMapping.ToWire(hull.Hull.Coverage));
        response.References.AddRange(hull.Hull.References.Select(WireMapping.ToWire));
        return response;
    }

    /// <summary>
    /// The candidate's formation energy per atom. A total energy needs a reference for each of its elements: the
    /// caller's explicit one, else the version's (the lowest pure-element total energy per atom); an element with
    /// neither is FAILED_PRECONDITION. References taken for the candidate are recorded in <paramref name="used"/>.
    /// </summary>
    private static double FormationEnergyOf(
        Candidate candidate, Composition composition, ThermoBasis basis, SystemHull hull, ElementalReferenceList explicitReferences,
        int index, StabilityGrpcService.HullsUsed used)
    {
        string id = candidate.Label.Length > 0 ? candidate.Label : $"candidates[{index}]";
        var entry = new PhaseEntry(id, composition, candidate.EnergyEv, basis);
        if (!entry.IsTotalEnergy) return entry.EnergyEvPerAtom;

        // The caller's explicit reference of an element wins over the version's; the rule itself lives in Core.
        var references = new List<Core.Thermo.ElementReference>();
        foreach (string element in composition.Elements)
        {
            if (explicitReferences.TryGet(element, out double given))
            {
                references.Add(new Core.Thermo.ElementReference(element, given, null));
            }
            else if (hull.References.FirstOrDefault(r => string.Equals(r.Symbol, element, StringComparison.Ordinal)) is { } stored)
            {
                references.Add(stored);
            }
        }

        try
        {
            double formation = FormationEnergies.OfCandidate(entry, references);
            foreach (Core.Thermo.ElementReference reference in references) used.AddReference(reference);
            return formation;
        }
        catch (ThermoInputException e) when (e.Element is { } element)
        {
            throw RpcErrors.MissingElementalReference(element,
                $"candidates[{index}] ({candidate.Formula}): {e.Message} Give one in elemental_references (hull --reference {element}=ENERGY).",
                [new FieldViolation($"candidates[{index}].basis", $"missing elemental reference for {element}")]);
        }
    }
}
