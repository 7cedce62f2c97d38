using Hull.Store;
using Microsoft.Extensions.Hosting;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Hosting;

/// <summary>Removes lapsed import sessions and their staged rows: once at start (a crash may have left some) and then periodically.</summary>
public sealed class ImportSessionSweeper(IDatasetStore store, ImportSessionSettings settings, ILogger<ImportSessionSweeper> log) : BackgroundService
{
    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        using var timer = new PeriodicTimer(settings.SweepInterval);
        do
        {
            try
            {
                int removed = store.RemoveExpiredImports();
                if (removed > 0) log.LogInformation("removed {Sessions} lapsed import session(s) with their staged rows", removed);
            }
            catch (Exception e) when (e is StoreException or System.Data.Common.DbException or ObjectDisposedException)
            {
                // The next tick tries again; a store that stays broken shows in the health check.
                log.LogWarning(e, "sweeping lapsed import sessions failed");
            }
        }
        while (await WaitAsync(timer, stoppingToken));
    }

    private static async Task<bool> WaitAsync(PeriodicTimer timer, CancellationToken stoppingToken)
    {
        try
        {
            return await timer.WaitForNextTickAsync(stoppingToken);
        }
        catch (OperationCanceledException)
        {
            return false;
        }
    }
}
