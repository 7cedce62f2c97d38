using System.Diagnostics;
using System.Globalization;

namespace Hull.ServiceBench;

/// <summary>
/// Samples the server's stacks with dotnet-trace (EventPipe sample profiler) while a load runs, then sums the
/// sampled stacks into the top frames by inclusive and exclusive busy time (see <see cref="SpeedscopeSummary"/>).
/// The tracer shares the two cores, so runs under a trace are for finding where time goes, never reported as
/// throughput.
/// </summary>
public static class ProfileCapture
{
    /// <summary>dotnet-trace from the global tools folder or PATH; null when it is not installed.</summary>
    public static string? FindTool()
    {
        string home = Environment.GetEnvironmentVariable("HOME") ?? "/root";
        string global = Path.Combine(home, ".dotnet", "tools", "dotnet-trace");
        if (File.Exists(global)) return global;
        foreach (string dir in (Environment.GetEnvironmentVariable("PATH") ?? string.Empty).Split(':'))
        {
            string candidate = Path.Combine(dir, "dotnet-trace");
            if (dir.Length > 0 && File.Exists(candidate)) return candidate;
        }

        return null;
    }

    /// <summary>
    /// Traces process <paramref name="pid"/> for <paramref name="duration"/> into <paramref name="nettracePath"/> (plus a
    /// speedscope file beside it) while <paramref name="load"/> runs; returns the busy-time summary of the frames.
    /// </summary>
    public static async Task<string> CaptureAsync(string tool, int pid, string nettracePath, TimeSpan duration, Func<Task> load)
    {
        string durationText = duration.ToString(@"dd\:hh\:mm\:ss", CultureInfo.InvariantCulture);
        Task<string> trace = RunAsync(tool,
            ["collect", "-p", pid.ToString(CultureInfo.InvariantCulture), "--format", "Speedscope", "--duration", durationText, "-o", nettracePath]);
        await load();
        await trace;
        return SpeedscopeSummary.Summarize(Path.ChangeExtension(nettracePath, ".speedscope.json"), top: 80);
    }

    private static async Task<string> RunAsync(string tool, string[] arguments)
    {
        var start = new ProcessStartInfo(tool)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
        foreach (string a in arguments) start.ArgumentList.Add(a);
        using Process process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {tool}");
        Task<string> output = process.StandardOutput.ReadToEndAsync();
        Task<string> error = process.StandardError.ReadToEndAsync();
        using var timeout = new CancellationTokenSource(TimeSpan.FromMinutes(5));
        await process.WaitForExitAsync(timeout.Token);
        string text = await output + await error;
        if (process.ExitCode != 0) throw new InvalidOperationException($"{tool} {string.Join(' ', arguments)} failed ({process.ExitCode}): {text}");
        return text;
    }
}
