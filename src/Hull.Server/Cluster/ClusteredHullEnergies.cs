using Google.Protobuf;
using Grpc.Core;
using Hull.Core.Chemistry;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Services;
using Hull.Server.Validation;
using Microsoft.Extensions.Logging;
using Orleans.Runtime.Messaging;

namespace Hull.Server.Cluster;

/// <summary>
/// A hull-energy request answered by the cluster: one call per chemical system to the grain that holds its hull,
/// the answers put back in the request's order. The caller sees the same response a lone server gives, and the same
/// refusal.
/// </summary>
internal static class ClusteredHullEnergies
{
    public static async Task<GetHullEnergiesResponse> AnswerAsync(
        IGrainFactory grains, HullCache cache, GetHullEnergiesRequest request, IReadOnlyList<Composition> compositions, VersionSnapshot snapshot,
        ElementalReferenceList references, ILogger? logger, CancellationToken cancellation)
    {
        // Systems in the order of their first formula, so that the first refusal is the one a lone server, which
        // answers formula by formula, would give.
        List<(string System, List<int> Rows)> groups = ClusteredStability.BySystem([.. compositions.Select(c => c.Elements)]);
        var calls = new List<(List<int> Rows, Task<GetHullEnergiesResponse> Answer)>();
        RpcException? limit = null;
        foreach ((string system, List<int> rows) in groups)
        {
            try
            {
                // Refused here, as a lone server refuses it, rather than as a peer's failure.
                cache.CheckSystemLimits(snapshot, compositions[rows[0]].Elements, system);
            }
            catch (RpcException e)
            {
                limit = e;
                break;
            }

            var part = new GetHullEnergiesRequest { Dataset = snapshot.Version.Dataset, Version = snapshot.Version.Version };
            part.ElementalReferences.AddRange(request.ElementalReferences);
            part.Formulas.AddRange(rows.Select(i => request.Formulas[i]));
            string key = SystemHullKey.Of(snapshot.Version, system, references.KeyFor(compositions[rows[0]].Elements));
            calls.Add((rows, PartAsync(grains.GetGrain<ISystemHullGrain>(key), system, part, logger, cancellation,
                () => HullEnergies.AnswerAsync(part, [.. rows.Select(i => compositions[i])], references, snapshot, cache, null, cancellation))));
        }

        var results = new HullEnergyResult[compositions.Count];
        var used = new StabilityGrpcService.HullsUsed();
        foreach ((List<int> rows, Task<GetHullEnergiesResponse> answer) in calls)
        {
            GetHullEnergiesResponse part = await answer;
            for (int j = 0; j < rows.Count; j++) results[rows[j]] = part.Results[j];
            used.Add(part.Coverage, part.References);
        }

        if (limit is not null) throw limit;
        var response = new GetHullEnergiesResponse { Used = Mapping.WireMapping.ToWire(snapshot.Version) };
        response.Results.AddRange(results);
        response.Coverage.AddRange(used.Coverage);
        response.References.AddRange(used.References);
        return response;
    }

    /// <summary>
    /// One system's part from its grain; the grain's refusal raised as the caller's own. When the member holding the
    /// grain has gone (killed, or cut off) and the cluster has not yet moved its grains, this server answers the part
    /// itself, with the same code and data, so that a member's loss costs time, not answers.
    /// </summary>
    private static async Task<GetHullEnergiesResponse> PartAsync(
        ISystemHullGrain grain, string system, GetHullEnergiesRequest part, ILogger? logger, CancellationToken cancellation,
        Func<Task<(GetHullEnergiesResponse Response, CachedHull? Hull)>> locally)
    {
        SystemHullAnswer answer;
        try
        {
            answer = await grain.AnswerAsync(SystemHullQuestion.HullEnergies, part.ToByteArray(), cancellation);
        }
        catch (Exception e) when (ClusteredStability.IsUnreachable(e, cancellation))
        {
            logger?.LogWarning("Answering system {System} here: the member holding its hull is unreachable ({Error})",
                system, e.GetType().Name);
            return (await locally()).Response;
        }

        if (answer.Refusal is { } refusal) throw Google.Rpc.Status.Parser.ParseFrom(refusal).ToRpcException();
        return GetHullEnergiesResponse.Parser.ParseFrom(answer.Response);
    }
}
