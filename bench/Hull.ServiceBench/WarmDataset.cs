using System.Diagnostics;
using Grpc.Net.Client;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>The warm dataset as imported and queried once, and what that took.</summary>
/// <param name="Version">The version the import made (the latest).</param>
/// <param name="CacheWarmSeconds">Every entry once (requests of 1,000 ids) and every candidate once.</param>
public sealed record WarmData(
    List<Entry> Entries, List<Candidate> Candidates, ImportSample Import, long Version, double CacheWarmSeconds, CacheStatistics AfterWarming);

/// <summary>The invented dataset every query run reads, imported through the RPC like any client would.</summary>
public static class WarmDataset
{
    public const string Name = "warm";

    private static readonly TimeSpan CallDeadline = TimeSpan.FromMinutes(5);

    /// <summary>A channel as the load uses it: large messages allowed, several HTTP/2 connections allowed.</summary>
    public static GrpcChannel Channel(Uri address) => GrpcChannel.ForAddress(address, new GrpcChannelOptions
    {
        MaxReceiveMessageSize = 64 * 1024 * 1024,
        HttpHandler = new System.Net.Http.SocketsHttpHandler { EnableMultipleHttp2Connections = true },
    });

    /// <summary>The entries and candidates of the run (the same for every server the run starts).</summary>
    public static (List<Entry> Entries, List<Candidate> Candidates) Invent(BenchOptions options) =>
        (new SyntheticOxides(seed: 1).Entries(options.WarmEntries, "w"), new SyntheticOxides(seed: 7).Candidates(options.CandidatePool));

    /// <summary>Imports the entries in batches of 1,000, then queries every entry and every candidate once, which
    /// builds and caches the hull of every chemical system present and checks that they all answer.</summary>
    public static async Task<WarmData> PrepareAsync(GrpcChannel channel, BenchOptions options, ServerProcess server)
    {
        var datasets = new DatasetService.DatasetServiceClient(channel);
        var stability = new StabilityService.StabilityServiceClient(channel);
        (List<Entry> entries, List<Candidate> candidates) = Invent(options);
        ImportSample import = await ImportRun.RunAsync(datasets, Name, entries, 1_000, server);
        long start = Stopwatch.GetTimestamp();
        long version = await QueryEveryOnceAsync(stability, entries, candidates);
        double seconds = Stopwatch.GetElapsedTime(start).TotalSeconds;
        CacheStatistics after = await new DiagnosticsService.DiagnosticsServiceClient(channel).GetCacheStatisticsAsync(new GetCacheStatisticsRequest());
        return new WarmData(entries, candidates, import, version, seconds, after);
    }

    /// <summary>Every entry and every candidate once; returns the version that answered.</summary>
    public static async Task<long> QueryEveryOnceAsync(StabilityService.StabilityServiceClient stability, List<Entry> entries, List<Candidate> candidates)
    {
        long version = 0;
        foreach (Entry[] chunk in entries.Chunk(1_000))
        {
            var request = new GetEntryStabilityRequest { Dataset = Name };
            request.EntryIds.AddRange(chunk.Select(e => e.Id));
            GetEntryStabilityResponse response = await stability.GetEntryStabilityAsync(request, deadline: DateTime.UtcNow + CallDeadline);
            version = response.Used.Version;
            for (int i = 0; i < chunk.Length; i++)
            {
                if (response.Results[i].EntryId != chunk[i].Id) throw new InvalidOperationException($"result {i} is {response.Results[i].EntryId}, not {chunk[i].Id}");
            }
        }

        foreach (Candidate[] chunk in candidates.Chunk(1_000))
        {
            var request = new AssessCandidatesRequest { Dataset = Name };
            request.Candidates.AddRange(chunk);
            AssessCandidatesResponse response = await stability.AssessCandidatesAsync(request, deadline: DateTime.UtcNow + CallDeadline);
            if (response.Results.Count != chunk.Length) throw new InvalidOperationException("a candidate went unanswered");
        }

        return version;
    }
}
