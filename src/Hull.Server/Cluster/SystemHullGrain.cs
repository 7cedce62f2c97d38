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
/// server runs (<see cref="HullEnergies"/>), over this server's hull cache.
/// </summary>
public sealed class SystemHullGrain(HullCache cache, ClusterCounters counters) : Grain, ISystemHullGrain
{
    private CachedHull? _hull;

    public async Task<SystemHullAnswer> HullEnergiesAsync(byte[] request)
    {
        try
        {
            GetHullEnergiesRequest parsed = GetHullEnergiesRequest.Parser.ParseFrom(request);
            VersionRef version = SystemHullKey.VersionOf(this.GetPrimaryKeyString());
            VersionSnapshot snapshot = await cache.GetSnapshotAsync(version, CancellationToken.None);
            bool building = _hull is null;
            (GetHullEnergiesResponse response, _hull) = await HullEnergies.AnswerAsync(
                parsed, HullEnergies.ParseChecked(parsed), ElementalReferenceList.Parse(parsed.ElementalReferences), snapshot, cache, _hull, CancellationToken.None);
            if (building && _hull is not null) counters.CountGrainHullBuild();
            return new SystemHullAnswer(response.ToByteArray(), null);
        }
        catch (Exception e) when (e is RpcException || StoreErrorTranslation.Translate(e) is not null)
        {
            // The status a lone server's last line would have made of it; anything else is a failure of this server.
            RpcException refusal = e as RpcException is { } rpc ? RpcErrors.WithErrorInfo(rpc) : StoreErrorTranslation.Translate(e)!;
            return new SystemHullAnswer(null, refusal.GetRpcStatus()!.ToByteArray());
        }
    }
}
