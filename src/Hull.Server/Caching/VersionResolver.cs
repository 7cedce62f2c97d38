using System.Collections.Concurrent;
using Hull.Server.Errors;
using Hull.Store;

namespace Hull.Server.Caching;

/// <summary>
/// Turns (dataset, requested version) into a concrete version, its content fingerprint and its correction record. A
/// version's content and record never change, so both are remembered (one store read of each per version, never per
/// query), keyed by the dataset's key as well as its name: a dataset deleted
/// and created again under the same name (through this server or another on the same store) is never confused with
/// the old one.
/// </summary>
public sealed class VersionResolver(IDatasetStore store)
{
    /// <summary>Fingerprints remembered before the memory is cleared; each is about 200 bytes.</summary>
    private const int MaxRemembered = 100_000;

    private readonly ConcurrentDictionary<(string Dataset, long DatasetKey, long Version), (string Fingerprint, VersionCorrections? Corrections)> _fingerprints = new();

    /// <summary>The version to read: <paramref name="requested"/>, or the latest when it is 0.</summary>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT for a negative version; NOT_FOUND for a dataset
    /// without versions (unknown datasets and versions surface as store exceptions, translated upstream).</exception>
    public VersionRef Resolve(string dataset, long requested)
    {
        if (DatasetName.Check(dataset) is { } problem) throw RpcErrors.InvalidArgument("dataset", problem, ErrorReasons.InvalidDatasetName);
        if (requested < 0) throw RpcErrors.InvalidArgument("version", $"version {requested} is negative; versions count from 1 and 0 means the latest");

        // Remembered by the store until anyone commits, so this costs no read of the tables while nothing changes.
        DatasetLatest latest = store.GetLatest(dataset);
        long version = requested;
        if (version == 0)
        {
            version = latest.Version;
            if (version == IDatasetStore.NoVersion)
            {
                throw RpcErrors.VersionNotFound(dataset, null, $"dataset '{dataset}' has no version yet; import entries first");
            }
        }

        if (!_fingerprints.TryGetValue((dataset, latest.DatasetKey, version), out var known))
        {
            known = (store.GetFingerprint(dataset, version), store.GetVersionCorrections(dataset, version));
            if (_fingerprints.Count >= MaxRemembered) _fingerprints.Clear();
            _fingerprints[(dataset, latest.DatasetKey, version)] = known;
        }

        return new VersionRef(dataset, version, known.Fingerprint, known.Corrections);
    }

    /// <summary>Forgets every fingerprint of <paramref name="dataset"/> (after it or one of its versions is deleted).</summary>
    public void Forget(string dataset)
    {
        foreach ((string Dataset, long DatasetKey, long Version) key in _fingerprints.Keys)
        {
            if (string.Equals(key.Dataset, dataset, StringComparison.Ordinal)) _fingerprints.TryRemove(key, out _);
        }
    }
}
