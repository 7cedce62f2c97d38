using System.Diagnostics;

namespace Hull.Store.Tests;

/// <summary>Runs a reference program and returns its standard output; a missing program or a failure fails the test.</summary>
internal static class ExternalTool
{
    public static string Run(string program, IEnumerable<string> arguments, IDictionary<string, string>? environment = null)
    {
        Assert.True(File.Exists(program), $"reference tool {program} is missing (Debian package coreutils)");
        var start = new ProcessStartInfo(program)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (string argument in arguments) start.ArgumentList.Add(argument);
        if (environment is not null)
        {
            foreach ((string key, string value) in environment) start.Environment[key] = value;
        }
        using var process = Process.Start(start)!;
        Task<string> error = process.StandardError.ReadToEndAsync();
        string output = process.StandardOutput.ReadToEnd();
        process.WaitForExit();
        Assert.True(process.ExitCode == 0, $"{program} failed ({process.ExitCode}): {error.Result}");
        return output;
    }
}
