using Hull.Store.Tests.Backends;
using System.Collections.Concurrent;
using System.Diagnostics;
using Xunit.Abstractions;

namespace Hull.Store.Tests;

/// <summary>
/// Writers import into their own datasets while readers read all of them, through two store instances on the same
/// file (as two processes would); the outcome equals running the same imports one after another.
/// </summary>
public abstract class ConcurrencyTests(StoreBackend backend, ITestOutputHelper output)
{
    private const int Writers = 4;
    private const int BatchesPerWriter = 12;
    private const int Readers = 3;

    [Fact]
    public void ConcurrentImportsAndReadsEqualASequentialRun()
    {
        List<Step>[] plans = Enumerable.Range(0, Writers).Select(Plan).ToArray();

        using var concurrentDirectory = backend.NewLocation();
        using var sequentialDirectory = backend.NewLocation();
        var concurrentResults = new List<string>[Writers];
        var seenByReaders = new ConcurrentDictionary<(string Dataset, long Version), string>();
        int readsChecked = 0;

        using (IDatasetStore first = concurrentDirectory.Open())
        using (IDatasetStore second = concurrentDirectory.Open())
        {
            IDatasetStore[] stores = [first, second];
            for (int w = 0; w < Writers; w++) first.CreateDataset(DatasetOf(w));

            var failures = new ConcurrentQueue<Exception>();
            using var start = new ManualResetEventSlim();
            int writersLeft = Writers;
            var threads = new List<Thread>();
            for (int w = 0; w < Writers; w++)
            {
                int writer = w;
                threads.Add(new Thread(() => Guard(failures, () =>
                {
                    start.Wait();
                    concurrentResults[writer] = Apply(stores[writer % 2], writer, plans[writer]);
                    Interlocked.Decrement(ref writersLeft);
                })));
            }
            for (int r = 0; r < Readers; r++)
            {
                int reader = r;
                threads.Add(new Thread(() => Guard(failures, () =>
                {
                    var random = new Random(100 + reader);
                    start.Wait();
                    while (Volatile.Read(ref writersLeft) > 0 && failures.IsEmpty)
                    {
                        ReadOnce(stores[reader % 2], random, seenByReaders);
                        Interlocked.Increment(ref readsChecked);
                    }
                })));
            }
            threads.ForEach(t => t.Start());
            var clock = Stopwatch.StartNew();
            start.Set();
            threads.ForEach(t => t.Join());
            output.WriteLine($"concurrent phase: {clock.Elapsed.TotalSeconds:F2} s, {readsChecked} reads");
            Assert.True(failures.IsEmpty, string.Join("\n\n", failures));
        }
        Assert.True(readsChecked > 20, $"readers ran only {readsChecked} times alongside the writers");

        using IDatasetStore concurrent = concurrentDirectory.Open();
        using IDatasetStore sequential = sequentialDirectory.Open();
        var sequentialClock = Stopwatch.StartNew();
        for (int w = 0; w < Writers; w++)
        {
            sequential.CreateDataset(DatasetOf(w));
            Assert.Equal(Apply(sequential, w, plans[w]), concurrentResults[w]);
        }
        output.WriteLine($"sequential imports: {sequentialClock.Elapsed.TotalSeconds:F2} s");
        for (int w = 0; w < Writers; w++)
        {
            string dataset = DatasetOf(w);
            Assert.Equal(sequential.ListVersions(dataset).Select(v => (v.Version, v.EntryCount, v.Inserted, v.Replaced, v.Note)),
                concurrent.ListVersions(dataset).Select(v => (v.Version, v.EntryCount, v.Inserted, v.Replaced, v.Note)));
            foreach (DatasetVersionInfo version in sequential.ListVersions(dataset))
            {
                Rows.AssertSame(sequential.GetEntries(dataset, version.Version), concurrent.GetEntries(dataset, version.Version),
                    $"{dataset} version {version.Version}");
                Assert.Equal(sequential.GetFingerprint(dataset, version.Version), concurrent.GetFingerprint(dataset, version.Version));
            }
        }
        // What readers saw while the writers ran is what the versions hold.
        foreach (((string dataset, long version), string fingerprint) in seenByReaders)
        {
            Assert.Equal(sequential.GetFingerprint(dataset, version), fingerprint);
        }
    }

    private static string DatasetOf(int writer) => $"writer-{writer}";

    private sealed record Step(IReadOnlyList<EntryRow> Rows, DuplicatePolicy Policy);

    /// <summary>A writer's batches: new ids under reject, overlapping ids under replace, and one batch that must fail.</summary>
    private static List<Step> Plan(int writer)
    {
        var random = new Random(writer);
        var steps = new List<Step>();
        for (int b = 0; b < BatchesPerWriter; b++)
        {
            int count = random.Next(50, 300);
            if (b == 5)
            {
                // Repeats an id inside the batch: refused, and must not disturb anyone.
                steps.Add(new Step([Rows.Make("dup"), Rows.Make("dup")], DuplicatePolicy.Replace));
            }
            else if (b % 3 == 0)
            {
                steps.Add(new Step(Enumerable.Range(0, count)
                    .Select(i => Rows.Make($"fresh-{b:D2}-{i:D3}", random.NextDouble() * -10)).ToList(), DuplicatePolicy.Reject));
            }
            else
            {
                steps.Add(new Step(Enumerable.Range(0, 400).OrderBy(_ => random.Next()).Take(count)
                    .Select(i => Rows.Make($"shared-{i:D3}", random.NextDouble() * -10, metadata: $"w{writer} b{b}")).ToList(),
                    DuplicatePolicy.Replace));
            }
        }
        return steps;
    }

    private static List<string> Apply(IDatasetStore store, int writer, List<Step> plan)
    {
        var results = new List<string>();
        for (int b = 0; b < plan.Count; b++)
        {
            try
            {
                results.Add(store.ImportBatch(DatasetOf(writer), plan[b].Rows, plan[b].Policy, new BatchProvenance("plan", $"batch {b}")).ToString());
            }
            catch (DuplicateEntryException e)
            {
                results.Add($"refused row {e.RowIndex}");
            }
        }
        return results;
    }

    private static void ReadOnce(IDatasetStore store, Random random, ConcurrentDictionary<(string, long), string> seen)
    {
        string dataset = DatasetOf(random.Next(Writers));
        IReadOnlyList<DatasetVersionInfo> versions = store.ListVersions(dataset);
        if (versions.Count == 0) return;
        DatasetVersionInfo version = versions[random.Next(versions.Count)];
        IReadOnlyList<EntryRow> rows = store.GetEntries(dataset, version.Version);
        Assert.Equal(version.EntryCount, rows.Count);
        Assert.Equal(rows.Select(r => r.Id).Order(EntryIdOrder.Comparer), rows.Select(r => r.Id));
        string fingerprint = ContentFingerprint.Compute(rows);
        // A version read twice, by any reader, at any time, gives the same rows.
        Assert.Equal(seen.GetOrAdd((dataset, version.Version), fingerprint), fingerprint);
        if (random.Next(4) == 0) Assert.Equal(fingerprint, store.GetFingerprint(dataset, version.Version));
    }

    private static void Guard(ConcurrentQueue<Exception> failures, Action body)
    {
        try
        {
            body();
        }
        catch (Exception e)
        {
            failures.Enqueue(e);
        }
    }
}

public sealed class ConcurrencyTestsOnSqlite(ITestOutputHelper output) : ConcurrencyTests(StoreBackend.Sqlite, output)
{
}

public sealed class ConcurrencyTestsOnPostgres(ITestOutputHelper output) : ConcurrencyTests(StoreBackend.Postgres, output)
{
}
