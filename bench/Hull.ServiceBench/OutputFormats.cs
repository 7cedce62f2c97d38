using System.Diagnostics;
using System.Globalization;
using System.Text;

namespace Hull.ServiceBench;

/// <summary>
/// The whole-dataset analysis as a user runs it: `hull analyze warm --json` against `--csv`, each a fresh CLI process
/// calling the bench's server, its output to a file, timed from process start to exit. Repetitions alternate
/// which format goes first; medians, the JSON/CSV ratio and the output sizes are reported. With other CLI builds
/// (e.g. the published one against the plain build) all are run in every repetition, taken in turn.
/// </summary>
public static class OutputFormats
{
    private static readonly string[] Formats = ["--json", "--csv"];

    public static async Task<string> RunAsync(string cliDll, Uri server, BenchOptions options)
    {
        (string Name, string Dll)[] builds = options.CompareCliDlls.Length == 0 ? [("", cliDll)]
            : [("this", cliDll), .. options.CompareCliDlls.Select((d, i) => (options.CompareCliDlls.Length == 1 ? "other" : $"other {i + 1}", d))];
        (string Build, string Dll, string Format)[] cases = [.. builds.SelectMany(b => Formats.Select(f => (b.Name, b.Dll, f)))];
        foreach ((string name, string dll) in builds.Where(b => b.Name.Length > 0)) Console.WriteLine($"{name} = {dll}");

        // One unrecorded run of each, so that the files and the server's cached analysis path are warm for all.
        foreach (var c in cases) await TimeAsync(c.Dll, server, c.Format);
        var seconds = cases.ToDictionary(c => c, _ => new List<double>());
        var cpu = cases.ToDictionary(c => c, _ => new List<double>());
        var bytes = new Dictionary<(string, string, string), long>();
        for (int r = 0; r < options.Repetitions; r++)
        {
            // Each repetition starts one case later, so no case always runs first.
            var line = new StringBuilder(string.Create(CultureInfo.InvariantCulture, $"repetition {r + 1}:"));
            for (int i = 0; i < cases.Length; i++)
            {
                var c = cases[(i + r) % cases.Length];
                (double s, double u, long b) = await TimeAsync(c.Dll, server, c.Format);
                seconds[c].Add(s);
                cpu[c].Add(u);
                bytes[c] = b;
                line.Append(CultureInfo.InvariantCulture, $" {Label(c.Build, c.Format)} {s:F3} s ({u:F2} s CPU);");
            }

            line.Append(CultureInfo.InvariantCulture, $" load {ProcFiles.LoadAverage1Minute():F2}");
            Console.WriteLine(line);
        }

        var text = new StringBuilder();
        text.AppendLine(CultureInfo.InvariantCulture, $"### Whole-dataset analysis of {options.WarmEntries:N0} entries through the CLI, {options.Repetitions} repetitions, medians");
        text.AppendLine();
        text.AppendLine("| output | seconds | (min–max) | CPU seconds of the CLI (user + system) | (min–max) | output, 10⁶ bytes |");
        text.AppendLine("| --- | ---: | ---: | ---: | ---: | ---: |");
        foreach (var c in cases)
        {
            List<double> s = seconds[c];
            List<double> u = cpu[c];
            text.AppendLine(CultureInfo.InvariantCulture,
                $"| `hull analyze {c.Format}`{(c.Build.Length == 0 ? "" : $", {c.Build}")} | {Medians.Of(s):F3} | {s.Min():F3}–{s.Max():F3} | {Medians.Of(u):F2} | {u.Min():F2}–{u.Max():F2} | {bytes[c] / 1e6:F2} |");
        }

        text.AppendLine();
        foreach ((string build, string dll) in builds)
        {
            var json = (build, dll, "--json");
            var csv = (build, dll, "--csv");
            // The ratio of each repetition's pair too: the pair ran back to back, so it shares that moment's load.
            double[] paired = seconds[json].Zip(seconds[csv], (j, c) => j / c).ToArray();
            text.AppendLine(CultureInfo.InvariantCulture,
                $"{(build.Length == 0 ? "" : $"{build}: ")}JSON / CSV (medians): {Medians.Of(seconds[json]) / Medians.Of(seconds[csv]):F2} in wall time (target ≤ 1.5), " +
                $"per repetition {Medians.Of(paired):F2} ({paired.Min():F2}–{paired.Max():F2}), " +
                $"{Medians.Of(cpu[json]) / Medians.Of(cpu[csv]):F2} in the CLI's CPU time.");
        }

        text.AppendLine();
        text.AppendLine(CultureInfo.InvariantCulture, $"Load average at the end {ProcFiles.LoadAverages()}.");
        return text.ToString();
    }

    private static string Label(string build, string format) => build.Length == 0 ? format[2..] : $"{build} {format[2..]}";

    /// <summary>
    /// Wall seconds, the CLI's CPU seconds (from /usr/bin/time, which runs it) and the bytes it wrote. The output
    /// goes to a file, as in `hull analyze … --json > answer.json`: through a pipe, 12 MB of JSON is some 190 fills of
    /// the pipe's 64 KiB, each a wait until this process's reader is scheduled, and on a busy machine the JSON case
    /// took about 1.2 s more wall time that way for the same CPU of the CLI (bench/SERVICE.md).
    /// </summary>
    private static async Task<(double Seconds, double CpuSeconds, long Bytes)> TimeAsync(string cliDll, Uri server, string format)
    {
        string output = Path.Combine(Path.GetTempPath(), $"hull-servicebench-output-{Environment.ProcessId}-{Guid.NewGuid():N}");
        string times = output + ".time";
        try
        {
            // sh only sets up the redirection and replaces itself with GNU time, which runs the CLI.
            var start = new ProcessStartInfo("/bin/sh") { RedirectStandardError = true, UseShellExecute = false };
            foreach (string arg in new[] { "-c", "out=$1; shift; exec \"$@\" > \"$out\"", "sh", output, TimeTool, "-f", "%U %S", "-o", times,
                         "dotnet", cliDll, "analyze", WarmDataset.Name, format, "--server", server.ToString() })
            {
                start.ArgumentList.Add(arg);
            }

            long t0 = Stopwatch.GetTimestamp();
            using Process process = Process.Start(start) ?? throw new InvalidOperationException("could not start /bin/sh");
            string stderr = await process.StandardError.ReadToEndAsync();
            await process.WaitForExitAsync();
            double seconds = Stopwatch.GetElapsedTime(t0).TotalSeconds;
            if (process.ExitCode != 0) throw new InvalidOperationException($"hull analyze {format} exited {process.ExitCode}: {stderr}");
            string cpuLine = (await File.ReadAllLinesAsync(times)).Last(l => l.Length > 0);
            double cpu = cpuLine.Split(' ').Sum(t => double.Parse(t, CultureInfo.InvariantCulture));
            return (seconds, cpu, new FileInfo(output).Length);
        }
        finally
        {
            File.Delete(output);
            File.Delete(times);
        }
    }

    /// <summary>GNU time (Debian's `time` package): runs the CLI and reports its user and system CPU seconds.</summary>
    private const string TimeTool = "/usr/bin/time";

}
