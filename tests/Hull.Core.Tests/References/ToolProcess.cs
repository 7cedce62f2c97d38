using System.ComponentModel;
using System.Diagnostics;

namespace Hull.Core.Tests.References;

/// <summary>
/// Runs an outside reference tool as a child process with a timeout and returns its output; throws
/// <see cref="ReferenceToolException"/> when the tool is missing, exits non-zero or runs too long.
/// </summary>
public static class ToolProcess
{
    /// <summary>
    /// How long a reference tool may run before it counts as hung. It only catches a tool that never returns: on a
    /// shared, loaded machine a large SciPy or GLPK run can take minutes, and that is slow, not wrong.
    /// </summary>
    public static readonly TimeSpan HangTimeout = TimeSpan.FromMinutes(10);

    /// <param name="executable">A program name looked up on PATH, or an absolute path.</param>
    /// <param name="debianPackage">Named in the error when the tool is missing, so the fix is obvious.</param>
    public static ToolRun Run(string executable, IReadOnlyList<string> arguments, string workingDirectory, string debianPackage) =>
        Run(executable, arguments, workingDirectory, HangTimeout, debianPackage);

    /// <param name="timeout">Only for checking the timeout itself; every reference run uses <see cref="HangTimeout"/>.</param>
    public static ToolRun Run(string executable, IReadOnlyList<string> arguments, string workingDirectory, TimeSpan timeout, string debianPackage)
    {
        string resolved = Resolve(executable)
            ?? throw new ReferenceToolException($"Reference tool '{executable}' was not found; install the Debian package {debianPackage}.");

        var start = new ProcessStartInfo(resolved)
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = true,
            UseShellExecute = false,
        };
        foreach (var a in arguments) start.ArgumentList.Add(a);

        var clock = Stopwatch.StartNew();
        Process process;
        try
        {
            process = Process.Start(start) ?? throw new ReferenceToolException($"Could not start '{resolved}'.");
        }
        catch (Win32Exception e)
        {
            throw new ReferenceToolException($"Could not start '{resolved}' (Debian package {debianPackage}): {e.Message}", e);
        }
        using (process)
        {
            process.StandardInput.Close();
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(timeout))
            {
                try { process.Kill(entireProcessTree: true); } catch (InvalidOperationException) { }
                throw new ReferenceToolException($"'{resolved} {string.Join(' ', arguments)}' did not finish within {timeout.TotalSeconds} s.");
            }
            process.WaitForExit();
            string output = stdout.GetAwaiter().GetResult();
            string errors = stderr.GetAwaiter().GetResult();
            if (process.ExitCode != 0)
            {
                throw new ReferenceToolException(
                    $"'{resolved} {string.Join(' ', arguments)}' exited with code {process.ExitCode}.\nstderr:\n{Tail(errors)}\nstdout:\n{Tail(output)}");
            }
            return new ToolRun(output, errors, clock.Elapsed);
        }
    }

    private static string? Resolve(string executable)
    {
        if (Path.IsPathRooted(executable)) return File.Exists(executable) ? executable : null;
        foreach (var dir in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            string candidate = Path.Combine(dir, executable);
            if (File.Exists(candidate)) return candidate;
        }
        return null;
    }

    private static string Tail(string text) => text.Length <= 4000 ? text : "..." + text[^4000..];
}
