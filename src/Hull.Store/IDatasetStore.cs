namespace Hull.Store;

/// <summary>
/// Versioned datasets of phase entries, whatever holds them: <see cref="DatasetStore"/> keeps them in an SQLite file
/// beside one server; a shared database for several servers implements the same calls with the same meaning, so the
/// server and the tests do not know which they use. Every implementation is thread-safe, reads a consistent snapshot
/// per call, writes all or nothing, and numbers versions without gaps or repeats however many writers there are.
/// The calls are grouped by topic in partial files (IDatasetStore.Datasets.cs, .Versions.cs, ...), each with the
/// matching partial file of every backend; DEVELOPERS.md says how to add one.
/// </summary>
public partial interface IDatasetStore : IDisposable
{
    /// <summary>What <see cref="GetLatestVersion"/> and summaries report for a dataset without any live version.</summary>
    public const long NoVersion = 0;

    /// <summary>Largest page <see cref="GetEntries(string, long?, string?, int)"/> returns: bounds one call's memory
    /// (a few MB) while keeping the per-page overhead small next to the rows.</summary>
    public const int MaxPageSize = 10_000;

    /// <summary>Where the data lives, for people: a directory, or a database server and database (never a password).</summary>
    string Location { get; }

    /// <summary>True only when the store can read and write right now.</summary>
    bool CheckHealth() => CheckHealth(out _);

    /// <summary>As <see cref="CheckHealth()"/>, and says what is wrong when it is not healthy.</summary>
    bool CheckHealth(out string? problem);
}
