using System.Text.Json.Nodes;

namespace Hull.Bench.Measure;

/// <summary>Runs one of the tests' reference scripts (Debian's /usr/bin/python3) on a task batch and returns its results.</summary>
public static class PythonReference
{
    public static JsonArray Run(string repoRoot, string script, JsonArray tasks, TimeSpan timeout)
    {
        string path = Path.Combine(repoRoot, "tests", "Hull.Core.Tests", "References", script);
        string input = Path.Combine(Path.GetTempPath(), $"hull-bench-{Path.GetFileNameWithoutExtension(script)}-{Environment.ProcessId}.json");
        File.WriteAllText(input, new JsonObject { ["tasks"] = tasks }.ToJsonString());
        try
        {
            var run = ExternalRun.Run("/usr/bin/python3", [path, input], timeout);
            if (!run.Succeeded) throw new InvalidOperationException($"the reference {script} failed: {run.StandardError}");
            return JsonNode.Parse(run.StandardOutput)!["results"]!.AsArray();
        }
        finally
        {
            File.Delete(input);
        }
    }
}
