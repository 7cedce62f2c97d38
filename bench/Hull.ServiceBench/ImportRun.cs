using System.Diagnostics;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>One import of many entries in equal batches, one ImportEntries call (one new version) per batch.</summary>
/// <param name="Seconds">Wall time from the first request to the last answer: message building, transfer,
/// validation, the SQLite transaction and its commit, for every batch.</param>
/// <param name="FirstTenthEntriesPerSecond">Throughput over the first tenth of the batches.</param>
/// <param name="LastTenthEntriesPerSecond">Throughput over the last tenth (later versions carry more history).</param>
public sealed record ImportSample(
    int Entries, int Batches, double Seconds, double EntriesPerSecond, double BatchP50Ms, double BatchMaxMs,
    double FirstTenthEntriesPerSecond, double LastTenthEntriesPerSecond, double ServerCpuCores, double LoadAverage1Minute);

public static class ImportRun
{
    private static readonly TimeSpan CallDeadline = TimeSpan.FromMinutes(2);

    /// <summary>Creates <paramref name="dataset"/> and imports <paramref name="entries"/> in batches of <paramref name="batchSize"/>, one call after another.</summary>
    public static async Task<ImportSample> RunAsync(
        DatasetService.DatasetServiceClient datasets, string dataset, IReadOnlyList<Entry> entries, int batchSize, ServerProcess server)
    {
        await datasets.CreateDatasetAsync(
            new CreateDatasetRequest { Name = dataset, Description = "invented entries for the service benchmark" },
            deadline: DateTime.UtcNow + CallDeadline);
        int batches = (entries.Count + batchSize - 1) / batchSize;
        var batchTicks = new long[batches];
        double cpu0 = server.CpuSeconds();
        long start = Stopwatch.GetTimestamp();
        for (int b = 0; b < batches; b++)
        {
            long t0 = Stopwatch.GetTimestamp();
            var request = new ImportEntriesRequest
            {
                Dataset = dataset,
                DuplicatePolicy = DuplicatePolicy.Reject,
                SourceLabel = $"bench-batch-{b + 1:D3}",
                Note = "service benchmark import",
            };
            int from = b * batchSize;
            for (int i = from; i < Math.Min(entries.Count, from + batchSize); i++) request.Entries.Add(entries[i]);
            ImportEntriesResponse response = await datasets.ImportEntriesAsync(request, deadline: DateTime.UtcNow + CallDeadline);
            if (response.InsertedCount != request.Entries.Count || response.DatasetVersion != b + 1)
            {
                throw new InvalidOperationException(
                    $"batch {b + 1}: inserted {response.InsertedCount} of {request.Entries.Count} as version {response.DatasetVersion}");
            }

            batchTicks[b] = Stopwatch.GetTimestamp() - t0;
        }

        return Summarize(entries.Count, batchSize, batchTicks, start, server.CpuSeconds() - cpu0);
    }

    /// <summary>
    /// Creates <paramref name="dataset"/> and imports <paramref name="entries"/> as one import session: BeginImport, one
    /// StageEntries call per batch of <paramref name="batchSize"/>, CommitImport (one new version). Timed like
    /// <see cref="RunAsync"/>, the commit counted in the wall time and in the last batch.
    /// </summary>
    public static async Task<ImportSample> RunSessionAsync(
        DatasetService.DatasetServiceClient datasets, string dataset, IReadOnlyList<Entry> entries, int batchSize, ServerProcess server)
    {
        await datasets.CreateDatasetAsync(
            new CreateDatasetRequest { Name = dataset, Description = "invented entries for the service benchmark" },
            deadline: DateTime.UtcNow + CallDeadline);
        int batches = (entries.Count + batchSize - 1) / batchSize;
        var batchTicks = new long[batches];
        double cpu0 = server.CpuSeconds();
        long start = Stopwatch.GetTimestamp();
        ImportSession session = await datasets.BeginImportAsync(
            new BeginImportRequest { Dataset = dataset, DuplicatePolicy = DuplicatePolicy.Reject, SourceLabel = "bench-session", Note = "service benchmark import" },
            deadline: DateTime.UtcNow + CallDeadline);
        for (int b = 0; b < batches; b++)
        {
            long t0 = Stopwatch.GetTimestamp();
            var request = new StageEntriesRequest { SessionId = session.SessionId };
            int from = b * batchSize;
            for (int i = from; i < Math.Min(entries.Count, from + batchSize); i++) request.Entries.Add(entries[i]);
            await datasets.StageEntriesAsync(request, deadline: DateTime.UtcNow + CallDeadline);
            if (b == batches - 1)
            {
                ImportEntriesResponse committed = await datasets.CommitImportAsync(
                    new CommitImportRequest { SessionId = session.SessionId }, deadline: DateTime.UtcNow + CallDeadline);
                if (committed.InsertedCount != entries.Count || committed.DatasetVersion != 1)
                {
                    throw new InvalidOperationException($"session: inserted {committed.InsertedCount} of {entries.Count} as version {committed.DatasetVersion}");
                }
            }

            batchTicks[b] = Stopwatch.GetTimestamp() - t0;
        }

        return Summarize(entries.Count, batchSize, batchTicks, start, server.CpuSeconds() - cpu0);
    }

    /// <summary>Rates and latencies of one timed import from its per-batch ticks (both import paths report alike).</summary>
    private static ImportSample Summarize(int entryCount, int batchSize, long[] batchTicks, long start, double serverCpuSeconds)
    {
        double seconds = Stopwatch.GetElapsedTime(start).TotalSeconds;
        int batches = batchTicks.Length;
        int tenth = Math.Max(1, batches / 10);
        double EntriesPerSecond(IEnumerable<long> ticks) => tenth * (double)batchSize / (ticks.Sum() / (double)Stopwatch.Frequency);
        long[] sorted = batchTicks.Order().ToArray();
        return new ImportSample(
            entryCount, batches, seconds, entryCount / seconds,
            QueryLoadMilliseconds(QueryLoad.Percentile(sorted, 0.5)), QueryLoadMilliseconds(sorted[^1]),
            EntriesPerSecond(batchTicks.Take(tenth)), EntriesPerSecond(batchTicks.Skip(batches - tenth)),
            serverCpuSeconds / seconds, ProcFiles.LoadAverage1Minute());
    }

    private static double QueryLoadMilliseconds(long ticks) => ticks * 1000.0 / Stopwatch.Frequency;
}
