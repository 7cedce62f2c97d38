namespace Hull.Server.Tests.Support;

/// <summary>A fresh folder under the system temp directory, deleted on dispose.</summary>
public sealed class TempFolder : IDisposable
{
    public TempFolder(string prefix = "hull-svc-test")
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"{prefix}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public void Dispose()
    {
        try
        {
            Directory.Delete(Path, recursive: true);
        }
        catch (IOException)
        {
            // A child process may still hold a file for a moment; the OS cleans temp folders eventually.
        }
    }
}
