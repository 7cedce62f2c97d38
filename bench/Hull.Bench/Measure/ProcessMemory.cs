namespace Hull.Bench.Measure;

/// <summary>Peak resident memory of this process from /proc/self/status (VmHWM), resettable per case.</summary>
public static class ProcessMemory
{
    /// <summary>
    /// Collects garbage, then resets the kernel's peak-RSS mark (writing 5 to /proc/self/clear_refs), so the next
    /// <see cref="PeakMegabytes"/> covers only what runs after this call (plus what is already resident).
    /// </summary>
    public static bool ResetPeak()
    {
        GC.Collect();
        GC.WaitForPendingFinalizers();
        GC.Collect();
        try
        {
            File.WriteAllText("/proc/self/clear_refs", "5");
            return true;
        }
        catch (IOException) { return false; }
        catch (UnauthorizedAccessException) { return false; }
    }

    /// <summary>VmHWM in MB (1 MB = 2^20 bytes), NaN where /proc is unavailable.</summary>
    public static double PeakMegabytes() => ReadKilobytes("VmHWM:") / 1024.0;

    /// <summary>VmRSS in MB.</summary>
    public static double ResidentMegabytes() => ReadKilobytes("VmRSS:") / 1024.0;

    private static double ReadKilobytes(string key)
    {
        try
        {
            foreach (var line in File.ReadLines("/proc/self/status"))
            {
                if (!line.StartsWith(key, StringComparison.Ordinal)) continue;
                var parts = line.Substring(key.Length).Trim().Split(' ', StringSplitOptions.RemoveEmptyEntries);
                return double.Parse(parts[0], System.Globalization.CultureInfo.InvariantCulture);
            }
        }
        catch (IOException) { }
        return double.NaN;
    }
}
