using Google.Protobuf;
using Grpc.Core;
using Hull.Protos.V1;
using Hull.Server.Caching;
using Hull.Server.Errors;
using Hull.Server.Services;
using Hull.Server.Validation;

namespace Hull.Server.Cluster;

/// <summary>
/// Holds one chemical system's hull on the server the cluster placed it on; the science is the same code a lone
/// server runs (<see cref="HullEnergies"/>, <see cref="StabilityAnswers"/>), over this server's hull cache.
/// </summary>
public sealed class SystemHullGrain(HullCache cache, ClusterCounters counters) : Grain, ISystemHullGrain
{
    private CachedHull? _hull;

    public async Task<SystemHullAnswer> AnswerAsync(SystemHullQuestion question, byte[] request, CancellationToken cancellation)
    {
        try
        {
            string key = this.GetPrimaryKeyString();
            VersionSnapshot snapshot = await cache.GetSnapshotAsync(SystemHullKey.VersionOf(key), cancellation);
            IMessage response = await AnswerAsync(question, request, snapshot, SystemHullKey.SystemOf(key), cancellation);
            return new SystemHullAnswer(response.ToByteArray(), null);
        }
        catch (OperationCanceledException) when (cancellation.IsCancellationRequested)
        {
            counters.CountGrainCallCancelled();
            throw;
        }
        catch (Exception e) when (e is RpcException || StoreErrorTranslation.Translate(e) is not null)
        {
            // The status a lone server's last line would have made of it; anything else is a failure of this server.
            RpcException refusal = e as RpcException is { } rpc ? RpcErrors.WithErrorInfo(rpc) : StoreErrorTranslation.Translate(e)!;
            return new SystemHullAnswer(null, refusal.GetRpcStatus()!.ToByteArray());
        }
    }

    private async Task<IMessage> AnswerAsync(SystemHullQuestion question, byte[] request, VersionSnapshot snapshot, string system, CancellationToken cancellation)
    {
        switch (question)
        {
            case SystemHullQuestion.HullEnergies:
            {
                GetHullEnergiesRequest parsed = GetHullEnergiesRequest.Parser.ParseFrom(request);
                bool building = _hull is null;
                (GetHullEnergiesResponse response, _hull) = await HullEnergies.AnswerAsync(
                    parsed, HullEnergies.ParseChecked(parsed), ElementalReferenceList.Parse(parsed.ElementalReferences), snapshot, cache, _hull, cancellation);
                if (building && _hull is not null) counters.CountGrainHullBuild();
                return response;
            }

            case SystemHullQuestion.EntryStability:
            {
                GetEntryStabilityRequest parsed = GetEntryStabilityRequest.Parser.ParseFrom(request);
                SystemHullSource hulls = Hulls(snapshot, system, ElementalReferenceList.Parse(parsed.ElementalReferences), cancellation);
                return await StabilityAnswers.EntryStabilityAsync(parsed, snapshot, StabilityAnswers.RowsOf(parsed, snapshot), hulls);
            }

            case SystemHullQuestion.AssessCandidates:
            {
                AssessCandidatesRequest parsed = AssessCandidatesRequest.Parser.ParseFrom(request);
                ElementalReferenceList references = ElementalReferenceList.Parse(parsed.ElementalReferences);
                (Core.Chemistry.Composition[] compositions, Core.Thermo.EnergyBasis[] bases) = StabilityAnswers.ParseChecked(parsed);
                return await StabilityAnswers.AssessCandidatesAsync(parsed, compositions, bases, snapshot, references, Hulls(snapshot, system, references, cancellation));
            }

            case SystemHullQuestion.StablePhases:
            {
                GetStablePhasesRequest parsed = GetStablePhasesRequest.Parser.ParseFrom(request);
                IReadOnlyList<string> elements = ChemicalSystemText.Parse(parsed.ChemicalSystem, "chemical_system");
                CachedHull hull = await Hulls(snapshot, system, ElementalReferenceList.Parse(parsed.ElementalReferences), cancellation)(elements);
                return StabilityAnswers.StablePhases(snapshot, elements, hull);
            }

            case SystemHullQuestion.HullFacets:
            {
                GetHullFacetsRequest parsed = GetHullFacetsRequest.Parser.ParseFrom(request);
                IReadOnlyList<string> elements = ChemicalSystemText.Parse(parsed.ChemicalSystem, "chemical_system");
                CachedHull hull = await Hulls(snapshot, system, ElementalReferenceList.Parse(parsed.ElementalReferences), cancellation)(elements);
                return StabilityAnswers.Facets(snapshot, hull);
            }

            default:
                throw new ArgumentOutOfRangeException(nameof(question), question, "not a question a system's grain answers");
        }
    }

    /// <summary>
    /// This grain's hull: built (or found in this server's cache) on the first question and kept, so the cluster
    /// builds it once. A system other than the grain's own, which the callers never send, comes from the cache unkept.
    /// </summary>
    private SystemHullSource Hulls(VersionSnapshot snapshot, string system, ElementalReferenceList references, CancellationToken cancellation) => async elements =>
    {
        if (!string.Equals(string.Join('-', elements), system, StringComparison.Ordinal)) return await cache.GetHullAsync(snapshot, elements, cancellation, references);
        if (_hull is not null) return _hull;
        CachedHull hull = await cache.GetHullAsync(snapshot, elements, cancellation, references);
        if (_hull is null) counters.CountGrainHullBuild();
        return _hull = hull;
    };
}
