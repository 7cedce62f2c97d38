using System.Globalization;
using System.Text;
using Hull.Protos.V1;

namespace Hull.ServiceBench;

/// <summary>
/// The two ways to import one large file, side by side on one server: one ImportEntries call per batch (a version
/// each) and one import session (StageEntries per batch, one version at the commit). Repetitions alternate which
/// goes first, so that a burst of outside load does not favour one; medians and the session/calls ratio are reported.
/// </summary>
public static class ImportComparison
{
    public static async Task<string> RunAsync(DatasetService.DatasetServiceClient datasets, BenchOptions options, ServerProcess server)
    {
        List<Entry> entries = new SyntheticOxides(seed: 2).Entries(options.ImportEntries, "i");
        int batchSize = options.ImportEntries / options.ImportBatches;
        // One unrecorded round of each, so that the JIT has settled on both paths.
        await ImportRun.RunAsync(datasets, "warm-calls", entries, batchSize, server);
        await ImportRun.RunSessionAsync(datasets, "warm-session", entries, batchSize, server);
        var calls = new List<ImportSample>();
        var sessions = new List<ImportSample>();
        for (int r = 0; r < options.Repetitions; r++)
        {
            async Task Calls() => calls.Add(await ImportRun.RunAsync(datasets, $"calls-{r}", entries, batchSize, server));
            async Task Session() => sessions.Add(await ImportRun.RunSessionAsync(datasets, $"session-{r}", entries, batchSize, server));
            if (r % 2 == 0)
            {
                await Calls();
                await Session();
            }
            else
            {
                await Session();
                await Calls();
            }
            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"repetition {r + 1}: calls {calls[^1].EntriesPerSecond:N0}/s, session {sessions[^1].EntriesPerSecond:N0}/s (load {ProcFiles.LoadAverage1Minute():F2})"));
        }

        var text = new StringBuilder();
        text.AppendLine(CultureInfo.InvariantCulture, $"### Import: {entries.Count:N0} entries in {options.ImportBatches} batches, {options.Repetitions} repetitions, medians");
        text.AppendLine();
        text.AppendLine("| import | versions made | entries/s | (min–max) | batch p50 ms | batch max ms | server CPU (cores) |");
        text.AppendLine("| --- | ---: | ---: | ---: | ---: | ---: | ---: |");
        foreach ((string name, List<ImportSample> samples, int versions) in new[] { ("a call per batch", calls, options.ImportBatches), ("one session", sessions, 1) })
        {
            text.AppendLine(CultureInfo.InvariantCulture,
                $"| {name} | {versions} | {Medians.Of(samples.Select(s => s.EntriesPerSecond)):N0} | {samples.Min(s => s.EntriesPerSecond):N0}–{samples.Max(s => s.EntriesPerSecond):N0} | " +
                $"{Medians.Of(samples.Select(s => s.BatchP50Ms)):F1} | {Medians.Of(samples.Select(s => s.BatchMaxMs)):F1} | {Medians.Of(samples.Select(s => s.ServerCpuCores)):F2} |");
        }
        double ratio = Medians.Of(sessions.Select(s => s.EntriesPerSecond)) / Medians.Of(calls.Select(s => s.EntriesPerSecond));
        text.AppendLine();
        text.AppendLine(CultureInfo.InvariantCulture, $"Session rate / per-call rate (medians): {ratio:F3}; load average at the end {ProcFiles.LoadAverages()}.");
        return text.ToString();
    }
}
