using System.Diagnostics;
using System.Net.Http;
using System.Runtime.InteropServices;
using Grpc.Net.Client;
using Hull.Protos.V1;
using Hull.ServiceBench;

// The service benchmark: the real server as a child process on loopback, a warm dataset, closed-loop query load at
// several client counts, a large import, and the server's peak memory. See BenchOptions.Usage.
if (args.Contains("--help") || args.Contains("-h"))
{
    Console.WriteLine(BenchOptions.Usage);
    return 0;
}

if (args.Length == 2 && args[0] == "--summarize-trace")
{
    Console.Write(SpeedscopeSummary.Summarize(args[1], top: 80));
    return 0;
}

string root = RepositoryRoot();
BenchOptions options;
try
{
    options = BenchOptions.Parse(args, root);
}
catch (FormatException e)
{
    Console.Error.WriteLine($"servicebench: {e.Message}");
    return 2;
}

#if DEBUG
const string Configuration = "Debug";
Console.Error.WriteLine("servicebench: warning: a Debug build; measure with -c Release");
#else
const string Configuration = "Release";
#endif
string serverDll = options.ServerDll ?? Path.Combine(root, "src", "Hull.Server", "bin", Configuration, "net10.0", "Hull.Server.dll");
if (!File.Exists(serverDll))
{
    Console.Error.WriteLine($"servicebench: the server is not built at {serverDll}; run `dotnet build -c {Configuration} src/Hull.Server`");
    return 2;
}

if (options.ColdStartOnly)
{
    Console.WriteLine(await ColdStart.RunAsync(serverDll, options));
    return 0;
}

if (options.ClusterScreeningOnly)
{
    Console.WriteLine(await ClusterScreening.RunAsync(serverDll, root, options));
    return 0;
}

if (options.CompareServerDll is not null)
{
    Console.WriteLine(await ServerComparison.RunAsync(serverDll, options.CompareServerDll, options));
    return 0;
}

DateTime started = DateTime.UtcNow;
string loadAtStart = ProcFiles.LoadAverages();
Console.WriteLine($"servicebench: {Environment.ProcessorCount} cores, {ProcFiles.CpuModel()}, load average {loadAtStart}");
string dataDirectory = Path.Combine(Path.GetTempPath(), $"hull-servicebench-{Environment.ProcessId}-{Guid.NewGuid():N}");
Directory.CreateDirectory(dataDirectory);
try
{
    using ServerProcess server = await ServerProcess.StartAsync(serverDll, dataDirectory, options.ServerArgs);
    Console.WriteLine($"server pid {server.ProcessId} on {server.Address} (data {dataDirectory})");
    GrpcChannel[] channels = Enumerable.Range(0, options.Channels).Select(_ => WarmDataset.Channel(server.Address)).ToArray();
    var datasets = new DatasetService.DatasetServiceClient(channels[0]);
    if (options.ImportOnly)
    {
        Console.WriteLine(await ImportComparison.RunAsync(datasets, options, server));
        foreach (GrpcChannel channel in channels) channel.Dispose();
        server.Stop();
        return 0;
    }

    var diagnostics = new DiagnosticsService.DiagnosticsServiceClient(channels[0]);
    StabilityService.StabilityServiceClient[] stability = channels.Select(c => new StabilityService.StabilityServiceClient(c)).ToArray();

    // The warm dataset, imported through the RPC like any client would, and every entry and candidate queried once.
    WarmData warm = await WarmDataset.PrepareAsync(channels[0], options, server);
    List<Entry> warmEntries = warm.Entries;
    List<Candidate> candidates = warm.Candidates;
    ImportSample warmImport = warm.Import;
    long warmVersion = warm.Version;
    double cacheWarmSeconds = warm.CacheWarmSeconds;
    CacheStatistics afterWarming = warm.AfterWarming;
    Console.WriteLine($"warm import: {warmImport.Entries:N0} entries in {warmImport.Seconds:F2} s = {warmImport.EntriesPerSecond:N0}/s");
    Console.WriteLine($"cache warm: {afterWarming.HullBuilds} hulls built in {cacheWarmSeconds:F2} s (version {warmVersion})");

    if (options.OutputFormatsOnly)
    {
        string cliDll = options.CliDll ?? Path.Combine(root, "src", "Hull.Cli", "bin", Configuration, "net10.0", "hull.dll");
        Console.WriteLine(await OutputFormats.RunAsync(cliDll, server.Address, options));
        foreach (GrpcChannel channel in channels) channel.Dispose();
        server.Stop();
        return 0;
    }

    var load = new QueryLoad(stability, WarmDataset.Name, warmEntries.Select(e => e.Id).ToArray(), candidates);
    // A fresh server and client still run first-tier JIT code and compile the hot paths in the background; one
    // unrecorded run of each kind lets that settle before anything is measured.
    foreach (QueryKind kind in Enum.GetValues<QueryKind>())
    {
        await load.RunAsync(kind, 8, 0, TimeSpan.Zero, options.JitWarmUp, seed: 0, server);
    }

    var samples = new List<LoadSample>();
    var versionModes = options.PinnedVersionRuns ? new[] { 0L, warmVersion } : [0L];
    for (int rep = 0; rep < options.Repetitions; rep++)
    {
        foreach (long version in versionModes)
        {
            foreach (QueryKind kind in Enum.GetValues<QueryKind>())
            {
                // The pinned-version runs only compare the lookup's cost under the heaviest load.
                foreach (int clients in version == 0 ? options.ClientCounts : [options.ClientCounts.Max()])
                {
                    LoadSample s = await load.RunAsync(kind, clients, version, options.WarmUp, options.Window, seed: rep + 1, server);
                    samples.Add(s);
                    Console.WriteLine(
                        $"rep {rep + 1} {kind,-9} {s.VersionMode,-6} {clients,3} clients: {s.QueriesPerSecond,8:N0}/s  p50 {s.P50Ms,6:F2} ms  " +
                        $"p99 {s.P99Ms,6:F2} ms  max {s.MaxMs,7:F1} ms  cpu server {s.ServerCpuCores:F2} client {s.ClientCpuCores:F2} " +
                        $"other {s.OtherCpuCores:F2}  load {s.LoadAverage1Minute:F2}  errors {s.Errors}{(s.FirstError is null ? "" : $" ({s.FirstError})")}");
                    if (server.HasExited) throw new InvalidOperationException($"the server died:{Environment.NewLine}{server.LastErrors()}");
                }
            }
        }
    }

    CacheStatistics afterQueries = await diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest());
    double residentAfterQueries = server.ResidentMiB(), peakAfterQueries = server.PeakResidentMiB();
    Console.WriteLine($"server memory after queries: resident {residentAfterQueries:F0} MiB, peak {peakAfterQueries:F0} MiB");

    string? traceNote = null;
    if (options.TraceDirectory is not null)
    {
        string? tool = ProfileCapture.FindTool();
        if (tool is null)
        {
            traceNote = "Trace requested, but dotnet-trace is not installed (`dotnet tool install -g dotnet-trace`).";
        }
        else
        {
            Directory.CreateDirectory(options.TraceDirectory);
            int clients = options.ClientCounts.Max();
            foreach (QueryKind kind in Enum.GetValues<QueryKind>())
            {
                string path = Path.Combine(options.TraceDirectory, $"server-{kind}-{clients}clients.nettrace");
                LoadSample? traced = null;
                string report = await ProfileCapture.CaptureAsync(tool, server.ProcessId, path, TimeSpan.FromSeconds(10), async () =>
                {
                    traced = await load.RunAsync(kind, clients, 0, TimeSpan.FromSeconds(1), TimeSpan.FromSeconds(11), seed: 99, server);
                });
                string summary = $"load under trace: {traced!.QueriesPerSecond:N0}/s, p99 {traced.P99Ms:F2} ms{Environment.NewLine}{report}";
                await File.WriteAllTextAsync(Path.ChangeExtension(path, ".top.txt"), summary);
                Console.WriteLine($"trace {kind}: {path} ({summary.Split('\n')[0]})");
            }

            traceNote = $"Server traces under {clients} clients were written to {options.TraceDirectory} (not committed).";
        }
    }

    // The large import goes into a dataset of its own, after the query runs, so that it cannot disturb them.
    List<Entry> importEntries = new SyntheticOxides(seed: 2).Entries(options.ImportEntries, "i");
    ImportSample bigImport = await ImportRun.RunAsync(datasets, "import", importEntries, options.ImportEntries / options.ImportBatches, server);
    Console.WriteLine($"import: {bigImport.Entries:N0} entries in {bigImport.Batches} batches, {bigImport.Seconds:F2} s = {bigImport.EntriesPerSecond:N0}/s");
    double peakAtEnd = server.PeakResidentMiB();
    Console.WriteLine($"server peak memory (VmHWM): {peakAtEnd:F0} MiB");
    foreach (GrpcChannel channel in channels) channel.Dispose();
    server.Stop();

    var run = new RunRecord
    {
        Options = options,
        StartedUtc = started,
        CpuModel = ProcFiles.CpuModel(),
        ProcessorCount = Environment.ProcessorCount,
        MemoryGiB = ProcFiles.MemoryGiB(),
        RuntimeVersion = RuntimeInformation.FrameworkDescription.Replace(".NET ", string.Empty, StringComparison.Ordinal),
        LoadAveragesAtStart = loadAtStart,
        LoadAveragesAtEnd = ProcFiles.LoadAverages(),
        WarmImport = warmImport,
        CacheWarmSeconds = cacheWarmSeconds,
        HullsBuiltWarming = afterWarming.HullBuilds,
        HullsBuiltDuringQueries = afterQueries.HullBuilds - afterWarming.HullBuilds,
        Samples = samples,
        BigImport = bigImport,
        ResidentAfterQueriesMiB = residentAfterQueries,
        PeakAfterQueriesMiB = peakAfterQueries,
        PeakAtEndMiB = peakAtEnd,
        TraceNote = traceNote,
    };
    string markdown = ResultsReport.Markdown(run);
    Console.WriteLine();
    Console.WriteLine(markdown);
    if (options.OutputPath is not null)
    {
        ResultsReport.WriteInto(options.OutputPath, markdown);
        Console.WriteLine($"written to {options.OutputPath}");
    }

    return 0;
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

// The folder holding Hull.sln, found upwards from the benchmark's binaries.
static string RepositoryRoot()
{
    for (DirectoryInfo? dir = new(AppContext.BaseDirectory); dir is not null; dir = dir.Parent)
    {
        if (File.Exists(Path.Combine(dir.FullName, "Hull.sln"))) return dir.FullName;
    }

    throw new InvalidOperationException($"no Hull.sln above {AppContext.BaseDirectory}");
}
