namespace Hull.Core.Tests.References;

/// <summary>A fresh folder under the system temp folder for one tool run; deleted on dispose.</summary>
public sealed class ScratchFolder : IDisposable
{
    public ScratchFolder(string purpose)
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"hull-ref-{purpose}-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public string File(string name) => System.IO.Path.Combine(Path, name);

    public void Dispose()
    {
        try { Directory.Delete(Path, recursive: true); }
        catch (IOException) { /* a leftover temp folder is harmless */ }
        catch (UnauthorizedAccessException) { }
    }
}
