using System.Diagnostics;
using System.Globalization;
using System.Text;

namespace Hull.ServiceBench;

/// <summary>
/// The whole-dataset analysis as a user runs it: `hull analyze warm --json` against `--csv`, each a fresh CLI process
/// calling the bench's server, timed from process start to exit with its whole output read. Repetitions alternate
/// which format goes first; medians, the JSON/CSV ratio and the output sizes are reported.
/// </summary>
public static class OutputFormats
{
    private static readonly string[] Formats = ["--json", "--csv"];

    public static async Task<string> RunAsync(string cliDll, Uri server, BenchOptions options)
    {
        // One unrecorded run of each, so that the files and the server's cached analysis path are warm for both.
        foreach (string format in Formats) await TimeAsync(cliDll, server, format);
        var seconds = Formats.ToDictionary(f => f, _ => new List<double>());
        var cpu = Formats.ToDictionary(f => f, _ => new List<double>());
        var bytes = new Dictionary<string, long>();
        for (int r = 0; r < options.Repetitions; r++)
        {
            foreach (string format in r % 2 == 0 ? Formats : Formats.Reverse())
            {
                (double s, double c, long b) = await TimeAsync(cliDll, server, format);
                seconds[format].Add(s);
                cpu[format].Add(c);
                bytes[format] = b;
            }

            Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
                $"repetition {r + 1}: json {seconds["--json"][^1]:F3} s ({cpu["--json"][^1]:F2} s CPU), csv {seconds["--csv"][^1]:F3} s ({cpu["--csv"][^1]:F2} s CPU) (load {ProcFiles.LoadAverage1Minute():F2})"));
        }

        var text = new StringBuilder();
        text.AppendLine(CultureInfo.InvariantCulture, $"### Whole-dataset analysis of {options.WarmEntries:N0} entries through the CLI, {options.Repetitions} repetitions, medians");
        text.AppendLine();
        text.AppendLine("| output | seconds | (min–max) | CPU seconds of the CLI (user + system) | (min–max) | output, 10⁶ characters |");
        text.AppendLine("| --- | ---: | ---: | ---: | ---: | ---: |");
        foreach (string format in Formats)
        {
            List<double> s = seconds[format];
            List<double> c = cpu[format];
            text.AppendLine(CultureInfo.InvariantCulture,
                $"| `hull analyze {format}` | {Medians.Of(s):F3} | {s.Min():F3}–{s.Max():F3} | {Medians.Of(c):F2} | {c.Min():F2}–{c.Max():F2} | {bytes[format] / 1e6:F2} |");
        }

        text.AppendLine();
        text.AppendLine(CultureInfo.InvariantCulture,
            $"JSON / CSV (medians): {Medians.Of(seconds["--json"]) / Medians.Of(seconds["--csv"]):F2} in wall time (target ≤ 1.5), " +
            $"{Medians.Of(cpu["--json"]) / Medians.Of(cpu["--csv"]):F2} in the CLI's CPU time; load average at the end {ProcFiles.LoadAverages()}.");
        return text.ToString();
    }

    /// <summary>Wall seconds, the CLI's CPU seconds (from /usr/bin/time, which runs it) and the characters it printed.</summary>
    private static async Task<(double Seconds, double CpuSeconds, long Characters)> TimeAsync(string cliDll, Uri server, string format)
    {
        var start = new ProcessStartInfo(TimeTool) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string arg in new[] { "-f", $"{CpuMark}%U %S", "dotnet", cliDll, "analyze", WarmDataset.Name, format, "--server", server.ToString() })
        {
            start.ArgumentList.Add(arg);
        }

        long t0 = Stopwatch.GetTimestamp();
        using Process process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {TimeTool}");
        Task<string> errors = process.StandardError.ReadToEndAsync();
        long total = 0;
        var buffer = new char[64 * 1024];
        int read;
        while ((read = await process.StandardOutput.ReadAsync(buffer)) > 0) total += read;
        await process.WaitForExitAsync();
        double seconds = Stopwatch.GetElapsedTime(t0).TotalSeconds;
        string stderr = await errors;
        if (process.ExitCode != 0) throw new InvalidOperationException($"hull analyze {format} exited {process.ExitCode}: {stderr}");
        string times = stderr.Split('\n').Last(l => l.StartsWith(CpuMark, StringComparison.Ordinal))[CpuMark.Length..];
        double cpu = times.Split(' ').Sum(t => double.Parse(t, CultureInfo.InvariantCulture));
        return (seconds, cpu, total);
    }

    /// <summary>GNU time (Debian's `time` package): runs the CLI and reports its user and system CPU seconds.</summary>
    private const string TimeTool = "/usr/bin/time";

    private const string CpuMark = "cpu-seconds: ";
}
