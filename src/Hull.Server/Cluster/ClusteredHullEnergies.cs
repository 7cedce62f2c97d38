using Google.Protobuf;
using Hull.Core.Chemistry;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Validation;

namespace Hull.Server.Cluster;

/// <summary>
/// A hull-energy request answered by the cluster: one call per chemical system to the grain that holds its hull,
/// the answers put back in the request's order. The caller sees the same response a lone server gives.
/// </summary>
internal static class ClusteredHullEnergies
{
    public static async Task<GetHullEnergiesResponse> AnswerAsync(
        IGrainFactory grains, HullCache cache, GetHullEnergiesRequest request, IReadOnlyList<Composition> compositions, VersionSnapshot snapshot,
        ElementalReferenceList references)
    {
        var bySystem = new SortedDictionary<string, List<int>>(StringComparer.Ordinal);
        for (int i = 0; i < compositions.Count; i++)
        {
            string system = string.Join('-', compositions[i].Elements);
            if (!bySystem.TryGetValue(system, out List<int>? rows)) bySystem[system] = rows = [];
            rows.Add(i);
        }

        var calls = new List<(List<int> Rows, Task<byte[]> Answer)>();
        foreach ((string system, List<int> rows) in bySystem)
        {
            // Refused here, as a lone server refuses it, rather than as a peer's failure.
            cache.CheckSystemLimits(snapshot, compositions[rows[0]].Elements, system);
            var part = new GetHullEnergiesRequest { Dataset = snapshot.Version.Dataset, Version = snapshot.Version.Version };
            part.ElementalReferences.AddRange(request.ElementalReferences);
            part.Formulas.AddRange(rows.Select(i => request.Formulas[i]));
            string key = SystemHullKey.Of(snapshot.Version, system, references.KeyFor(compositions[rows[0]].Elements));
            calls.Add((rows, grains.GetGrain<ISystemHullGrain>(key).HullEnergiesAsync(part.ToByteArray())));
        }

        var results = new HullEnergyResult[compositions.Count];
        var coverage = new SortedDictionary<string, SystemCoverage>(StringComparer.Ordinal);
        var used = new SortedDictionary<string, ElementReference>(StringComparer.Ordinal);
        foreach ((List<int> rows, Task<byte[]> answer) in calls)
        {
            GetHullEnergiesResponse part = GetHullEnergiesResponse.Parser.ParseFrom(await answer);
            for (int j = 0; j < rows.Count; j++) results[rows[j]] = part.Results[j];
            foreach (SystemCoverage c in part.Coverage) coverage.TryAdd(c.ChemicalSystem, c);
            foreach (ElementReference r in part.References) used.TryAdd(r.Symbol, r);
        }

        var response = new GetHullEnergiesResponse { Used = Mapping.WireMapping.ToWire(snapshot.Version) };
        response.Results.AddRange(results);
        response.Coverage.AddRange(coverage.Values);
        response.References.AddRange(used.Values);
        return response;
    }
}
