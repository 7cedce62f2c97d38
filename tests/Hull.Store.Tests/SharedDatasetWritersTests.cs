using System.Collections.Concurrent;
using System.Data.Common;
using System.Diagnostics;
using Hull.Store.CrashHost;
using Hull.Store.Tests.Backends;
using Xunit.Abstractions;

namespace Hull.Store.Tests;

/// <summary>
/// Two writer processes import into one dataset at once (single batches and three-part import sessions) while this
/// process reads it through a third store. Versions are numbered 1..N without gaps or repeats, each is exactly the
/// version before it plus one writer's whole batch, a reader never sees part of one, and the latest version this
/// store answers is never older than a commit a writer had already reported before the question was asked.
/// </summary>
public abstract class SharedDatasetWritersTests(StoreBackend backend, ITestOutputHelper output)
{
    private const int BatchesPerWriter = 24;
    private const int RowsPerBatch = 150;
    private static readonly string[] Writers = ["left", "right"];
    private static readonly TimeSpan Patience = TimeSpan.FromSeconds(120);

    [Fact]
    public async Task Two_processes_importing_into_one_dataset_number_whole_versions_without_gaps_or_repeats()
    {
        using StoreLocation location = backend.NewLocation();
        using IDatasetStore reader = location.Open();
        string host = Path.Combine(AppContext.BaseDirectory, "Hull.Store.CrashHost.dll");

        // Every commit a writer has reported so far: version -> (writer, batch). Filled by the output readers.
        var reported = new ConcurrentDictionary<long, (string Writer, int Batch)>();
        long highestReported = 0;
        var processes = Writers.Select(writer => Start(host, location.HostArgument, writer)).ToList();
        var readers = processes.Select(p => Task.Run(() =>
        {
            string? line;
            while ((line = p.StandardOutput.ReadLine()) is not null)
            {
                string[] parts = line.Split(' ');
                if (parts[0] != "committed") continue;
                long version = long.Parse(parts[1], System.Globalization.CultureInfo.InvariantCulture);
                Assert.True(reported.TryAdd(version, (parts[2], int.Parse(parts[3], System.Globalization.CultureInfo.InvariantCulture))),
                    $"version {version} was reported twice");
                InterlockedMax(ref highestReported, version);
            }
        })).ToList();

        // While they write: what a reader sees is always a whole number of batches, and the latest is never stale.
        int looks = 0;
        var clock = Stopwatch.StartNew();
        while (processes.Any(p => !p.HasExited) && clock.Elapsed < Patience)
        {
            long known = Interlocked.Read(ref highestReported);
            long latest;
            try
            {
                latest = reader.GetLatestVersion(SharedWriter.DatasetName);
            }
            catch (DatasetNotFoundException)
            {
                continue;
            }
            Assert.True(latest >= known, $"the latest version read as {latest} after a writer had reported version {known}");
            if (latest == IDatasetStore.NoVersion) continue;
            IReadOnlyList<EntryRow> rows = reader.GetEntries(SharedWriter.DatasetName, latest);
            Assert.Equal(0, rows.Count % RowsPerBatch);
            Assert.Equal(latest * RowsPerBatch, rows.Count);
            looks++;
        }
        foreach (Process p in processes)
        {
            Assert.True(p.WaitForExit(Patience), "a writer did not finish");
            Assert.True(p.ExitCode == 0, $"a writer failed ({p.ExitCode}): {p.StandardError.ReadToEnd()}");
        }
        await Task.WhenAll(readers);
        output.WriteLine($"{looks} reads alongside the writers, {clock.Elapsed.TotalSeconds:F1} s");
        // How many looks fit in depends on the machine (on a quiet one the writers are done in about a second): at
        // least one whole read must have happened while a writer was still running.
        Assert.True(looks >= 1, $"the reader never looked while the writers ran");

        int total = Writers.Length * BatchesPerWriter;
        IReadOnlyList<DatasetVersionInfo> versions = reader.ListVersions(SharedWriter.DatasetName);
        Assert.Equal(Enumerable.Range(1, total).Select(v => (long)v), versions.Select(v => v.Version));
        Assert.Equal(Enumerable.Range(1, total).Select(v => (long)v).ToHashSet(), reported.Keys.ToHashSet());

        // Each version is its predecessor plus exactly the batch its writer reported for it, in each writer's order.
        var expected = new List<EntryRow>();
        var nextBatch = Writers.ToDictionary(w => w, _ => 0);
        foreach (DatasetVersionInfo info in versions)
        {
            (string writer, int batch) = reported[info.Version];
            Assert.Equal(nextBatch[writer]++, batch);
            Assert.Equal((writer, SharedWriter.Note(writer, batch), RowsPerBatch, RowsPerBatch, 0),
                (info.SourceLabel, info.Note, info.BatchEntryCount, info.Inserted, info.Replaced));
            expected.AddRange(SharedWriter.Rows(writer, batch, RowsPerBatch));
            Assert.Equal(expected.Count, info.EntryCount);
            if (info.Version % 7 == 0 || info.Version == total)
            {
                Rows.AssertSame(Rows.Sorted(expected), reader.GetEntries(SharedWriter.DatasetName, info.Version), $"version {info.Version}");
            }
        }

        // Below the interface: the rows each version added are one batch, none closed, and no staging left behind.
        using DbConnection raw = location.OpenRaw();
        using DbCommand command = raw.CreateCommand();
        command.CommandText = "SELECT first_version, count(*), count(last_version_exclusive) FROM entries GROUP BY first_version ORDER BY first_version";
        var added = new List<(long, long, long)>();
        using (DbDataReader rows = command.ExecuteReader())
        {
            while (rows.Read()) added.Add((rows.GetInt64(0), rows.GetInt64(1), rows.GetInt64(2)));
        }
        Assert.Equal(Enumerable.Range(1, total).Select(v => ((long)v, (long)RowsPerBatch, 0L)), added);
        Assert.Equal(0, reader.CountStagedRows());
    }

    private static Process Start(string host, string store, string writer)
    {
        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        foreach (string argument in new[] { host, store, "--shared", writer, $"{BatchesPerWriter}", $"{RowsPerBatch}" }) start.ArgumentList.Add(argument);
        return Process.Start(start)!;
    }

    private static void InterlockedMax(ref long target, long value)
    {
        long seen;
        while (value > (seen = Interlocked.Read(ref target)) && Interlocked.CompareExchange(ref target, value, seen) != seen)
        {
        }
    }
}

public sealed class SharedDatasetWritersTestsOnSqlite(ITestOutputHelper output) : SharedDatasetWritersTests(StoreBackend.Sqlite, output)
{
}

public sealed class SharedDatasetWritersTestsOnPostgres(ITestOutputHelper output) : SharedDatasetWritersTests(StoreBackend.Postgres, output)
{
}
