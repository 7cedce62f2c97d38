using System.Collections.Concurrent;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Caching;

/// <summary>
/// One import at a time per dataset (within this server), so that imports through one server rarely meet a moved
/// base version (the store refuses those, see <see cref="BaseVersionChangedException"/>), and the reference ledger
/// of each dataset's latest version, so that a batch is checked without reading the whole version.
/// </summary>
public sealed class ImportGate
{
    private readonly ConcurrentDictionary<string, SemaphoreSlim> _locks = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, (DatasetLatest Version, ReferenceLedger Ledger)> _ledgers = new(StringComparer.Ordinal);

    /// <summary>Waits for the dataset's import lock; dispose the result to release it.</summary>
    public async Task<IDisposable> EnterAsync(string dataset, CancellationToken cancellation)
    {
        SemaphoreSlim gate = _locks.GetOrAdd(dataset, _ => new SemaphoreSlim(1, 1));
        await gate.WaitAsync(cancellation).ConfigureAwait(false);
        return new Release(gate);
    }

    /// <summary>
    /// The ledger of <paramref name="version"/>, when it is the one remembered. Keyed by dataset key and number, not
    /// fingerprint (whose first computation reads the whole version): a version's content never changes, its number
    /// is never given again within the dataset, and a dataset made again under the same name has another key.
    /// </summary>
    public bool TryGetLedger(string dataset, DatasetLatest version, out ReferenceLedger ledger)
    {
        if (_ledgers.TryGetValue(dataset, out var known) && known.Version == version)
        {
            ledger = known.Ledger;
            return true;
        }

        ledger = ReferenceLedger.Empty;
        return false;
    }

    /// <summary>Remembers the ledger of the dataset's latest version.</summary>
    public void Remember(string dataset, DatasetLatest version, ReferenceLedger ledger) => _ledgers[dataset] = (version, ledger);

    /// <summary>Forgets a dataset's ledger (after it or one of its versions is deleted).</summary>
    public void Forget(string dataset) => _ledgers.TryRemove(dataset, out _);

    private sealed class Release(SemaphoreSlim gate) : IDisposable
    {
        private int _released;

        public void Dispose()
        {
            if (Interlocked.Exchange(ref _released, 1) == 0) gate.Release();
        }
    }
}
