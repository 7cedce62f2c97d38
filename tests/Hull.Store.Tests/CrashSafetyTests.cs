using Hull.Store.Tests.Backends;
using System.Data.Common;
using System.Diagnostics;
using Hull.Store.CrashHost;
using Microsoft.Data.Sqlite;
using Xunit.Abstractions;

namespace Hull.Store.Tests;

/// <summary>
/// A child process imports 100 batches of 1,000 rows and prints each version once its commit has returned; the test
/// kills it with SIGKILL at random points, restarts it to continue, and after every kill checks the database: each
/// version reported committed is there with exactly its rows, no batch is partly there, and (SQLite) the file's own
/// integrity check passes. On PostgreSQL the killed writer's transaction dies with its connection.
/// </summary>
public abstract class CrashSafetyTests(StoreBackend backend, ITestOutputHelper output)
{
    private const int Batches = 100;
    private const int RowsPerBatch = 1_000;
    private const int PlannedKills = 6;
    private const int RequiredKills = 5;

    // Far above the ~2 s a full run takes, so only a hung child reaches it.
    private static readonly TimeSpan ChildTimeout = TimeSpan.FromSeconds(60);

    [Fact]
    public void KilledImportsLeaveExactlyTheReportedBatches()
    {
        var random = new Random(20_241_201);
        using var directory = backend.NewLocation();
        string host = Path.Combine(AppContext.BaseDirectory, "Hull.Store.CrashHost.dll");
        Assert.True(File.Exists(host), $"crash host not built next to the tests: {host}");

        // Batch b is version b + 1, and ids sort by batch then row, so version v holds exactly the first v * 1,000 rows.
        List<EntryRow> allRows = Enumerable.Range(0, Batches).SelectMany(b => CrashBatches.Rows(b, RowsPerBatch)).ToList();
        var reported = new SortedSet<long>();
        long checkedUpTo = 0;
        int kills = 0;
        var total = Stopwatch.StartNew();

        for (int run = 0; ; run++)
        {
            Assert.True(run < 30, "the host did not finish in 30 runs");
            long latest = Check(directory, allRows, reported, random);
            checkedUpTo = latest;
            if (latest == Batches) break;

            Run result;
            if (kills >= PlannedKills)
            {
                result = RunHost(host, directory.HostArgument, killAfterCommits: null, killAfterMilliseconds: null, random);
            }
            else if (run == 0)
            {
                // The first run may die anywhere from startup through creating the schema and the first batches.
                result = RunHost(host, directory.HostArgument, killAfterCommits: null, killAfterMilliseconds: random.Next(0, 250), random);
            }
            else
            {
                int remaining = Batches - (int)latest;
                int spread = Math.Max(2, remaining / (PlannedKills - kills + 1));
                result = RunHost(host, directory.HostArgument, killAfterCommits: random.Next(1, spread), killAfterMilliseconds: null, random);
            }
            foreach (long version in result.Committed) reported.Add(version);
            if (result.Killed) kills++;
            output.WriteLine($"run {run}: {(result.Killed ? "killed" : $"exited {result.ExitCode}")} after reporting " +
                             $"{result.Committed.Count} commits (last {(result.Committed.Count > 0 ? result.Committed[^1] : latest)})");
            if (!result.Killed) Assert.True(result.ExitCode == 0, $"host failed: {result.Errors}");
        }

        Assert.True(kills >= RequiredKills, $"only {kills} runs were killed mid-way");
        // A commit the kill cut off before its line was printed is fine; a reported one missing is not (checked above).
        Assert.Equal(Batches, checkedUpTo);
        Assert.True(reported.IsSubsetOf(Enumerable.Range(1, Batches).Select(v => (long)v)));
        output.WriteLine($"{kills} kills, all {Batches} versions checked, {total.Elapsed.TotalSeconds:F1} s");
    }

    /// <summary>Reopens the store after a run and checks it; returns the latest version.</summary>
    private static long Check(StoreLocation directory, List<EntryRow> allRows, SortedSet<long> reported, Random random)
    {
        long latest;
        using (IDatasetStore store = directory.Open())
        {
            if (!store.ListDatasets().Any(d => d.Name == CrashBatches.DatasetName))
            {
                Assert.Empty(reported);
                return 0;
            }
            IReadOnlyList<DatasetVersionInfo> versions = store.ListVersions(CrashBatches.DatasetName);
            latest = versions.Count;
            Assert.Equal(Enumerable.Range(1, versions.Count).Select(v => (long)v), versions.Select(v => v.Version));
            if (reported.Count > 0) Assert.True(reported.Max <= latest, $"version {reported.Max} was reported committed but is missing (latest {latest})");

            foreach (DatasetVersionInfo info in versions)
            {
                // Per-version counts agree with the batch's provenance: a whole batch of 1,000 each time.
                Assert.Equal(RowsPerBatch, info.BatchEntryCount);
                Assert.Equal(RowsPerBatch, info.Inserted);
                Assert.Equal(0, info.Replaced);
                Assert.Equal(info.Version * RowsPerBatch, info.EntryCount);
                Assert.Equal(CrashBatches.Note((int)info.Version - 1), info.Note);
                Assert.Equal("crash-host", info.SourceLabel);

                // Each version ends exactly at its batch's last row.
                int lastRow = (int)info.Version * RowsPerBatch - 1;
                Assert.Equal(allRows[lastRow], store.GetEntry(CrashBatches.DatasetName, allRows[lastRow].Id, info.Version));
                EntryPage after = store.GetEntries(CrashBatches.DatasetName, info.Version, allRows[lastRow].Id, 1);
                Assert.Empty(after.Entries);
            }

            // The latest version in full, which holds every row ever committed; and a few other versions in full.
            var fullReads = new SortedSet<long> { latest };
            for (int i = 0; i < 2 && latest > 1; i++) fullReads.Add(random.Next(1, (int)latest));
            foreach (long version in fullReads.Where(v => v > 0))
            {
                Rows.AssertSame(allRows.Take((int)version * RowsPerBatch).ToList(),
                    store.GetEntries(CrashBatches.DatasetName, version), $"version {version}");
            }
        }

        // In the file itself: version v added exactly batch v - 1 (1,000 rows, from its first id to its last) and
        // nothing ever closed a row. With the full read of the latest version this pins down every version's rows.
        var expectedBatches = Enumerable.Range(1, (int)latest).Select(v => (
            Version: (long)v, Rows: (long)RowsPerBatch, Closed: 0L,
            FirstId: allRows[(v - 1) * RowsPerBatch].Id, LastId: allRows[v * RowsPerBatch - 1].Id)).ToList();
        using DbConnection raw = directory.OpenRaw();
        Assert.Equal(expectedBatches, RowsAddedPerVersion(raw));

        // SQLite's own check of the whole file: b-trees, indexes against tables, free pages. (PostgreSQL keeps its
        // files to itself; its transactions are what the test checks there.)
        if (raw is SqliteConnection file) Assert.Equal("ok", IntegrityCheck(file));
        return latest;
    }

    private static List<(long Version, long Rows, long Closed, string FirstId, string LastId)> RowsAddedPerVersion(DbConnection connection)
    {
        using DbCommand command = connection.CreateCommand();
        command.CommandText = """
            SELECT first_version, count(*), count(last_version_exclusive), min(entry_id), max(entry_id)
            FROM entries GROUP BY first_version ORDER BY first_version
            """;
        using DbDataReader reader = command.ExecuteReader();
        var result = new List<(long, long, long, string, string)>();
        while (reader.Read()) result.Add((reader.GetInt64(0), reader.GetInt64(1), reader.GetInt64(2), reader.GetString(3), reader.GetString(4)));
        return result;
    }

    private static string IntegrityCheck(SqliteConnection connection)
    {
        using SqliteCommand command = connection.CreateCommand();
        command.CommandText = "PRAGMA integrity_check";
        using SqliteDataReader reader = command.ExecuteReader();
        var lines = new List<string>();
        while (reader.Read()) lines.Add(reader.GetString(0));
        return string.Join("\n", lines);
    }

    private sealed record Run(List<long> Committed, bool Killed, int ExitCode, string Errors);

    /// <summary>Runs the host until it ends, or kills it after some reported commits or some time.</summary>
    private static Run RunHost(string host, string dataDirectory, int? killAfterCommits, int? killAfterMilliseconds, Random random)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (string argument in new[] { host, dataDirectory, $"{Batches}", $"{RowsPerBatch}" }) start.ArgumentList.Add(argument);

        using var process = Process.Start(start)!;
        var errors = new System.Text.StringBuilder();
        process.ErrorDataReceived += (_, e) =>
        {
            if (e.Data is not null) lock (errors) errors.AppendLine(e.Data);
        };
        process.BeginErrorReadLine();

        int killed = 0;
        void Kill()
        {
            try
            {
                if (!process.HasExited)
                {
                    process.Kill(); // SIGKILL on Linux: no handler, no flush, no cleanup in the child
                    Interlocked.Exchange(ref killed, 1);
                }
            }
            catch (InvalidOperationException)
            {
                // It had exited already.
            }
        }

        using var watchdog = new Timer(_ => Kill(), null, ChildTimeout, Timeout.InfiniteTimeSpan);
        using var timedKill = killAfterMilliseconds is int ms ? new Timer(_ => Kill(), null, ms, Timeout.Infinite) : null;

        var committed = new List<long>();
        string? line;
        // Every line read counts, also those read after the kill: the child printed them after its commit returned.
        while ((line = process.StandardOutput.ReadLine()) is not null)
        {
            if (line.StartsWith("committed ", StringComparison.Ordinal))
            {
                committed.Add(long.Parse(line["committed ".Length..], System.Globalization.CultureInfo.InvariantCulture));
                if (committed.Count == killAfterCommits)
                {
                    // Somewhere inside the next batch (one batch takes ~15 ms).
                    Thread.Sleep(random.Next(0, 15));
                    Kill();
                }
            }
        }
        process.WaitForExit();
        watchdog.Change(Timeout.Infinite, Timeout.Infinite);
        bool wasKilled = Volatile.Read(ref killed) == 1;
        Assert.False(wasKilled && killAfterCommits is null && killAfterMilliseconds is null, $"host hung and was killed after {ChildTimeout}");
        string errorText;
        lock (errors) errorText = errors.ToString();
        return new Run(committed, wasKilled, wasKilled ? -1 : process.ExitCode, errorText);
    }
}

public sealed class CrashSafetyTestsOnSqlite(ITestOutputHelper output) : CrashSafetyTests(StoreBackend.Sqlite, output)
{
}

public sealed class CrashSafetyTestsOnPostgres(ITestOutputHelper output) : CrashSafetyTests(StoreBackend.Postgres, output)
{
}
