using System.Globalization;

namespace Hull.ServiceBench;

/// <summary>Readings from Linux /proc: CPU time of processes and of the whole machine, load average, peak memory.</summary>
public static class ProcFiles
{
    /// <summary>Kernel clock ticks per second in /proc/*/stat; 100 on every Linux build we run on (USER_HZ).</summary>
    public const double TicksPerSecond = 100.0;

    /// <summary>User + system CPU seconds used by process <paramref name="pid"/> so far.</summary>
    public static double ProcessCpuSeconds(int pid)
    {
        string stat = File.ReadAllText($"/proc/{pid}/stat");
        // The command name (field 2) may hold spaces; the fields after its closing parenthesis are plain.
        string[] fields = stat[(stat.LastIndexOf(')') + 2)..].Split(' ');
        // fields[0] is field 3 (state); utime and stime are fields 14 and 15.
        long user = long.Parse(fields[11], CultureInfo.InvariantCulture);
        long system = long.Parse(fields[12], CultureInfo.InvariantCulture);
        return (user + system) / TicksPerSecond;
    }

    /// <summary>CPU seconds the whole machine spent busy (user, nice, system, irq, softirq, steal), all cores.</summary>
    public static double MachineBusyCpuSeconds()
    {
        string first = File.ReadLines("/proc/stat").First();
        long[] v = first.Split(' ', StringSplitOptions.RemoveEmptyEntries).Skip(1).Select(s => long.Parse(s, CultureInfo.InvariantCulture)).ToArray();
        // user nice system idle iowait irq softirq steal ...
        long busy = v[0] + v[1] + v[2] + v[5] + v[6] + (v.Length > 7 ? v[7] : 0);
        return busy / TicksPerSecond;
    }

    /// <summary>The 1-minute load average.</summary>
    public static double LoadAverage1Minute() =>
        double.Parse(File.ReadAllText("/proc/loadavg").Split(' ')[0], CultureInfo.InvariantCulture);

    /// <summary>The full /proc/loadavg triple, e.g. "4.30 6.39 7.63".</summary>
    public static string LoadAverages() => string.Join(' ', File.ReadAllText("/proc/loadavg").Split(' ').Take(3));

    /// <summary>A field of /proc/<paramref name="pid"/>/status in kB, e.g. VmHWM (peak resident set) or VmRSS.</summary>
    public static long StatusKilobytes(int pid, string field)
    {
        foreach (string line in File.ReadLines($"/proc/{pid}/status"))
        {
            if (line.StartsWith(field + ":", StringComparison.Ordinal))
            {
                return long.Parse(line[(field.Length + 1)..].Trim().Split(' ')[0], CultureInfo.InvariantCulture);
            }
        }

        throw new InvalidOperationException($"/proc/{pid}/status has no {field} line");
    }

    /// <summary>The CPU model name from /proc/cpuinfo.</summary>
    public static string CpuModel() =>
        File.ReadLines("/proc/cpuinfo").FirstOrDefault(l => l.StartsWith("model name", StringComparison.Ordinal))?.Split(':', 2)[1].Trim()
        ?? "unknown";

    /// <summary>Total memory in GiB from /proc/meminfo.</summary>
    public static double MemoryGiB()
    {
        string line = File.ReadLines("/proc/meminfo").First(l => l.StartsWith("MemTotal:", StringComparison.Ordinal));
        return long.Parse(line["MemTotal:".Length..].Trim().Split(' ')[0], CultureInfo.InvariantCulture) / 1024.0 / 1024.0;
    }
}
