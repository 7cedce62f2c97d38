using System.Collections.Concurrent;
using System.Diagnostics;

namespace Hull.Cli.Tests;

/// <summary>A `dotnet X.dll ...` child process whose output lines are collected, so that a test can SIGKILL it at a known moment.</summary>
public sealed class ChildProcess : IDisposable
{
    private readonly Process _process;
    private readonly ConcurrentQueue<string> _out = new();
    private readonly ConcurrentQueue<string> _err = new();

    private ChildProcess(Process process)
    {
        _process = process;
        process.OutputDataReceived += (_, e) => { if (e.Data is not null) _out.Enqueue(e.Data); };
        process.ErrorDataReceived += (_, e) => { if (e.Data is not null) _err.Enqueue(e.Data); };
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
    }

    public IReadOnlyCollection<string> Out => _out;

    public IReadOnlyCollection<string> Err => _err;

    public bool HasExited => _process.HasExited;

    public int ExitCode => _process.ExitCode;

    public static ChildProcess Start(string dll, params string[] args)
    {
        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, RedirectStandardInput = true, UseShellExecute = false };
        start.ArgumentList.Add(dll);
        foreach (string arg in args) start.ArgumentList.Add(arg);
        return new ChildProcess(Process.Start(start) ?? throw new InvalidOperationException($"could not start {dll}"));
    }

    /// <summary>Waits until a line of stdout or stderr satisfies <paramref name="seen"/>; returns it.</summary>
    public async Task<string> WaitForLineAsync(Func<string, bool> seen, TimeSpan timeout)
    {
        var clock = Stopwatch.StartNew();
        while (clock.Elapsed < timeout)
        {
            string? line = _out.Concat(_err).FirstOrDefault(seen);
            if (line is not null) return line;
            if (_process.HasExited)
            {
                _process.WaitForExit();
                line = _out.Concat(_err).FirstOrDefault(seen);
                if (line is not null) return line;
                throw new InvalidOperationException($"the process exited ({_process.ExitCode}) first: {string.Join(" | ", _out.Concat(_err))}");
            }
            await Task.Delay(10);
        }

        throw new TimeoutException($"no such line within {timeout}: {string.Join(" | ", _out.Concat(_err))}");
    }

    /// <summary>SIGKILL: no code of the process runs any more.</summary>
    public void Kill()
    {
        if (!_process.HasExited) _process.Kill(entireProcessTree: false);
        _process.WaitForExit();
    }

    public async Task<int> WaitAsync(TimeSpan timeout)
    {
        using var cancel = new CancellationTokenSource(timeout);
        await _process.WaitForExitAsync(cancel.Token);
        return _process.ExitCode;
    }

    public void Dispose()
    {
        Kill();
        _process.Dispose();
    }
}
