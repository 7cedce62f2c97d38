using Hull.Store;

namespace Hull.Store.CrashHost;

/// <summary>
/// A writer of the shared-dataset test: imports <c>batches</c> batches into <see cref="DatasetName"/>, the odd ones
/// through an import session of three staged parts, and prints "committed VERSION WRITER BATCH" once each commit
/// has returned. Ids carry writer and batch, so writers never collide and the test can tell each version's batch.
/// </summary>
public static class SharedWriter
{
    public const string DatasetName = "shared";

    public static IReadOnlyList<EntryRow> Rows(string writer, int batch, int rowsPerBatch) =>
        Enumerable.Range(0, rowsPerBatch)
            .Select(i => new EntryRow($"{writer}-b{batch:D3}-e{i:D4}", "Fe2O3", -1.0 - i / 9.0 - batch / 17.0, "total_per_formula_unit", $"{writer} {batch}"))
            .ToList();

    public static string Note(string writer, int batch) => $"{writer} batch {batch}";

    public static int Run(IDatasetStore store, string writer, int batches, int rowsPerBatch)
    {
        try
        {
            store.CreateDataset(DatasetName, "two writers at once");
        }
        catch (DatasetAlreadyExistsException)
        {
            // The other writer made it first.
        }

        for (int batch = 0; batch < batches; batch++)
        {
            IReadOnlyList<EntryRow> rows = Rows(writer, batch, rowsPerBatch);
            var provenance = new BatchProvenance(writer, Note(writer, batch));
            ImportResult result;
            if (batch % 2 == 0)
            {
                result = store.ImportBatch(DatasetName, rows, DuplicatePolicy.Reject, provenance);
            }
            else
            {
                ImportSessionInfo session = store.BeginImport(DatasetName, DuplicatePolicy.Reject, provenance, TimeSpan.FromMinutes(5));
                int third = (rows.Count + 2) / 3;
                foreach (EntryRow[] part in rows.Chunk(third)) store.StageBatch(session.SessionId, part, TimeSpan.FromMinutes(5));
                result = store.CommitImport(session.SessionId);
            }
            Console.Out.WriteLine($"committed {result.NewVersion} {writer} {batch}");
            Console.Out.Flush();
        }
        Console.Out.WriteLine("done");
        return 0;
    }
}
