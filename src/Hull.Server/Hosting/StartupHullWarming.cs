using System.Diagnostics;
using Grpc.Core;
using Hull.Core.Thermo;
using Hull.Server.Caching;
using Hull.Store;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Hosting;

/// <summary>
/// Once the server listens, builds in the background the hulls that queries of the latest versions will ask for:
/// for each dataset (by name), the chemical system of every entry, the systems with the most entries first, until
/// <see cref="StartupWarmingSettings.MaxHulls"/> are built. A fresh server otherwise answers its first queries only
/// after building each hull they touch, on the cores those queries need. A query that arrives while its hull is
/// being built waits for that one build (the cache builds each key once); a system past the service limits is
/// skipped (its queries are refused anyway); any failure only ends the warming early. With each hull it also makes
/// the answer of every entry whose own system it is (<see cref="CachedHull.WireStabilityOf"/>): entry-by-id queries
/// are answered from those, and a fresh server otherwise makes each one on the first question for that entry, so its
/// first seconds ran at a third of the warm rate.
/// </summary>
public sealed class StartupHullWarming(
    IDatasetStore store, VersionResolver versions, HullCache cache, StartupWarmingSettings settings, IHostApplicationLifetime lifetime,
    StartupWarmingProgress progress, ILogger<StartupHullWarming> log) : BackgroundService
{
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        try
        {
            await WarmAsync(stoppingToken);
        }
        finally
        {
            progress.Finish();
        }
    }

    private async Task WarmAsync(CancellationToken stoppingToken)
    {
        if (settings.MaxHulls == 0) return;
        try
        {
            // Not before the port is bound: the warming must not delay the server's readiness.
            var listening = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
            using (lifetime.ApplicationStarted.Register(() => listening.TrySetResult()))
            using (stoppingToken.Register(() => listening.TrySetCanceled(stoppingToken)))
            {
                await listening.Task;
            }

            long start = Stopwatch.GetTimestamp();
            int built = 0, datasets = 0;
            foreach (DatasetSummary dataset in store.ListDatasets())
            {
                if (built >= settings.MaxHulls) break;
                if (dataset.LatestVersion == IDatasetStore.NoVersion) continue;
                VersionSnapshot snapshot = await cache.GetSnapshotAsync(versions.Resolve(dataset.Name, 0), stoppingToken);
                datasets++;
                foreach (int[] rows in SystemsByEntryCount(snapshot.Entries))
                {
                    if (built >= settings.MaxHulls) break;
                    stoppingToken.ThrowIfCancellationRequested();
                    try
                    {
                        CachedHull hull = await cache.GetHullAsync(snapshot, snapshot.Entries[rows[0]].Composition.Elements, stoppingToken);
                        foreach (int row in rows) hull.WireStabilityOf(snapshot.Entries[row].Id, snapshot.FormulasAsStored[row]);
                        built++;
                    }
                    catch (RpcException e) when (e.StatusCode == StatusCode.ResourceExhausted)
                    {
                        // Past a service limit: queries of this system are refused, so there is nothing to warm.
                    }
                }
            }

            log.LogInformation("startup warming: {Hulls} hulls of the latest versions of {Datasets} datasets ready in {Seconds:F2} s",
                built, datasets, Stopwatch.GetElapsedTime(start).TotalSeconds);
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
        {
        }
        catch (Exception e) when (e is RpcException or StoreException or System.Data.Common.DbException or ObjectDisposedException)
        {
            log.LogWarning(e, "startup warming stopped early; queries build the remaining hulls as they come");
        }
    }

    /// <summary>The entries' rows grouped by their chemical system, the systems with the most entries first (ties by name).</summary>
    private static IEnumerable<int[]> SystemsByEntryCount(IReadOnlyList<PhaseEntry> entries) =>
        Enumerable.Range(0, entries.Count)
            .GroupBy(row => entries[row].Composition.ChemicalSystem, StringComparer.Ordinal)
            .OrderByDescending(g => g.Count())
            .ThenBy(g => g.Key, StringComparer.Ordinal)
            .Select(g => g.ToArray());
}
