using System.Text.Json.Nodes;

namespace Hull.Core.Tests.References;

/// <summary>
/// A batch of JSON tasks for one reference script run by Debian's /usr/bin/python3 (NumPy/SciPy): the script reads
/// <c>{"tasks": [...]}</c> from the file named by its first argument and writes <c>{"results": [...]}</c>, one per task.
/// </summary>
public sealed class PythonTaskBatch(string script)
{
    private const string Python = "/usr/bin/python3";
    private readonly JsonArray _tasks = [];

    /// <summary>Adds a task; its index is its result's.</summary>
    public int Add(JsonObject task)
    {
        _tasks.Add(task);
        return _tasks.Count - 1;
    }

    /// <summary>Runs every task added so far.</summary>
    public JsonArray Run()
    {
        using var scratch = new ScratchFolder(Path.GetFileNameWithoutExtension(script));
        string input = scratch.File("tasks.json");
        File.WriteAllText(input, new JsonObject { ["tasks"] = _tasks.DeepClone() }.ToJsonString());
        string path = Path.Combine(AppContext.BaseDirectory, "References", script);
        var run = ToolProcess.Run(Python, [path, input], scratch.Path, "python3-scipy");
        var results = JsonNode.Parse(run.StandardOutput)?["results"]?.AsArray()
            ?? throw new ReferenceToolException($"{script} wrote no results");
        if (results.Count != _tasks.Count) throw new ReferenceToolException($"{script} answered {results.Count} of {_tasks.Count} tasks");
        return results;
    }

    /// <summary>A result that is an array of numbers.</summary>
    public static double[] Numbers(JsonNode? node) => [.. node!.AsArray().Select(v => v!.GetValue<double>())];
}
