using System.Diagnostics;

namespace Hull.Bench;

/// <summary>
/// "Ours whole-process": bench/Hull.Solve (and bench/Hull.Window for windows) published with Native AOT, the way the
/// engine is deployed as a command-line program. The hull suites publish it themselves before timing anything, so the executable they time is always
/// built from the current sources (the same PointsFileSolver.cs the in-process runs use).
/// </summary>
public static class NativeSolver
{
    public const string RuntimeIdentifier = "linux-x64";

    /// <summary>Publishing on 2 busy cores takes about a minute from scratch; more than this means something hangs.</summary>
    private static readonly TimeSpan PublishTimeout = TimeSpan.FromMinutes(15);

    /// <summary>The hull engine's executable (bench/Hull.Solve).</summary>
    public const string HullTool = "Hull.Solve";

    /// <summary>The window vertex enumeration's executable (bench/Hull.Window).</summary>
    public const string WindowTool = "Hull.Window";

    public static string ProjectPath(string repoRoot, string tool = HullTool) => Path.Combine(repoRoot, "bench", tool, tool + ".csproj");

    public static string PublishDirectory(string repoRoot, string tool = HullTool) => Path.Combine(repoRoot, "bench", tool, "bin", "publish-aot");

    public static string ExecutablePath(string repoRoot, string tool = HullTool) => Path.Combine(PublishDirectory(repoRoot, tool), tool);

    /// <summary>The publish command, as a user would type it from the repository root.</summary>
    public static string PublishCommand(string tool = HullTool) =>
        $"dotnet publish bench/{tool}/{tool}.csproj -c Release -r {RuntimeIdentifier} -o bench/{tool}/bin/publish-aot";

    /// <summary>Arguments of one whole-process run on a points file.</summary>
    public static IReadOnlyList<string> Arguments(string pointsFile) => [pointsFile];

    /// <summary>
    /// Publishes Hull.Solve with Native AOT (incremental: quick when nothing changed) and returns the executable's
    /// path. Trim and AOT warnings are errors in that project, so a publish that succeeds is AOT-clean.
    /// </summary>
    /// <exception cref="InvalidOperationException">The publish failed; the message gives the command to run by hand.</exception>
    public static string Publish(string repoRoot, string tool = HullTool)
    {
        var psi = new ProcessStartInfo(DotnetHost())
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = repoRoot,
        };
        foreach (var a in new[] { "publish", ProjectPath(repoRoot, tool), "-c", "Release", "-r", RuntimeIdentifier, "-o", PublishDirectory(repoRoot, tool), "--nologo" })
        {
            psi.ArgumentList.Add(a);
        }
        // This program may itself run under 'dotnet run'; MSBuild settings inherited from that must not steer the
        // child build.
        foreach (var v in new[] { "MSBuildExtensionsPath", "MSBUILD_EXE_PATH", "MSBuildSDKsPath", "MSBuildLoadMicrosoftTargetsReadOnly" })
        {
            psi.Environment.Remove(v);
        }

        Console.WriteLine($"-- publishing the Native AOT executable {tool}: {PublishCommand(tool)}");
        var sw = Stopwatch.StartNew();
        string output;
        int exitCode;
        try
        {
            using var p = Process.Start(psi) ?? throw new InvalidOperationException("could not start dotnet");
            var stdout = p.StandardOutput.ReadToEndAsync();
            var stderr = p.StandardError.ReadToEndAsync();
            if (!p.WaitForExit((int)PublishTimeout.TotalMilliseconds))
            {
                p.Kill(entireProcessTree: true);
                p.WaitForExit();
                throw Failure(repoRoot, tool, $"did not finish within {PublishTimeout.TotalMinutes:F0} min", stdout.Result + stderr.Result);
            }
            p.WaitForExit();
            output = stdout.Result + stderr.Result;
            exitCode = p.ExitCode;
        }
        catch (System.ComponentModel.Win32Exception e)
        {
            throw Failure(repoRoot, tool, $"could not start '{psi.FileName}' ({e.Message})", "");
        }
        if (exitCode != 0) throw Failure(repoRoot, tool, $"exited with code {exitCode}", output);
        string exe = ExecutablePath(repoRoot, tool);
        if (!File.Exists(exe)) throw Failure(repoRoot, tool, $"succeeded but {exe} is missing", output);
        Console.WriteLine($"   published in {sw.Elapsed.TotalSeconds:F0} s: {exe}");
        return exe;
    }

    private static InvalidOperationException Failure(string repoRoot, string tool, string what, string output)
    {
        var tail = output.Split('\n', StringSplitOptions.RemoveEmptyEntries).TakeLast(25);
        return new InvalidOperationException(
            $"Publishing the Native AOT executable {tool} {what}. Run this from {repoRoot} to see why, and fix it before timing:\n"
            + $"  {PublishCommand(tool)}\n"
            + "(it needs the .NET SDK's ILCompiler package, which the SDK restores itself, and clang or gcc with the "
            + "system linker and zlib headers)\nLast lines of its output:\n" + string.Join('\n', tail));
    }

    /// <summary>The dotnet host that runs this program's SDK commands: the one the SDK names, else 'dotnet' on PATH.</summary>
    private static string DotnetHost()
    {
        string? host = Environment.GetEnvironmentVariable("DOTNET_HOST_PATH");
        return !string.IsNullOrEmpty(host) && File.Exists(host) ? host : "dotnet";
    }
}
