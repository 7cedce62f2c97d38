using System.Globalization;
using System.Text;
using Grpc.Net.Client;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>
/// Two server builds side by side under the same load generator: each repetition starts a fresh server of each build
/// (the order alternating), imports and warms the same dataset, lets the JIT settle, then runs every query kind at
/// every client count, asking for the latest version and with the version pinned. Medians per build and the ratio this / other,
/// in queries per second and in the server's CPU time per query: on a shared machine the rate follows whatever else
/// runs, while the CPU a query costs the server moves much less.
/// </summary>
public static class ServerComparison
{
    public static async Task<string> RunAsync(string thisDll, string otherDll, BenchOptions options)
    {
        var builds = new[] { (Name: "this", Dll: thisDll), (Name: "other", Dll: otherDll) };
        var samples = builds.ToDictionary(b => b.Name, _ => new List<LoadSample>());
        for (int r = 0; r < options.Repetitions; r++)
        {
            foreach ((string name, string dll) in r % 2 == 0 ? builds : builds.Reverse())
            {
                string dataDirectory = Path.Combine(Path.GetTempPath(), $"hull-servicebench-ab-{Environment.ProcessId}-{Guid.NewGuid():N}");
                Directory.CreateDirectory(dataDirectory);
                try
                {
                    using ServerProcess server = await ServerProcess.StartAsync(dll, dataDirectory, dll == thisDll ? options.ServerArgs : []);
                    using GrpcChannel channel = WarmDataset.Channel(server.Address);
                    WarmData warm = await WarmDataset.PrepareAsync(channel, options, server);
                    var load = new QueryLoad([new StabilityService.StabilityServiceClient(channel)], WarmDataset.Name, warm.Entries.Select(e => e.Id).ToArray(), warm.Candidates);
                    foreach (QueryKind kind in Enum.GetValues<QueryKind>()) await load.RunAsync(kind, 8, 0, TimeSpan.Zero, options.JitWarmUp, seed: 0, server);
                    foreach (QueryKind kind in Enum.GetValues<QueryKind>())
                    {
                        foreach ((int clients, long version) in options.ClientCounts.SelectMany(c => new[] { (c, 0L), (c, warm.Version) }))
                        {
                            LoadSample s = await load.RunAsync(kind, clients, version, options.WarmUp, options.Window, seed: r + 1, server);
                            samples[name].Add(s);
                            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                                $"rep {r + 1} {name,-5} {kind,-9} {s.VersionMode,-6} {clients,3} clients: {s.QueriesPerSecond,8:N0}/s  p99 {s.P99Ms,6:F2} ms  " +
                                $"server cpu {CpuMicrosecondsPerQuery(s),6:F1} µs/query  other cpu {s.OtherCpuCores:F2}  load {s.LoadAverage1Minute:F2}  errors {s.Errors}{(s.FirstError is null ? "" : $" ({s.FirstError})")}"));
                        }
                    }

                    server.Stop();
                }
                finally
                {
                    Directory.Delete(dataDirectory, recursive: true);
                }
            }
        }

        var text = new StringBuilder();
        text.AppendLine(CultureInfo.InvariantCulture, $"### Two server builds, {options.Repetitions} fresh servers each, interleaved, medians");
        text.AppendLine();
        text.AppendLine(CultureInfo.InvariantCulture, $"this: `{thisDll}`; other: `{otherDll}`.");
        text.AppendLine();
        text.AppendLine("| query | version | clients | other, queries/s | (min–max) | this, queries/s | (min–max) | this / other | p99 other / this, ms | server CPU µs/query, other / this | this / other, CPU per query |");
        text.AppendLine("| --- | --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |");
        foreach (var group in samples["this"].GroupBy(s => (s.Kind, s.VersionMode, s.Clients)))
        {
            LoadSample[] mine = group.ToArray();
            LoadSample[] theirs = samples["other"].Where(s => (s.Kind, s.VersionMode, s.Clients) == group.Key).ToArray();
            double a = Medians.Of(theirs.Select(s => s.QueriesPerSecond)), b = Medians.Of(mine.Select(s => s.QueriesPerSecond));
            double cpuA = Medians.Of(theirs.Select(CpuMicrosecondsPerQuery)), cpuB = Medians.Of(mine.Select(CpuMicrosecondsPerQuery));
            text.AppendLine(CultureInfo.InvariantCulture,
                $"| {(group.Key.Kind == QueryKind.EntryById ? "entry by id" : "ad-hoc composition")} | {group.Key.VersionMode} | {group.Key.Clients} | " +
                $"{Medians.Cells(theirs.Select(s => s.QueriesPerSecond), "N0")} | {Medians.Cells(mine.Select(s => s.QueriesPerSecond), "N0")} | {b / a:F2} | " +
                $"{Medians.Of(theirs.Select(s => s.P99Ms)):F1} / {Medians.Of(mine.Select(s => s.P99Ms)):F1} | {cpuA:F1} / {cpuB:F1} | {cpuB / cpuA:F2} |");
        }

        text.AppendLine();
        text.AppendLine(CultureInfo.InvariantCulture, $"Load average at the end {ProcFiles.LoadAverages()}.");
        return text.ToString();
    }

    // Server CPU seconds per wall second divided by queries per wall second.
    private static double CpuMicrosecondsPerQuery(LoadSample s) => s.ServerCpuCores / s.QueriesPerSecond * 1e6;
}
