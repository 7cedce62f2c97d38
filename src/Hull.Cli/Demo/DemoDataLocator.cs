namespace Hull.Cli.Demo;

/// <summary>Finds the demo data folder: the one given, or data-demo/ above the current or the program's folder.</summary>
public static class DemoDataLocator
{
    public const string FolderName = "data-demo";

    public static string? Find(string? given)
    {
        if (given is not null) return Directory.Exists(given) ? Path.GetFullPath(given) : null;
        foreach (string start in new[] { Environment.CurrentDirectory, AppContext.BaseDirectory })
        {
            for (DirectoryInfo? dir = new(start); dir is not null; dir = dir.Parent)
            {
                string candidate = Path.Combine(dir.FullName, FolderName);
                if (Directory.Exists(Path.Combine(candidate, "round1"))) return candidate;
            }
        }

        return null;
    }
}
