using Google.Protobuf;
using Google.Protobuf.Collections;
using Hull.Core.Chemistry;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Services;
using Hull.Server.Validation;
using Microsoft.Extensions.Logging;
using Orleans.Runtime.Messaging;

namespace Hull.Server.Cluster;

/// <summary>
/// The stability calls other than hull energies that stand on chemical-system hulls, answered by the grains that hold
/// those hulls: a request split by system, one call per system at once, the parts put back in the request's order.
/// Null when a part was refused, or its holder could not be reached: the receiving server then answers the whole
/// request itself, as a lone server, so that a refusal is exactly the lone server's (the field it names counts in
/// the whole request, not in a part) and a lost member costs time, not answers.
/// </summary>
internal static class ClusteredStability
{
    public static Task<GetEntryStabilityResponse?> EntryStabilityAsync(
        IGrainFactory grains, GetEntryStabilityRequest request, VersionSnapshot snapshot, int[] rows, ElementalReferenceList references,
        ILogger? logger, CancellationToken cancellation) =>
        SplitAsync(grains, SystemHullQuestion.EntryStability, snapshot, references, [.. rows.Select(r => snapshot.Entries[r].Composition.Elements)],
            indices =>
            {
                var part = new GetEntryStabilityRequest { Dataset = snapshot.Version.Dataset, Version = snapshot.Version.Version };
                part.ElementalReferences.AddRange(request.ElementalReferences);
                part.EntryIds.AddRange(indices.Select(i => request.EntryIds[i]));
                return part;
            },
            GetEntryStabilityResponse.Parser, new GetEntryStabilityResponse { Used = Mapping.WireMapping.ToWire(snapshot.Version) },
            r => r.Results, r => r.Coverage, r => r.References, logger, cancellation);

    public static Task<AssessCandidatesResponse?> AssessCandidatesAsync(
        IGrainFactory grains, AssessCandidatesRequest request, Composition[] compositions, VersionSnapshot snapshot, ElementalReferenceList references,
        ILogger? logger, CancellationToken cancellation) =>
        SplitAsync(grains, SystemHullQuestion.AssessCandidates, snapshot, references, [.. compositions.Select(c => c.Elements)],
            indices =>
            {
                var part = new AssessCandidatesRequest { Dataset = snapshot.Version.Dataset, Version = snapshot.Version.Version };
                part.ElementalReferences.AddRange(request.ElementalReferences);
                part.Candidates.AddRange(indices.Select(i => request.Candidates[i]));
                return part;
            },
            AssessCandidatesResponse.Parser, new AssessCandidatesResponse { Used = Mapping.WireMapping.ToWire(snapshot.Version) },
            r => r.Results, r => r.Coverage, r => r.References, logger, cancellation);

    public static async Task<GetStablePhasesResponse?> StablePhasesAsync(
        IGrainFactory grains, GetStablePhasesRequest request, IReadOnlyList<string> elements, VersionSnapshot snapshot, ElementalReferenceList references,
        ILogger? logger, CancellationToken cancellation)
    {
        var part = new GetStablePhasesRequest { Dataset = snapshot.Version.Dataset, Version = snapshot.Version.Version, ChemicalSystem = request.ChemicalSystem };
        part.ElementalReferences.AddRange(request.ElementalReferences);
        var parts = await AskBySystemAsync(grains, SystemHullQuestion.StablePhases, snapshot, references, [elements], _ => part,
            GetStablePhasesResponse.Parser, logger, cancellation);
        return parts?[0].Answer;
    }

    public static async Task<GetHullFacetsResponse?> FacetsAsync(
        IGrainFactory grains, GetHullFacetsRequest request, IReadOnlyList<string> elements, VersionSnapshot snapshot, ElementalReferenceList references,
        ILogger? logger, CancellationToken cancellation)
    {
        var part = new GetHullFacetsRequest { Dataset = snapshot.Version.Dataset, Version = snapshot.Version.Version, ChemicalSystem = request.ChemicalSystem };
        part.ElementalReferences.AddRange(request.ElementalReferences);
        var parts = await AskBySystemAsync(grains, SystemHullQuestion.HullFacets, snapshot, references, [elements], _ => part,
            GetHullFacetsResponse.Parser, logger, cancellation);
        return parts?[0].Answer;
    }

    /// <summary>
    /// A grain call that failed because the member holding the grain is gone or cut off (not because the caller gave
    /// up): the receiving member answers that part itself. A cancellation the caller did not ask for is the runtime
    /// abandoning the call (its holder stopping, say) and counts as one.
    /// </summary>
    internal static bool IsUnreachable(Exception e, CancellationToken cancellation) =>
        !cancellation.IsCancellationRequested &&
        e is SiloUnavailableException or OrleansMessageRejectionException or ConnectionFailedException or TimeoutException or OperationCanceledException;

    /// <summary>
    /// The request's rows grouped by chemical system (in the order of each system's first row), each group asked of
    /// its system's grain at once; null when any part was refused or unreachable.
    /// </summary>
    private static async Task<List<(List<int> Rows, TResponse Answer)>?> AskBySystemAsync<TResponse>(
        IGrainFactory grains, SystemHullQuestion question, VersionSnapshot snapshot, ElementalReferenceList references,
        IReadOnlyList<IReadOnlyList<string>> elementsOfRow, Func<List<int>, IMessage> partOf, MessageParser<TResponse> parser,
        ILogger? logger, CancellationToken cancellation)
        where TResponse : IMessage<TResponse>
    {
        var calls = BySystem(elementsOfRow).Select(group =>
        {
            (string system, List<int> rows) = group;
            string key = SystemHullKey.Of(snapshot.Version, system, references.KeyFor(elementsOfRow[rows[0]]));
            return (Rows: rows, System: system, Answer: grains.GetGrain<ISystemHullGrain>(key).AnswerAsync(question, partOf(rows).ToByteArray(), cancellation));
        }).ToList();
        var parts = new List<(List<int> Rows, TResponse Answer)>(calls.Count);
        bool whole = true;
        foreach ((List<int> rows, string system, Task<SystemHullAnswer> call) in calls)
        {
            try
            {
                SystemHullAnswer answer = await call;
                if (answer.Response is null)
                {
                    whole = false;
                    continue;
                }

                parts.Add((rows, parser.ParseFrom(answer.Response)));
            }
            catch (Exception e) when (IsUnreachable(e, cancellation))
            {
                logger?.LogWarning("Answering a {Question} request here: the member holding system {System}'s hull is unreachable ({Error})",
                    question, system, e.GetType().Name);
                whole = false;
            }
        }

        return whole ? parts : null;
    }

    /// <summary>
    /// Row indices grouped by their chemical system ("Co-Li-O"), the systems in the order of their first row, so that
    /// parts are asked and refusals met in the order a lone server meets them.
    /// </summary>
    internal static List<(string System, List<int> Rows)> BySystem(IReadOnlyList<IReadOnlyList<string>> elementsOfRow)
    {
        var bySystem = new Dictionary<string, List<int>>(StringComparer.Ordinal);
        var groups = new List<(string System, List<int> Rows)>();
        for (int i = 0; i < elementsOfRow.Count; i++)
        {
            string system = string.Join('-', elementsOfRow[i]);
            if (!bySystem.TryGetValue(system, out List<int>? rows))
            {
                bySystem[system] = rows = [];
                groups.Add((system, rows));
            }

            rows.Add(i);
        }

        return groups;
    }

    /// <summary>
    /// A request of many rows asked system by system; the parts' results put into <paramref name="whole"/> in the
    /// request's order, with their coverage and references gathered. Null as <see cref="AskBySystemAsync"/> is.
    /// </summary>
    private static async Task<TResponse?> SplitAsync<TResponse, TResult>(
        IGrainFactory grains, SystemHullQuestion question, VersionSnapshot snapshot, ElementalReferenceList references,
        IReadOnlyList<IReadOnlyList<string>> elementsOfRow, Func<List<int>, IMessage> partOf, MessageParser<TResponse> parser, TResponse whole,
        Func<TResponse, RepeatedField<TResult>> results, Func<TResponse, RepeatedField<Protos.V1.SystemCoverage>> coverage,
        Func<TResponse, RepeatedField<Protos.V1.ElementReference>> referencesOf, ILogger? logger, CancellationToken cancellation)
        where TResponse : class, IMessage<TResponse>
    {
        var parts = await AskBySystemAsync(grains, question, snapshot, references, elementsOfRow, partOf, parser, logger, cancellation);
        if (parts is null) return null;
        var merged = new TResult[elementsOfRow.Count];
        var used = new StabilityGrpcService.HullsUsed();
        foreach ((List<int> rows, TResponse answer) in parts)
        {
            RepeatedField<TResult> part = results(answer);
            for (int j = 0; j < rows.Count; j++) merged[rows[j]] = part[j];
            used.Add(coverage(answer), referencesOf(answer));
        }

        results(whole).AddRange(merged);
        coverage(whole).AddRange(used.Coverage);
        referencesOf(whole).AddRange(used.References);
        return whole;
    }
}
