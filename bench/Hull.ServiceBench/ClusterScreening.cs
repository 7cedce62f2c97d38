using System.Diagnostics;
using System.Globalization;
using System.Net;
using System.Net.Sockets;
using System.Text;
using Grpc.Net.Client;
using Hull.Bench.Data;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>A way to run the screening: how many servers, and whether they form a cluster.</summary>
public sealed record ScreeningSetup(string Name, int Servers, bool Clustered);

/// <summary>
/// One pass of the screening over one setup. CPU seconds are user + system of each server process over the pass;
/// idle CPU is what each server spent per second while nobody called it (a cluster member's heartbeats and probes).
/// </summary>
public sealed record ScreeningPass(
    ScreeningSetup Setup, int Repetition, string Pass, int Queries, double WallSeconds, double[] ServerCpuSeconds, double ClientCpuSeconds,
    double MachineBusyCpuSeconds, double IdleCpuMsPerServerSecond, long CacheHullBuilds, long GrainHullBuilds, int Mismatches, string Load)
{
    public double QueriesPerSecond => Queries / WallSeconds;

    /// <summary>All servers' CPU seconds per 1e4 queries.</summary>
    public double CpuPer1e4 => ServerCpuSeconds.Sum() / Queries * 1e4;
}

/// <summary>
/// The screening run of the cluster benchmark: the generated 60-element dataset (1e5 entries, total energies) in one
/// PostgreSQL store, and 1e5 ad-hoc compositions drawn over its chemical systems asked as hull energies in requests
/// of 1,000, spread round-robin over the servers of a setup: one server alone, one cluster member, three cluster
/// members. Each setup's servers start fresh (no startup warming), so the first pass builds every hull it needs and
/// the second finds them held. The setups run interleaved, repetition by repetition, and every answer is compared
/// with the lone server's, bit for bit.
/// </summary>
public static class ClusterScreening
{
    public const string Dataset = "screen60";
    private const int Elements = 60;
    private const int RequestSize = 1_000;
    private const int RequestsInFlightPerServer = 4;
    private static readonly TimeSpan CallDeadline = TimeSpan.FromMinutes(10);
    private static readonly TimeSpan IdleWindow = TimeSpan.FromSeconds(5);

    // Every server keeps every hull the run builds, as a system's grain keeps its own: the default cache of 512 hulls
    // would rebuild most of a many-system run's hulls in its second pass on a lone server, but not in a cluster.
    private const int MaxCachedHulls = 200_000;

    public static async Task<string> RunAsync(string serverDll, string repositoryRoot, BenchOptions options)
    {
        string loadAtStart = ProcFiles.LoadAverages();
        DateTime started = DateTime.UtcNow;
        string? throwaway = null;
        string connection = options.PostgresConnection ?? string.Empty;
        if (options.PostgresConnection is null)
        {
            throwaway = Path.Combine(Path.GetTempPath(), $"hull-screening-pg-{Environment.ProcessId}");
            connection = Script(repositoryRoot, "start", throwaway);
        }

        try
        {
            string store = $"{connection};Search Path=screening_{Environment.ProcessId}";
            int entryCount = options.Quick ? 20_000 : 100_000;
            int queries = options.ScreeningQueries ?? (options.Quick ? 10_000 : 100_000);
            IReadOnlyList<DatasetRow> rows = DatasetGenerator.Generate(Elements, entryCount, EnergyDistribution.Sparse, seed: 60_001);
            List<Entry> entries = [.. rows.Select(ToEntry)];
            string[] formulas = Compositions(rows, queries, seed: 5);
            int systems = formulas.Select(SystemOf).Distinct().Count();
            Console.WriteLine($"screening: {entries.Count:N0} entries, {queries:N0} compositions over {systems:N0} chemical systems; load {loadAtStart}");

            // The store's write rate, through a lone server: one session of every entry (the dataset the passes read),
            // then one version per call of 1,000 entries into a second dataset.
            ImportSample session, perCall;
            using (ServerProcess importer = await StartAsync(serverDll, store, null))
            using (GrpcChannel channel = WarmDataset.Channel(importer.Address))
            {
                var datasets = new DatasetService.DatasetServiceClient(channel);
                session = await ImportRun.RunSessionAsync(datasets, Dataset, entries, 5_000, importer);
                perCall = await ImportRun.RunAsync(datasets, "screen-writes", entries.Take(options.Quick ? 5_000 : 20_000).ToList(), 1_000, importer);
                importer.Stop();
            }

            Console.WriteLine($"store writes: session {session.EntriesPerSecond:N0} entries/s; per call {perCall.Batches / perCall.Seconds:F1} versions/s");
            ScreeningSetup[] setups = [.. new ScreeningSetup[] { new("lone server", 1, false), new("1 cluster member", 1, true), new("3 cluster members", 3, true) }
                .Where(s => options.ScreeningSetups is null || options.ScreeningSetups.Contains(s.Clustered ? s.Servers : 0))];
            double[]? reference = null;
            var passes = new List<ScreeningPass>();
            for (int rep = 0; rep < options.Repetitions; rep++)
            {
                foreach (ScreeningSetup setup in setups)
                {
                    (List<ScreeningPass> done, double[] energies) = await RunSetupAsync(serverDll, store, setup, rep, formulas, reference);
                    reference ??= energies;
                    passes.AddRange(done);
                    foreach (ScreeningPass p in done)
                    {
                        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                            $"  rep {rep + 1} {setup.Name}, {p.Pass}: {p.WallSeconds:F1} s, {p.QueriesPerSecond:N0} q/s, servers' CPU {p.ServerCpuSeconds.Sum():F1} s " +
                            $"({string.Join(" + ", p.ServerCpuSeconds.Select(c => c.ToString("F1", CultureInfo.InvariantCulture)))}), hull builds {p.CacheHullBuilds}, " +
                            $"grain builds {p.GrainHullBuilds}, mismatches {p.Mismatches}, load {p.Load}"));
                    }
                }
            }

            return Report(passes, setups, session, perCall, entries.Count, queries, systems, started, loadAtStart, options);
        }
        finally
        {
            if (throwaway is not null)
            {
                Script(repositoryRoot, "stop", throwaway);
                Directory.Delete(throwaway, recursive: true);
            }
        }
    }

    private static async Task<(List<ScreeningPass> Passes, double[] Energies)> RunSetupAsync(
        string serverDll, string store, ScreeningSetup setup, int rep, string[] formulas, double[]? reference)
    {
        string cluster = $"screen-{Environment.ProcessId}-{rep}-{setup.Servers}";
        ServerProcess[] servers = await Task.WhenAll(Enumerable.Range(0, setup.Servers).Select(_ => StartAsync(serverDll, store, setup.Clustered ? cluster : null)));
        GrpcChannel[] channels = [.. servers.Select(s => WarmDataset.Channel(s.Address))];
        try
        {
            var diagnostics = channels.Select(c => new DiagnosticsService.DiagnosticsServiceClient(c)).ToArray();
            if (setup.Clustered) await WaitForMembersAsync(diagnostics, setup.Servers);
            double[] idle0 = servers.Select(s => s.CpuSeconds()).ToArray();
            await Task.Delay(IdleWindow);
            double idleMs = servers.Select((s, i) => s.CpuSeconds() - idle0[i]).Average() / IdleWindow.TotalSeconds * 1000;
            var stability = channels.Select(c => new StabilityService.StabilityServiceClient(c)).ToArray();
            var passes = new List<ScreeningPass>();
            double[] energies = [];
            foreach (string pass in new[] { "first (builds)", "second (held)" })
            {
                double[] cpu0 = servers.Select(s => s.CpuSeconds()).ToArray();
                double client0 = Process.GetCurrentProcess().TotalProcessorTime.TotalSeconds;
                double machine0 = ProcFiles.MachineBusyCpuSeconds();
                long start = Stopwatch.GetTimestamp();
                energies = await ScreenAsync(stability, formulas);
                double wall = Stopwatch.GetElapsedTime(start).TotalSeconds;
                double[] cpu = servers.Select((s, i) => s.CpuSeconds() - cpu0[i]).ToArray();
                double client = Process.GetCurrentProcess().TotalProcessorTime.TotalSeconds - client0;
                double machine = ProcFiles.MachineBusyCpuSeconds() - machine0;
                long cacheBuilds = 0, grainBuilds = 0;
                foreach (DiagnosticsService.DiagnosticsServiceClient d in diagnostics)
                {
                    cacheBuilds += (await d.GetCacheStatisticsAsync(new GetCacheStatisticsRequest())).HullBuilds;
                    grainBuilds += (await d.GetServerHealthAsync(new GetServerHealthRequest())).GrainHullBuilds;
                }

                int mismatches = reference is null ? 0 : energies.Where((e, i) => BitConverter.DoubleToInt64Bits(e) != BitConverter.DoubleToInt64Bits(reference[i])).Count();
                passes.Add(new ScreeningPass(setup, rep, pass, formulas.Length, wall, cpu, client, machine, idleMs, cacheBuilds, grainBuilds, mismatches,
                    ProcFiles.LoadAverages()));
            }

            return (passes, energies);
        }
        catch (Exception)
        {
            for (int i = 0; i < servers.Length; i++)
            {
                Console.Error.WriteLine($"-- server {i} ({(servers[i].HasExited ? "exited" : "running")}), its last log lines:");
                Console.Error.WriteLine(servers[i].LastErrors());
            }

            throw;
        }
        finally
        {
            foreach (GrpcChannel channel in channels) channel.Dispose();
            foreach (ServerProcess server in servers) server.Dispose();
        }
    }

    /// <summary>Every formula once, in requests of 1,000 sent round-robin, a few in flight per server; the hull energies in order.</summary>
    private static async Task<double[]> ScreenAsync(StabilityService.StabilityServiceClient[] servers, string[] formulas)
    {
        var energies = new double[formulas.Length];
        int requests = (formulas.Length + RequestSize - 1) / RequestSize;
        int next = -1;
        async Task Worker()
        {
            for (int r = Interlocked.Increment(ref next); r < requests; r = Interlocked.Increment(ref next))
            {
                var request = new GetHullEnergiesRequest { Dataset = Dataset };
                int from = r * RequestSize;
                int count = Math.Min(RequestSize, formulas.Length - from);
                request.Formulas.AddRange(formulas.Skip(from).Take(count));
                GetHullEnergiesResponse response = await servers[r % servers.Length].GetHullEnergiesAsync(request, deadline: DateTime.UtcNow + CallDeadline);
                for (int i = 0; i < count; i++) energies[from + i] = response.Results[i].HullEnergyEvPerAtom;
            }
        }

        await Task.WhenAll(Enumerable.Range(0, RequestsInFlightPerServer * servers.Length).Select(_ => Task.Run(Worker)));
        return energies;
    }

    private static async Task WaitForMembersAsync(DiagnosticsService.DiagnosticsServiceClient[] members, int expected)
    {
        for (int attempt = 0; attempt < 120; attempt++)
        {
            bool all = true;
            foreach (DiagnosticsService.DiagnosticsServiceClient m in members)
            {
                ServerHealth health = await m.GetServerHealthAsync(new GetServerHealthRequest());
                all &= health.ActiveMembers == expected && health.MemberStatus == "ACTIVE";
            }

            if (all) return;
            await Task.Delay(500);
        }

        throw new InvalidOperationException($"the {expected} members did not all see each other as active within a minute");
    }

    private static Task<ServerProcess> StartAsync(string serverDll, string store, string? cluster)
    {
        var args = new List<string> { "--postgres", store, "--port", "0", "--host", "127.0.0.1", "--warm-hulls", "0", "--warm-before-ready", "0",
            "--max-cached-hulls", MaxCachedHulls.ToString(CultureInfo.InvariantCulture) };
        if (cluster is not null) args.AddRange(["--cluster", cluster, "--peer-port", FreePort(), "--gateway-port", FreePort()]);
        return ServerProcess.StartWithArgumentsAsync(serverDll, args);
    }

    private static string FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port.ToString(CultureInfo.InvariantCulture);
    }

    private static Entry ToEntry(DatasetRow row) => new()
    {
        Id = row.Id,
        Formula = Formula(row.Elements, row.Amounts),
        EnergyEv = row.TotalEnergyEvPerFormulaUnit,
        Basis = EnergyBasis.TotalPerFormulaUnit,
    };

    /// <summary>Ad-hoc compositions: the elements of a random compound of the dataset, in new random amounts (1 to 6 each).</summary>
    private static string[] Compositions(IReadOnlyList<DatasetRow> rows, int count, int seed)
    {
        var rng = new Random(seed);
        DatasetRow[] compounds = [.. rows.Where(r => r.Elements.Length > 1)];
        return [.. Enumerable.Range(0, count).Select(_ =>
        {
            DatasetRow row = compounds[rng.Next(compounds.Length)];
            return Formula(row.Elements, [.. row.Elements.Select(_ => (long)(1 + rng.Next(6)))]);
        })];
    }

    private static string Formula(string[] elements, long[] amounts) =>
        string.Concat(elements.Select((e, i) => amounts[i] == 1 ? e : e + amounts[i].ToString(CultureInfo.InvariantCulture)));

    private static string SystemOf(string formula) =>
        string.Join('-', System.Text.RegularExpressions.Regex.Matches(formula, "[A-Z][a-z]?").Select(m => m.Value).Order(StringComparer.Ordinal));

    private static string Script(string root, string action, string directory)
    {
        var start = new ProcessStartInfo("bash") { RedirectStandardOutput = true, UseShellExecute = false };
        foreach (string a in new[] { Path.Combine(root, "scripts", "postgres-throwaway.sh"), action, directory }) start.ArgumentList.Add(a);
        using Process process = Process.Start(start)!;
        string output = process.StandardOutput.ReadToEnd().Trim();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"postgres-throwaway.sh {action} failed ({process.ExitCode})");
        return output;
    }

    private static string Report(List<ScreeningPass> passes, ScreeningSetup[] setups, ImportSample session, ImportSample perCall, int entries, int queries,
        int systems, DateTime started, string loadAtStart, BenchOptions options)
    {
        IFormatProvider inv = CultureInfo.InvariantCulture;
        var sb = new StringBuilder();
        sb.AppendLine(string.Create(inv, $"Screening run, {started:yyyy-MM-dd HH:mm} UTC, {Environment.ProcessorCount} cores ({ProcFiles.CpuModel()}), load at start {loadAtStart}, " +
            $"{options.Repetitions} repetitions interleaved: {entries:N0} entries over {Elements} elements in PostgreSQL, {queries:N0} compositions over {systems:N0} chemical systems, " +
            $"requests of {RequestSize:N0} formulas, {RequestsInFlightPerServer} in flight per server; servers started with --warm-hulls 0 --warm-before-ready 0 " +
            $"--max-cached-hulls {MaxCachedHulls:N0}."));
        sb.AppendLine();
        sb.AppendLine("| setup | pass | wall [s] | q/s | servers' CPU [s] per 1e4 q | min–max | each server's CPU [s] per 1e4 q | CPU vs lone | client CPU [s] | machine busy [s] | idle CPU [ms/s per server] | hull builds (grain) | answers differing | load after |");
        sb.AppendLine("|---|---|---:|---:|---:|---:|---|---:|---:|---:|---:|---:|---:|---|");
        foreach (string pass in passes.Select(p => p.Pass).Distinct())
        {
            double lone = Medians.Of(passes.Where(p => p.Pass == pass && p.Setup == setups[0]).Select(p => p.CpuPer1e4));
            foreach (ScreeningSetup setup in setups)
            {
                ScreeningPass[] runs = [.. passes.Where(p => p.Setup == setup && p.Pass == pass)];
                string each = string.Join(" / ", Enumerable.Range(0, setup.Servers).Select(i =>
                    Medians.Of(runs.Select(r => r.ServerCpuSeconds[i] / r.Queries * 1e4)).ToString("F2", inv)));
                sb.AppendLine(string.Create(inv,
                    $"| {setup.Name} | {pass} | {Medians.Of(runs.Select(r => r.WallSeconds)):F1} | {Medians.Of(runs.Select(r => r.QueriesPerSecond)):N0} | " +
                    $"{Medians.Cells(runs.Select(r => r.CpuPer1e4), "F2")} | {each} | {Medians.Of(runs.Select(r => r.CpuPer1e4)) / lone:F2} | " +
                    $"{Medians.Of(runs.Select(r => r.ClientCpuSeconds)):F1} | {Medians.Of(runs.Select(r => r.MachineBusyCpuSeconds)):F1} | " +
                    $"{Medians.Of(runs.Select(r => r.IdleCpuMsPerServerSecond)):F0} | {Medians.Of(runs.Select(r => (double)r.CacheHullBuilds)):F0} ({Medians.Of(runs.Select(r => (double)r.GrainHullBuilds)):F0}) | " +
                    $"{runs.Sum(r => r.Mismatches)} | {string.Join("; ", runs.Select(r => r.Load))} |"));
            }
        }

        sb.AppendLine();
        sb.AppendLine("Medians over the repetitions. CPU is user + system of the server processes over the pass; 'each server's' is per member. " +
            "Hull builds are cumulative since the servers started, summed over the servers (in brackets: builds made as a system's grain).");
        sb.AppendLine();
        sb.AppendLine(string.Create(inv,
            $"Store writes through one server: one import session of {session.Entries:N0} entries in {session.Seconds:F1} s = {session.EntriesPerSecond:N0} entries/s " +
            $"(server {session.ServerCpuCores:F2} cores busy); {perCall.Batches} versions of 1,000 entries one call each in {perCall.Seconds:F1} s = " +
            $"{perCall.Batches / perCall.Seconds:F1} versions/s ({perCall.EntriesPerSecond:N0} entries/s)."));
        return sb.ToString();
    }
}
