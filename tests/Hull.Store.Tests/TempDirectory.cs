using Microsoft.Data.Sqlite;

namespace Hull.Store.Tests;

/// <summary>A fresh directory under the system temp folder, deleted with everything in it on dispose.</summary>
internal sealed class TempDirectory : IDisposable
{
    public TempDirectory()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "hull-store-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    public string DatabasePath => System.IO.Path.Combine(Path, DatasetStore.DatabaseFileName);

    public void Dispose()
    {
        // Pooled connections opened by raw test code would keep the files open.
        SqliteConnection.ClearAllPools();
        try
        {
            Directory.Delete(Path, recursive: true);
        }
        catch (DirectoryNotFoundException)
        {
        }
    }
}
