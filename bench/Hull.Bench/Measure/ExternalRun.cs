using System.Diagnostics;
using System.Globalization;

namespace Hull.Bench.Measure;

/// <summary>The outcome of one whole-process run: wall time, peak RSS, exit code, and whether it hit its cap.</summary>
public sealed record ExternalRunResult(double WallMilliseconds, double PeakMegabytes, int ExitCode, bool TimedOut, string StandardOutput, string StandardError)
{
    public bool Succeeded => !TimedOut && ExitCode == 0;

    /// <summary>User plus system CPU time of the child (GNU time), ms: on a shared machine its work, apart from the waits.</summary>
    public double CpuMilliseconds { get; init; } = double.NaN;
}

/// <summary>
/// Runs a program as a whole process under GNU time (/usr/bin/time -v, which reports the child's peak RSS),
/// timing wall clock from start to exit with a stopwatch. Both our executable and qconvex go through this same
/// path, so fork/exec and the wrapper cost the same for each.
/// </summary>
public static class ExternalRun
{
    public const string GnuTime = "/usr/bin/time";

    public static ExternalRunResult Run(string program, IReadOnlyList<string> arguments, TimeSpan timeout)
    {
        if (!File.Exists(GnuTime))
        {
            throw new InvalidOperationException($"{GnuTime} is missing; install it with 'apt-get install -y time'.");
        }
        string timeFile = Path.GetTempFileName();
        var psi = new ProcessStartInfo(GnuTime)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        psi.ArgumentList.Add("-v");
        psi.ArgumentList.Add("-o");
        psi.ArgumentList.Add(timeFile);
        psi.ArgumentList.Add(program);
        foreach (var a in arguments) psi.ArgumentList.Add(a);

        var sw = Stopwatch.StartNew();
        using var p = Process.Start(psi) ?? throw new InvalidOperationException($"could not start {program}");
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        bool exited = p.WaitForExit((int)Math.Min(int.MaxValue, timeout.TotalMilliseconds));
        if (!exited)
        {
            p.Kill(entireProcessTree: true);
            p.WaitForExit();
        }
        else
        {
            p.WaitForExit();
        }
        sw.Stop();
        double peak = double.NaN, userSeconds = double.NaN, systemSeconds = double.NaN;
        try
        {
            foreach (var line in File.ReadLines(timeFile))
            {
                var t = line.Trim();
                const string key = "Maximum resident set size (kbytes):";
                const string user = "User time (seconds):";
                const string system = "System time (seconds):";
                if (t.StartsWith(key, StringComparison.Ordinal))
                {
                    peak = double.Parse(t.Substring(key.Length).Trim(), CultureInfo.InvariantCulture) / 1024.0;
                }
                else if (t.StartsWith(user, StringComparison.Ordinal))
                {
                    userSeconds = double.Parse(t.Substring(user.Length).Trim(), CultureInfo.InvariantCulture);
                }
                else if (t.StartsWith(system, StringComparison.Ordinal))
                {
                    systemSeconds = double.Parse(t.Substring(system.Length).Trim(), CultureInfo.InvariantCulture);
                }
            }
        }
        finally
        {
            File.Delete(timeFile);
        }
        return new ExternalRunResult(sw.Elapsed.TotalMilliseconds, peak, exited ? p.ExitCode : -1, !exited, stdout.Result, stderr.Result)
        {
            CpuMilliseconds = 1000 * (userSeconds + systemSeconds),
        };
    }
}
