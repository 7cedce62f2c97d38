using System.Collections.Concurrent;
using Hull.Server.Errors;
using Hull.Store;

namespace Hull.Server.Caching;

/// <summary>
/// Turns (dataset, requested version) into a concrete version and its content fingerprint. A version's content
/// never changes, so its fingerprint is remembered; deleting a dataset or version through this server forgets
/// the dataset's fingerprints, so a dataset recreated under the same name is never confused with the old one.
/// </summary>
public sealed class VersionResolver(IDatasetStore store)
{
    /// <summary>Fingerprints remembered before the memory is cleared; each is about 200 bytes.</summary>
    private const int MaxRemembered = 100_000;

    private readonly ConcurrentDictionary<(string Dataset, long Version), string> _fingerprints = new();

    /// <summary>The version to read: <paramref name="requested"/>, or the latest when it is 0.</summary>
    /// <exception cref="Grpc.Core.RpcException">INVALID_ARGUMENT for a negative version; NOT_FOUND for a dataset
    /// without versions (unknown datasets and versions surface as store exceptions, translated upstream).</exception>
    public VersionRef Resolve(string dataset, long requested)
    {
        if (DatasetName.Check(dataset) is { } problem) throw RpcErrors.InvalidArgument("dataset", problem, ErrorReasons.InvalidDatasetName);
        if (requested < 0) throw RpcErrors.InvalidArgument("version", $"version {requested} is negative; versions count from 1 and 0 means the latest");

        long version = requested;
        if (version == 0)
        {
            version = store.GetLatestVersion(dataset);
            if (version == IDatasetStore.NoVersion)
            {
                throw RpcErrors.VersionNotFound(dataset, null, $"dataset '{dataset}' has no version yet; import entries first");
            }
        }

        if (!_fingerprints.TryGetValue((dataset, version), out string? fingerprint))
        {
            fingerprint = store.GetFingerprint(dataset, version);
            if (_fingerprints.Count >= MaxRemembered) _fingerprints.Clear();
            _fingerprints[(dataset, version)] = fingerprint;
        }

        return new VersionRef(dataset, version, fingerprint);
    }

    /// <summary>Forgets every fingerprint of <paramref name="dataset"/> (after it or one of its versions is deleted).</summary>
    public void Forget(string dataset)
    {
        foreach ((string Dataset, long Version) key in _fingerprints.Keys)
        {
            if (string.Equals(key.Dataset, dataset, StringComparison.Ordinal)) _fingerprints.TryRemove(key, out _);
        }
    }
}
