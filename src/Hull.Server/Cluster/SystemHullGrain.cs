using Google.Protobuf;
using Hull.Protos.V1;
using Hull.Server.Caching;
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

    public async Task<byte[]> HullEnergiesAsync(byte[] request)
    {
        GetHullEnergiesRequest parsed = GetHullEnergiesRequest.Parser.ParseFrom(request);
        VersionRef version = SystemHullKey.VersionOf(this.GetPrimaryKeyString());
        VersionSnapshot snapshot = await cache.GetSnapshotAsync(version, CancellationToken.None);
        if (_hull is null)
        {
            counters.CountGrainHullBuild();
        }

        (GetHullEnergiesResponse response, _hull) = await HullEnergies.AnswerAsync(
            parsed, HullEnergies.ParseChecked(parsed), ElementalReferenceList.Parse(parsed.ElementalReferences), snapshot, cache, _hull, CancellationToken.None);
        return response.ToByteArray();
    }
}
