using System.Diagnostics;
using System.Globalization;
using System.Text;
using Grpc.Net.Client;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>
/// A freshly started server's first second against its warm rate. The warm dataset is imported once by a first
/// server, which is then stopped; every measured server is a new process on that data folder, loaded from the
/// moment it says it listens: the first second's rate, then (after <see cref="BenchOptions.JitWarmUp"/> of
/// unrecorded load) a warm window. Each (query kind, client count) gets its own fresh servers, the combinations
/// taken in turn so that outside load does not hit one only; medians over the repetitions.
/// </summary>
public static partial class ColdStart
{
    private static readonly TimeSpan FirstSecond = TimeSpan.FromSeconds(1);

    [System.Text.RegularExpressions.GeneratedRegex(@"(startup warming|ready after)[^""]*")]
    private static partial System.Text.RegularExpressions.Regex WarmingSeconds();

    /// <summary>Answers within the first second, per second.</summary>
    private static double FirstRate(LoadSample first) => first.AnsweredInWindow / FirstSecond.TotalSeconds;

    /// <summary>Server CPU per answer, µs: what an answer costs the server, which follows the other sessions' load
    /// much less than the rate does (NaN when nothing was answered).</summary>
    private static double CpuPerAnswer(LoadSample sample, double answersPerSecond) =>
        answersPerSecond > 0 ? sample.ServerCpuCores / answersPerSecond * 1e6 : double.NaN;

    private static string Label(string build, string variant) => build.Length == 0 ? variant : $"{build}, {variant}";

    public static async Task<string> RunAsync(string serverDll, BenchOptions options)
    {
        string dataDirectory = Path.Combine(Path.GetTempPath(), $"hull-servicebench-cold-{Environment.ProcessId}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDirectory);
        try
        {
            WarmData warm;
            using (ServerProcess first = await ServerProcess.StartAsync(serverDll, dataDirectory, options.ServerArgs))
            using (GrpcChannel channel = WarmDataset.Channel(first.Address))
            {
                // Also lets this load generator's own code settle: only the server is meant to be cold.
                warm = await WarmDataset.PrepareAsync(channel, options, first);
                var load = new QueryLoad([new StabilityService.StabilityServiceClient(channel)], WarmDataset.Name, warm.Entries.Select(e => e.Id).ToArray(), warm.Candidates);
                foreach (QueryKind kind in Enum.GetValues<QueryKind>()) await load.RunAsync(kind, 8, 0, TimeSpan.Zero, TimeSpan.FromSeconds(2), seed: 0, first);
                first.Stop();
            }

            // Each server as configured and with the variant's arguments (default: without its startup warming of the
            // hull cache); with --compare-server, this build and the other one (e.g. a published ReadyToRun server
            // against the plain build), both ways.
            string variantName = string.Join(' ', options.ColdVariantArgs);
            var builds = options.CompareServerDll is string other ? new[] { ("this", serverDll), ("other", other) } : [("", serverDll)];
            (string Name, string Dll, string[] Args)[] variants = [.. builds.SelectMany(b => new[]
            {
                (Label(b.Item1, "as configured"), b.Item2, options.ServerArgs),
                (Label(b.Item1, variantName), b.Item2, [.. options.ServerArgs, .. options.ColdVariantArgs]),
            })];
            if (options.CompareServerDll is not null) Console.WriteLine($"this = {serverDll}{Environment.NewLine}other = {options.CompareServerDll}");
            var combinations = variants.SelectMany(v => Enum.GetValues<QueryKind>().SelectMany(k => options.ClientCounts.Where(c => c > 1).Select(c => (Variant: v.Name, Kind: k, Clients: c)))).ToArray();
            var rows = combinations.ToDictionary(c => c, _ => new List<(double Start, LoadSample Cold, LoadSample Warm, long Builds)>());
            for (int r = 0; r < options.Repetitions; r++)
            {
                foreach ((string variant, QueryKind kind, int clients) in combinations)
                {
                    long t0 = Stopwatch.GetTimestamp();
                    (_, string dll, string[] args) = variants.First(v => v.Name == variant);
                    using ServerProcess server = await ServerProcess.StartAsync(dll, dataDirectory, args);
                    double startSeconds = Stopwatch.GetElapsedTime(t0).TotalSeconds;
                    using GrpcChannel channel = WarmDataset.Channel(server.Address);
                    var load = new QueryLoad([new StabilityService.StabilityServiceClient(channel)], WarmDataset.Name, warm.Entries.Select(e => e.Id).ToArray(), warm.Candidates);
                    LoadSample cold = await load.RunAsync(kind, clients, 0, TimeSpan.Zero, FirstSecond, seed: r + 1, server);
                    await load.RunAsync(kind, clients, 0, TimeSpan.Zero, options.JitWarmUp, seed: r + 101, server);
                    LoadSample hot = await load.RunAsync(kind, clients, 0, TimeSpan.Zero, options.Window, seed: r + 201, server);
                    CacheStatistics stats = await new DiagnosticsService.DiagnosticsServiceClient(channel).GetCacheStatisticsAsync(new GetCacheStatisticsRequest());
                    server.Stop();
                    rows[(variant, kind, clients)].Add((startSeconds, cold, hot, stats.HullBuilds));
                    Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"rep {r + 1} {variant,-30} {kind,-9} {clients,3} clients: started in {startSeconds:F2} s, first second {FirstRate(cold):N0}/s " +
                        $"(p99 {cold.P99Ms:F1} ms, errors {cold.Errors}, server CPU {CpuPerAnswer(cold, FirstRate(cold)):F0} µs/answer), warm {hot.QueriesPerSecond:N0}/s " +
                        $"({CpuPerAnswer(hot, hot.QueriesPerSecond):F0} µs/answer), ratio {FirstRate(cold) / hot.QueriesPerSecond:F2}, " +
                        $"hulls built {stats.HullBuilds}, load {ProcFiles.LoadAverage1Minute():F2}"));
                    foreach (string warming in server.WarmingLines) Console.WriteLine($"    server: {WarmingSeconds().Match(warming).Value}");
                }
            }

            var text = new StringBuilder();
            text.AppendLine(CultureInfo.InvariantCulture,
                $"### A fresh server's first second against its warm rate ({options.Repetitions} fresh servers per row, medians; warm = {options.Window.TotalSeconds:F0} s after {options.JitWarmUp.TotalSeconds:F0} s of load)");
            text.AppendLine();
            text.AppendLine("| server | query | clients | start to listening, s | first second, queries/s | (min–max) | p99 of the first second's calls, ms | warm, queries/s | first / warm | (min–max) | server CPU per answer, first second / warm, µs | hulls built |");
            text.AppendLine("| --- | --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |");
            foreach (((string variant, QueryKind kind, int clients), var s) in rows)
            {
                double[] ratios = s.Select(x => FirstRate(x.Cold) / x.Warm.QueriesPerSecond).ToArray();
                text.AppendLine(CultureInfo.InvariantCulture,
                    $"| {variant} | {(kind == QueryKind.EntryById ? "entry by id" : "ad-hoc composition")} | {clients} | {Medians.Of(s.Select(x => x.Start)):F2} | " +
                    $"{Medians.Cells(s.Select(x => FirstRate(x.Cold)), "N0")} | {Medians.Of(s.Select(x => x.Cold.P99Ms)):F1} | " +
                    $"{Medians.Of(s.Select(x => x.Warm.QueriesPerSecond)):N0} | {Medians.Cells(ratios, "F2")} | " +
                    $"{Medians.Of(s.Select(x => CpuPerAnswer(x.Cold, FirstRate(x.Cold))).Where(double.IsFinite)):F0} / {Medians.Of(s.Select(x => CpuPerAnswer(x.Warm, x.Warm.QueriesPerSecond))):F0} | " +
                    $"{Medians.Of(s.Select(x => (double)x.Builds)):F0} |");
            }

            text.AppendLine();
            text.AppendLine(CultureInfo.InvariantCulture, $"Target: first / warm ≥ 0.5. Load average at the end {ProcFiles.LoadAverages()}.");
            return text.ToString();
        }
        finally
        {
            try
            {
                Directory.Delete(dataDirectory, recursive: true);
            }
            catch (IOException e)
            {
                Console.Error.WriteLine($"servicebench: could not remove {dataDirectory}: {e.Message}");
            }
        }
    }
}
