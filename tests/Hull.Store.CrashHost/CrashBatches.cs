using Hull.Store;

namespace Hull.Store.CrashHost;

/// <summary>
/// The rows of batch b, the same every time they are made, so the test can tell exactly what each committed
/// version must hold. Batch b becomes version b + 1; ids of different batches never collide.
/// </summary>
public static class CrashBatches
{
    public const string DatasetName = "crash";

    public static IReadOnlyList<EntryRow> Rows(int batch, int rowsPerBatch)
    {
        var rows = new EntryRow[rowsPerBatch];
        for (int i = 0; i < rowsPerBatch; i++)
        {
            rows[i] = new EntryRow(
                Id: $"b{batch:D4}-e{i:D5}",
                Formula: $"Fe{1 + i % 3}O{1 + (i + batch) % 4}",
                EnergyEv: -1.0 - i / 7.0 - batch / 13.0,
                Basis: StoredBasisTokens.All[(i + batch) % 4],
                Metadata: i % 5 == 0 ? string.Empty : $"batch {batch} row {i}");
        }
        return rows;
    }

    public static string Note(int batch) => $"batch {batch}";
}
