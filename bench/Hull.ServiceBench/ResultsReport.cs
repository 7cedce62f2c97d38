using System.Globalization;
using System.Text;

namespace Hull.ServiceBench;

/// <summary>Everything one benchmark run measured.</summary>
public sealed record RunRecord
{
    public required BenchOptions Options { get; init; }
    public required DateTime StartedUtc { get; init; }
    public required string CpuModel { get; init; }
    public required int ProcessorCount { get; init; }
    public required double MemoryGiB { get; init; }
    public required string RuntimeVersion { get; init; }
    public required string LoadAveragesAtStart { get; init; }
    public required string LoadAveragesAtEnd { get; init; }
    public required ImportSample WarmImport { get; init; }
    public required double CacheWarmSeconds { get; init; }
    public required long HullsBuiltWarming { get; init; }
    public required long HullsBuiltDuringQueries { get; init; }
    public required IReadOnlyList<LoadSample> Samples { get; init; }
    public required ImportSample BigImport { get; init; }
    public required double ResidentAfterQueriesMiB { get; init; }
    public required double PeakAfterQueriesMiB { get; init; }
    public required double PeakAtEndMiB { get; init; }
    public string? TraceNote { get; init; }
}

/// <summary>The run as markdown: method, query table with medians, targets met or missed, import, memory.</summary>
public static class ResultsReport
{
    public const string BeginMarker = "<!-- results:begin (written by bench/Hull.ServiceBench; text outside the markers is kept) -->";
    public const string EndMarker = "<!-- results:end -->";

    /// <summary>Writes the report between the markers of <paramref name="path"/>, keeping the rest of the file.</summary>
    public static void WriteInto(string path, string report)
    {
        string block = BeginMarker + "\n" + report.TrimEnd() + "\n" + EndMarker;
        string existing = File.Exists(path) ? File.ReadAllText(path) : "# Service benchmark\n\n" + BeginMarker + "\n" + EndMarker + "\n";
        int begin = existing.IndexOf(BeginMarker, StringComparison.Ordinal);
        int end = existing.IndexOf(EndMarker, StringComparison.Ordinal);
        string updated = begin >= 0 && end > begin
            ? existing[..begin] + block + existing[(end + EndMarker.Length)..]
            : existing.TrimEnd() + "\n\n" + block + "\n";
        File.WriteAllText(path, updated);
    }

    public static string Markdown(RunRecord run)
    {
        BenchOptions o = run.Options;
        var md = new StringBuilder();
        void Line(string text = "") => md.Append(text).Append('\n');
        string reps = o.Repetitions == 1 ? "1 repetition" : $"medians over {o.Repetitions} repetitions";

        Line($"## Run of {run.StartedUtc:yyyy-MM-dd HH:mm} UTC{(o.Quick ? " (quick smoke run, not a measurement)" : string.Empty)}");
        Line();
        Line($"- Machine: {run.ProcessorCount} cores (`nproc`), {run.CpuModel}, {run.MemoryGiB:F0} GiB; .NET {run.RuntimeVersion}, Release builds.");
        Line($"- Load average (1, 5, 15 min) at start {run.LoadAveragesAtStart}, at end {run.LoadAveragesAtEnd}. The machine is shared with " +
             "other sessions; the \"other CPU\" column is what every other process used during each window (from /proc/stat).");
        Line("- Server: `dotnet src/Hull.Server/bin/Release/net10.0/Hull.Server.dll --port 0 --data-dir <temp>` as a separate child " +
             "process (Kestrel HTTP/2, plain text, 127.0.0.1; SQLite store in a temporary folder; default options and log level). " +
             "The load generator is a second process on the same machine: **server and clients share the same 2 cores.**");
        Line($"- Warm dataset: {o.WarmEntries:N0} invented entries over 5 quaternary oxide families (Li-Mn-Ni-O, Na-Fe-P-O, Mg-Al-Si-O, " +
             "Ca-Ti-Zr-O, K-V-W-O; elements, binary, ternary and quaternary compounds), imported through ImportEntries in batches " +
             $"of 1,000, then every entry queried once so that every chemical system's hull is built and cached " +
             $"({run.HullsBuiltWarming} hulls built in {run.CacheWarmSeconds:F1} s).");
        Line("- One query = GetEntryStability with one random stored id, or AssessCandidates with one random ad-hoc composition and " +
             $"energy (from a pool of {o.CandidatePool:N0}); dataset version 0 (\"latest\", as clients usually ask) unless marked pinned.");
        Line($"- Each client is its own sequential loop (send, await, send the next); the clients share {o.Channels} GrpcChannel" +
             $"{(o.Channels == 1 ? string.Empty : "s")} (HTTP/2 multiplexes the calls on one connection; Kestrel allows 100 streams per " +
             "connection, so 64 clients fit on one), as one application process with many concurrent users would. Per-call " +
             "latency from Stopwatch timestamps around each awaited call, at the client (includes client-side serialisation and " +
             $"scheduling). First one unrecorded {o.JitWarmUp.TotalSeconds:0.#} s run of each kind at 8 clients (the JIT settles); then " +
             $"{o.WarmUp.TotalSeconds:0.#} s warm-up and {o.Window.TotalSeconds:0.#} s measured per run; {reps}; " +
             $"runs interleaved (repetition outermost) so that a burst of outside load does not hit one configuration only.");
        Line($"- Hull builds during the query runs: {run.HullsBuiltDuringQueries} (every query answered from the cache).");
        Line();

        Line("### Queries");
        Line();
        Line("| query | version | clients | queries/s | (min–max) | p50 ms | p99 ms | max ms | server CPU (cores) | client CPU | other CPU | errors |");
        Line("| --- | --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |");
        foreach (var group in Groups(run.Samples))
        {
            LoadSample[] s = group.ToArray();
            Line($"| {Name(s[0].Kind)} | {s[0].VersionMode} | {s[0].Clients} | {Median(s, x => x.QueriesPerSecond):N0} | " +
                 $"{s.Min(x => x.QueriesPerSecond):N0}–{s.Max(x => x.QueriesPerSecond):N0} | {Median(s, x => x.P50Ms):F2} | " +
                 $"{Median(s, x => x.P99Ms):F2} | {Median(s, x => x.MaxMs):F1} | {Median(s, x => x.ServerCpuCores):F2} | " +
                 $"{Median(s, x => x.ClientCpuCores):F2} | {Median(s, x => x.OtherCpuCores):F2} | {s.Sum(x => x.Errors)}" +
                 $"{(s.FirstOrDefault(x => x.FirstError is not null)?.FirstError is { } e ? $" ({e})" : string.Empty)} |");
        }

        Line();
        Line("### Targets (2 cores; version \"latest\")");
        Line();
        Line("| target | measured | verdict |");
        Line("| --- | ---: | --- |");
        foreach (var group in Groups(run.Samples.Where(x => x.VersionMode == "latest")))
        {
            LoadSample[] s = group.ToArray();
            int clients = s[0].Clients;
            if (ServiceTargets.HasThroughputTarget(clients))
            {
                double qps = Median(s, x => x.QueriesPerSecond);
                Line($"| {Name(s[0].Kind)}, {clients} clients: ≥ {ServiceTargets.MinQueriesPerSecond:N0} queries/s | {qps:N0}/s | " +
                     (qps >= ServiceTargets.MinQueriesPerSecond
                         ? $"met ({Percent(qps / ServiceTargets.MinQueriesPerSecond - 1)} above)"
                         : $"**missed**: {ServiceTargets.MinQueriesPerSecond - qps:N0}/s ({Percent(1 - qps / ServiceTargets.MinQueriesPerSecond)}) short") + " |");
            }

            if (ServiceTargets.MaxP99Ms(clients) is { } bound)
            {
                double p99 = Median(s, x => x.P99Ms);
                Line($"| {Name(s[0].Kind)}, {clients} clients: p99 ≤ {bound:0} ms | {p99:F2} ms | " +
                     (p99 <= bound
                         ? $"met (p99 is {Percent(p99 / bound)} of the bound)"
                         : $"**missed** by {p99 - bound:F1} ms ({Percent(p99 / bound - 1)} over)") + " |");
            }
        }

        Line();
        Line("### Import (ImportEntries, one call = one batch = one new version, calls one after another)");
        Line();
        Line("| import | entries | batches | seconds | entries/s | first tenth, entries/s | last tenth, entries/s | batch p50 ms | batch max ms | server CPU (cores) |");
        Line("| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |");
        foreach ((string name, ImportSample i) in new[] { ("warm dataset", run.WarmImport), ("large import", run.BigImport) })
        {
            Line($"| {name} | {i.Entries:N0} | {i.Batches} | {i.Seconds:F1} | {i.EntriesPerSecond:N0} | {i.FirstTenthEntriesPerSecond:N0} | " +
                 $"{i.LastTenthEntriesPerSecond:N0} | {i.BatchP50Ms:F1} | {i.BatchMaxMs:F1} | {i.ServerCpuCores:F2} |");
        }

        Line();
        Line("Whole pipeline: the client builds each 1,000-row message, sends it over loopback; the server validates every row, " +
             "writes the batch in one SQLite transaction (WAL) as a new version and answers.");
        Line();
        Line("### Server memory (/proc/PID/status)");
        Line();
        Line($"- After the query runs: resident {run.ResidentAfterQueriesMiB:F0} MiB, peak (VmHWM) {run.PeakAfterQueriesMiB:F0} MiB.");
        Line($"- Peak over the whole run, including the {run.BigImport.Entries:N0}-entry import (VmHWM before stopping the server): " +
             $"{run.PeakAtEndMiB:F0} MiB.");
        if (run.TraceNote is not null)
        {
            Line();
            Line(run.TraceNote);
        }

        return md.ToString();
    }

    private static IEnumerable<IGrouping<(QueryKind, string, int), LoadSample>> Groups(IEnumerable<LoadSample> samples) =>
        samples.GroupBy(s => (s.Kind, s.VersionMode, s.Clients))
            .OrderBy(g => g.Key.Item2 == "latest" ? 0 : 1).ThenBy(g => g.Key.Item1).ThenBy(g => g.Key.Item3);

    private static string Name(QueryKind kind) => kind == QueryKind.EntryById ? "entry by id" : "ad-hoc composition";

    private static double Median(IEnumerable<LoadSample> samples, Func<LoadSample, double> value) => Medians.Of(samples.Select(value));

    private static string Percent(double fraction) => (fraction * 100).ToString("F0", CultureInfo.InvariantCulture) + " %";
}
