using System.Diagnostics;
using Grpc.Core;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>What one query asks.</summary>
public enum QueryKind
{
    /// <summary>GetEntryStability with one stored entry id.</summary>
    EntryById,

    /// <summary>AssessCandidates with one ad-hoc composition and energy.</summary>
    Candidate,
}

/// <summary>One timed run of one query kind at one client count.</summary>
/// <param name="Calls">Calls started inside the measured window (all of them completed).</param>
/// <param name="Errors">Calls that failed or returned a wrong number of results.</param>
/// <param name="WindowSeconds">From the start of the measured window to the last completion.</param>
/// <param name="ServerCpuCores">Server CPU seconds per wall second over the window (2.0 = both cores).</param>
/// <param name="ClientCpuCores">Load generator CPU seconds per wall second.</param>
/// <param name="OtherCpuCores">Every other process on the machine, from /proc/stat.</param>
/// <param name="AnsweredInWindow">Calls started in the window that were answered before it closed (a cold server's
/// first calls can outlast the window; <see cref="QueriesPerSecond"/> waits for them).</param>
public sealed record LoadSample(
    QueryKind Kind, int Clients, string VersionMode, long Calls, long Errors, string? FirstError, double WindowSeconds,
    double QueriesPerSecond, double P50Ms, double P99Ms, double MaxMs,
    double ServerCpuCores, double ClientCpuCores, double OtherCpuCores, double LoadAverage1Minute, long AnsweredInWindow = 0);

/// <summary>
/// Closed-loop load: each client is its own sequential loop (send a query, await the answer, send the next), all
/// clients sharing a few gRPC channels. Calls are timed one by one with Stopwatch timestamps; only calls started
/// after the warm-up count. Bounded in time (warm-up + window) and in count (<see cref="MaxCallsPerClient"/>).
/// </summary>
public sealed class QueryLoad(
    IReadOnlyList<StabilityService.StabilityServiceClient> channels, string dataset, IReadOnlyList<string> entryIds,
    IReadOnlyList<Candidate> candidates)
{
    /// <summary>Calls one client may make in one run, whatever the clock says: a hard stop for a runaway loop.</summary>
    public const int MaxCallsPerClient = 2_000_000;

    /// <summary>Per-call deadline: far above any latency of interest, so a stuck call ends the run instead of hanging it.</summary>
    private static readonly TimeSpan CallDeadline = TimeSpan.FromSeconds(30);

    /// <summary>Runs <paramref name="clients"/> loops for <paramref name="warmUp"/> + <paramref name="window"/>.</summary>
    /// <param name="version">0 asks for the latest version on every call (the usual client); > 0 pins one.</param>
    public async Task<LoadSample> RunAsync(
        QueryKind kind, int clients, long version, TimeSpan warmUp, TimeSpan window, int seed, ServerProcess server)
    {
        long start = Stopwatch.GetTimestamp();
        long measureFrom = start + (long)(warmUp.TotalSeconds * Stopwatch.Frequency);
        long stopAt = measureFrom + (long)(window.TotalSeconds * Stopwatch.Frequency);
        var loops = new Task<ClientLog>[clients];
        for (int i = 0; i < clients; i++)
        {
            int index = i;
            loops[i] = Task.Run(() => LoopAsync(kind, version, channels[index % channels.Count], new Random(seed * 1000 + index), measureFrom, stopAt));
        }

        TimeSpan untilWindow = Stopwatch.GetElapsedTime(Stopwatch.GetTimestamp(), measureFrom);
        if (untilWindow > TimeSpan.Zero) await Task.Delay(untilWindow);
        double server0 = server.CpuSeconds(), client0 = Process.GetCurrentProcess().TotalProcessorTime.TotalSeconds;
        double machine0 = ProcFiles.MachineBusyCpuSeconds();
        long cpuFrom = Stopwatch.GetTimestamp();
        ClientLog[] logs = await Task.WhenAll(loops);
        double cpuSeconds = Stopwatch.GetElapsedTime(cpuFrom).TotalSeconds;
        double serverCpu = server.CpuSeconds() - server0, clientCpu = Process.GetCurrentProcess().TotalProcessorTime.TotalSeconds - client0;
        double otherCpu = Math.Max(0, ProcFiles.MachineBusyCpuSeconds() - machine0 - serverCpu - clientCpu);

        long[] latencies = logs.SelectMany(l => l.LatencyTicks).ToArray();
        Array.Sort(latencies);
        long lastEnd = logs.Max(l => l.LastEnd);
        double windowSeconds = latencies.Length == 0 ? window.TotalSeconds : (lastEnd - measureFrom) / (double)Stopwatch.Frequency;
        return new LoadSample(
            kind, clients, version == 0 ? "latest" : "pinned", latencies.Length, logs.Sum(l => l.Errors),
            logs.Select(l => l.FirstError).FirstOrDefault(e => e is not null), windowSeconds,
            latencies.Length / windowSeconds, Milliseconds(Percentile(latencies, 0.50)), Milliseconds(Percentile(latencies, 0.99)),
            Milliseconds(latencies.Length == 0 ? 0 : latencies[^1]),
            serverCpu / cpuSeconds, clientCpu / cpuSeconds, otherCpu / cpuSeconds, ProcFiles.LoadAverage1Minute(),
            logs.Sum(l => l.AnsweredBy(stopAt)));
    }

    /// <summary>Nearest-rank percentile of sorted values.</summary>
    public static long Percentile(long[] sorted, double fraction)
    {
        if (sorted.Length == 0) return 0;
        int rank = (int)Math.Ceiling(fraction * sorted.Length);
        return sorted[Math.Clamp(rank - 1, 0, sorted.Length - 1)];
    }

    private static double Milliseconds(long ticks) => ticks * 1000.0 / Stopwatch.Frequency;

    private async Task<ClientLog> LoopAsync(
        QueryKind kind, long version, StabilityService.StabilityServiceClient stability, Random random, long measureFrom, long stopAt)
    {
        var log = new ClientLog();
        int calls = 0;
        while (calls++ < MaxCallsPerClient)
        {
            long t0 = Stopwatch.GetTimestamp();
            if (t0 >= stopAt) break;
            try
            {
                int results;
                if (kind == QueryKind.EntryById)
                {
                    var request = new GetEntryStabilityRequest { Dataset = dataset, Version = version };
                    request.EntryIds.Add(entryIds[random.Next(entryIds.Count)]);
                    results = (await stability.GetEntryStabilityAsync(request, deadline: DateTime.UtcNow + CallDeadline)).Results.Count;
                }
                else
                {
                    var request = new AssessCandidatesRequest { Dataset = dataset, Version = version };
                    request.Candidates.Add(candidates[random.Next(candidates.Count)]);
                    results = (await stability.AssessCandidatesAsync(request, deadline: DateTime.UtcNow + CallDeadline)).Results.Count;
                }

                if (results != 1) log.Fail($"{results} results for one query");
            }
            catch (RpcException e)
            {
                log.Fail($"{e.StatusCode}: {e.Status.Detail}");
            }

            long t1 = Stopwatch.GetTimestamp();
            if (t0 >= measureFrom)
            {
                log.LatencyTicks.Add(t1 - t0);
                log.EndTicks.Add(t1);
                log.LastEnd = Math.Max(log.LastEnd, t1);
            }
        }

        return log;
    }

    private sealed class ClientLog
    {
        public List<long> LatencyTicks { get; } = new(16_384);

        public List<long> EndTicks { get; } = new(16_384);

        public long AnsweredBy(long time) => EndTicks.Count(t => t <= time);

        public long LastEnd { get; set; }

        public long Errors { get; private set; }

        public string? FirstError { get; private set; }

        public void Fail(string message)
        {
            Errors++;
            FirstError ??= message;
        }
    }
}
