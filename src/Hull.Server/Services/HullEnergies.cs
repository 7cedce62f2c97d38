using Hull.Core.Chemistry;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Validation;

namespace Hull.Server.Services;

/// <summary>
/// The hull energies of a checked request's formulas over one version: the one path a lone server and a cluster's
/// holder of a system hull both run.
/// </summary>
internal static class HullEnergies
{
    /// <summary>
    /// Answers <paramref name="request"/> (already checked, its formulas parsed as <paramref name="compositions"/> and
    /// its references as <paramref name="references"/>) over <paramref name="snapshot"/>. With
    /// <paramref name="kept"/>, every formula lies in that hull's system and it is used as is; the hull used last is
    /// returned so that a caller may keep it.
    /// </summary>
    public static async Task<(GetHullEnergiesResponse Response, CachedHull? Hull)> AnswerAsync(
        GetHullEnergiesRequest request, IReadOnlyList<Composition> compositions, ElementalReferenceList references,
        VersionSnapshot snapshot, HullCache cache, CachedHull? kept, CancellationToken cancellation)
    {
        var response = new GetHullEnergiesResponse { Used = Mapping.WireMapping.ToWire(snapshot.Version) };
        var used = new StabilityGrpcService.HullsUsed();
        CachedHull? hull = kept;
        for (int i = 0; i < compositions.Count; i++)
        {
            Composition composition = compositions[i];
            hull = kept ?? await cache.GetHullAsync(snapshot, composition.Elements, cancellation, references);
            used.Add(hull);
            Core.Thermo.Decomposition decomposition = hull.Hull.DecompositionAt(composition);
            response.Results.Add(new HullEnergyResult
            {
                Formula = request.Formulas[i],
                ChemicalSystem = hull.Hull.SystemName,
                HullEnergyEvPerAtom = decomposition.HullEnergyEvPerAtom,
                Decomposition = Mapping.WireMapping.ToWire(decomposition),
            });
        }

        response.Coverage.AddRange(used.Coverage);
        response.References.AddRange(used.References);
        return (response, hull);
    }

    /// <summary>
    /// The formulas of a request another server has already checked (a cluster member's part of it), parsed.
    /// </summary>
    public static Composition[] ParseChecked(GetHullEnergiesRequest request)
    {
        var compositions = new Composition[request.Formulas.Count];
        for (int i = 0; i < compositions.Length; i++)
        {
            if (!Composition.TryParse(request.Formulas[i], out Composition? composition, out FormulaParseException? error))
            {
                throw new ArgumentException($"formulas[{i}]: {error.Message}", nameof(request));
            }

            compositions[i] = composition;
        }

        return compositions;
    }
}
