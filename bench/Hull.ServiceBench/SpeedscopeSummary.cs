using System.Globalization;
using System.Text;
using System.Text.Json;

namespace Hull.ServiceBench;

/// <summary>
/// Where a traced server's threads spent their time: inclusive and exclusive shares of the frames in a speedscope
/// file that dotnet-trace wrote. The sample profiler records every thread, also while it sleeps, so stacks that end
/// in a wait (an idle thread-pool worker, the epoll loop waiting, the finalizer) are counted apart as idle and the
/// shares are of the remaining "busy" time: running, or runnable but waiting for a core, or in native code.
/// </summary>
public static class SpeedscopeSummary
{
    // Methods (name endings) that mean "this thread is parked", when among the last few frames of a stack.
    private static readonly string[] IdleFrames =
    [
        "LowLevelLifoSemaphore.Wait", "LowLevelLifoSemaphore.WaitForSignal", "Monitor.Wait", "WaitHandle.WaitOneNoCheck",
        "ManualResetEventSlim.Wait", "SocketAsyncEngine.EventLoop", "Sys.WaitForSocketEvents", "Thread.Sleep", "GC.RunFinalizers",
        "TimerQueue.TimerThread", "GateThread.GateThreadStart", "Interop+Sys.Read", "Heartbeat.TimerLoop",
    ];

    // How close to the leaf an idle frame must be: a wait sits at the top of the stack, under at most the
    // profiler's pseudo-frame (CPU_TIME / UNMANAGED_CODE_TIME) and one helper.
    private const int IdleDepth = 3;

    // Pseudo-frames the exporter puts at the leaf to say whether the thread was in managed or native code.
    private static readonly string[] PseudoLeaves = ["CPU_TIME", "UNMANAGED_CODE_TIME"];

    /// <summary>A text report of the <paramref name="top"/> frames by inclusive and by exclusive busy time.</summary>
    public static string Summarize(string speedscopePath, int top)
    {
        using JsonDocument document = JsonDocument.Parse(File.ReadAllBytes(speedscopePath));
        string[] frames = document.RootElement.GetProperty("shared").GetProperty("frames").EnumerateArray()
            .Select(f => ShortName(f.GetProperty("name").GetString() ?? "?")).ToArray();
        var inclusive = new Dictionary<string, double>(StringComparer.Ordinal);
        var exclusive = new Dictionary<string, double>(StringComparer.Ordinal);
        double busy = 0, idle = 0;
        foreach (JsonElement profile in document.RootElement.GetProperty("profiles").EnumerateArray())
        {
            if (profile.GetProperty("type").GetString() != "evented") continue;
            var stack = new List<int>();
            double? last = null;
            foreach (JsonElement e in profile.GetProperty("events").EnumerateArray())
            {
                double at = e.GetProperty("at").GetDouble();
                if (last is { } previous && stack.Count > 0)
                {
                    double span = at - previous;
                    if (IsIdle(stack, frames))
                    {
                        idle += span;
                    }
                    else
                    {
                        busy += span;
                        foreach (string name in stack.Select(i => frames[i]).Distinct()) Add(inclusive, name, span);
                        Add(exclusive, Leaf(stack, frames), span);
                    }
                }

                last = at;
                int frame = e.GetProperty("frame").GetInt32();
                if (e.GetProperty("type").GetString() == "O")
                {
                    stack.Add(frame);
                }
                else
                {
                    int index = stack.LastIndexOf(frame);
                    if (index >= 0) stack.RemoveRange(index, stack.Count - index);
                }
            }
        }

        var text = new StringBuilder();
        text.AppendLine(CultureInfo.InvariantCulture, $"thread time: busy {busy / 1000:F1} s, idle {idle / 1000:F1} s (all threads); shares below are of busy time");
        text.AppendLine("# inclusive");
        foreach ((string name, double ms) in inclusive.OrderByDescending(p => p.Value).Take(top))
        {
            text.AppendLine(CultureInfo.InvariantCulture, $"{100 * ms / busy,6:F1} %  {name}");
        }

        text.AppendLine("# exclusive (the profiler's managed/native pseudo-leaf folded into its caller)");
        foreach ((string name, double ms) in exclusive.OrderByDescending(p => p.Value).Take(top))
        {
            text.AppendLine(CultureInfo.InvariantCulture, $"{100 * ms / busy,6:F1} %  {name}");
        }

        return text.ToString();
    }

    private static bool IsIdle(List<int> stack, string[] frames)
    {
        for (int i = Math.Max(0, stack.Count - IdleDepth); i < stack.Count; i++)
        {
            string name = frames[stack[i]];
            if (IdleFrames.Any(f => name.EndsWith(f, StringComparison.Ordinal))) return true;
        }

        return false;
    }

    private static string Leaf(List<int> stack, string[] frames)
    {
        string leaf = frames[stack[^1]];
        return PseudoLeaves.Contains(leaf) && stack.Count > 1 ? $"{frames[stack[^2]]} [{leaf}]" : leaf;
    }

    private static void Add(Dictionary<string, double> totals, string name, double ms) =>
        totals[name] = totals.GetValueOrDefault(name) + ms;

    /// <summary>"Module!Namespace.Type.Method(args)" without the module and the argument list, at most 160 characters.</summary>
    private static string ShortName(string name)
    {
        int bang = name.IndexOf('!');
        if (bang >= 0) name = name[(bang + 1)..];
        int paren = name.IndexOf('(');
        if (paren > 0) name = name[..paren];
        return name.Length > 160 ? name[..160] : name;
    }
}
