using System.Runtime.InteropServices;

namespace Hull.Bench.Measure;

/// <summary>The machine the numbers come from: core count, CPU model, runtime.</summary>
public static class MachineInfo
{
    public static string CpuModel()
    {
        try
        {
            var line = File.ReadLines("/proc/cpuinfo").FirstOrDefault(l => l.StartsWith("model name", StringComparison.Ordinal));
            return line is null ? "unknown" : line[(line.IndexOf(':') + 1)..].Trim();
        }
        catch (IOException) { return "unknown"; }
    }

    // An explicit static constructor makes StartLoad be captured at the first use of the class (program start).
    static MachineInfo() { }

    /// <summary>The first three fields of /proc/loadavg.</summary>
    public static string LoadAverage()
    {
        try { return string.Join(' ', File.ReadAllText("/proc/loadavg").Split(' ').Take(3)); }
        catch (IOException) { return "unknown"; }
    }

    /// <summary>Load average captured when the suite started (first use of this class).</summary>
    public static string StartLoad { get; } = LoadAverage();

    public static string Describe() =>
        $"{Environment.ProcessorCount} cores (nproc), CPU \"{CpuModel()}\", {RuntimeInformation.FrameworkDescription}, {RuntimeInformation.OSDescription}, GC {(System.Runtime.GCSettings.IsServerGC ? "server" : "workstation")}";
}
