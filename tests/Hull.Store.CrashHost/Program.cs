using System.Diagnostics;
using Hull.Store;
using Hull.Store.CrashHost;

// Usage: Hull.Store.CrashHost <data-directory | postgresql:connection-string> <batches> <rows-per-batch>
//        Hull.Store.CrashHost <data-directory | postgresql:connection-string> --shared WRITER <batches> <rows-per-batch>
// The second form is one writer of the shared-dataset test (see SharedWriter).
// Continues from the last committed batch: with versions 1..n present, the next batch is n (version n + 1).
// Prints "committed <version>" after each commit returns; only then has the batch been reported to the test.
if (args.Length == 5 && args[1] == "--shared" && int.TryParse(args[3], out int sharedBatches) && int.TryParse(args[4], out int sharedRows))
{
    using IDatasetStore shared = HostStore.Open(args[0]);
    return SharedWriter.Run(shared, args[2], sharedBatches, sharedRows);
}

if (args.Length != 3 || !int.TryParse(args[1], out int batches) || !int.TryParse(args[2], out int rowsPerBatch))
{
    Console.Error.WriteLine("usage: Hull.Store.CrashHost <data-directory | postgresql:connection-string> <batches> <rows-per-batch>");
    return 64;
}

using IDatasetStore store = HostStore.Open(args[0]);
if (!store.ListDatasets().Any(d => d.Name == CrashBatches.DatasetName))
{
    store.CreateDataset(CrashBatches.DatasetName, "crash-safety test data");
}

long latest = store.GetLatestVersion(CrashBatches.DatasetName);
int versions = store.ListVersions(CrashBatches.DatasetName).Count;
if (versions != latest)
{
    Console.Error.WriteLine($"expected versions 1..{latest} without gaps, found {versions} versions");
    return 2;
}

var clock = Stopwatch.StartNew();
int imported = 0;
for (int batch = (int)latest; batch < batches; batch++)
{
    ImportResult result = store.ImportBatch(CrashBatches.DatasetName, CrashBatches.Rows(batch, rowsPerBatch),
        DuplicatePolicy.Reject, new BatchProvenance("crash-host", CrashBatches.Note(batch)));
    Console.Out.WriteLine($"committed {result.NewVersion}");
    Console.Out.Flush();
    imported++;
}
clock.Stop();
Console.Error.WriteLine(
    $"imported {imported} batches of {rowsPerBatch} rows in {clock.Elapsed.TotalSeconds:F3} s " +
    $"({imported * rowsPerBatch / Math.Max(clock.Elapsed.TotalSeconds, 1e-9):F0} rows/s)");
Console.Out.WriteLine("done");
return 0;
