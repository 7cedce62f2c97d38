using Grpc.Core;
using Hull.Cli.Client;
using Hull.Cli.Input;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// Sends entry files to the server in batches. Each batch is one ImportEntries call and one new dataset version,
/// all or nothing; a refused batch stops the import, and the message maps the server's "entries[i].field" back to
/// the file's line.
/// </summary>
public sealed class ImportRunner(HullConnection server, TextWriter progress, bool showProgress)
{
    /// <summary>Rows per batch by default: about 100 kB per call, and one version per thousand entries.</summary>
    public const int DefaultBatchSize = 1000;

    /// <summary>Largest batch the CLI sends: stays well inside the server's default 16 MiB message limit.</summary>
    public const int MaxBatchSize = 10_000;

    /// <summary>Imports shorter than this many batches print no progress: they finish at once.</summary>
    private const int ProgressFromBatches = 3;

    public sealed record BatchOutcome(string File, int FirstRecord, int Rows, ImportEntriesResponse Response);

    /// <summary>A batch the server refused; earlier batches stay committed.</summary>
    public sealed class BatchRefusedException(string message, RpcException cause) : Exception(message, cause)
    {
        public RpcException Cause { get; } = cause;
    }

    public async Task<IReadOnlyList<BatchOutcome>> ImportAsync(
        string dataset, string path, IReadOnlyList<EntryRecord> records, DuplicatePolicy policy, int batchSize, string note,
        CancellationToken cancellation)
    {
        var outcomes = new List<BatchOutcome>();
        int batches = (records.Count + batchSize - 1) / batchSize;
        bool show = showProgress && batches >= ProgressFromBatches;
        string label = Path.GetFileName(path);
        for (int b = 0; b < batches; b++)
        {
            int first = b * batchSize;
            int count = Math.Min(batchSize, records.Count - first);
            var request = new ImportEntriesRequest
            {
                Dataset = dataset,
                DuplicatePolicy = policy,
                SourceLabel = batches == 1 ? label : $"{label} [batch {b + 1}/{batches}]",
                Note = note,
            };
            for (int i = first; i < first + count; i++) request.Entries.Add(records[i].ToWire());

            ImportEntriesResponse response;
            try
            {
                response = await server.Datasets.ImportEntriesAsync(request, server.Call(cancellation));
            }
            catch (RpcException e) when (e.StatusCode is not (StatusCode.Unavailable or StatusCode.DeadlineExceeded or StatusCode.Cancelled))
            {
                if (show) progress.WriteLine();
                throw new BatchRefusedException(DescribeRefusal(e, path, records, first, count, b, batches, outcomes), e);
            }

            outcomes.Add(new BatchOutcome(path, first, count, response));
            if (show) WriteProgress(label, first + count, records.Count, b + 1 == batches);
        }

        return outcomes;
    }

    private void WriteProgress(string label, int done, int total, bool last)
    {
        const int Width = 30;
        int filled = (int)((long)done * Width / total);
        string bar = new string('#', filled) + new string('.', Width - filled);
        progress.Write($"\r{label} [{bar}] {done}/{total} entries ({100L * done / total}%)");
        if (last) progress.WriteLine();
        progress.Flush();
    }

    private static string DescribeRefusal(
        RpcException error, string path, IReadOnlyList<EntryRecord> records, int first, int count, int batch, int batches, List<BatchOutcome> done)
    {
        var lines = new List<string>
        {
            $"{path}: batch {batch + 1} of {batches} (entries {first + 1}-{first + count} of the file) was refused whole ({error.StatusCode}); nothing of it was written.",
        };
        var violations = RpcFailure.ViolationsOf(error);
        if (violations.Count == 0) lines.Add($"  {error.Status.Detail}");
        foreach (var violation in violations)
        {
            lines.Add("  " + Locate(violation.Field, path, records, first) + violation.Description);
        }

        if (done.Count > 0)
        {
            lines.Add($"  {done.Count} earlier batch(es) of this file were committed as versions {done[0].Response.DatasetVersion}-{done[^1].Response.DatasetVersion}.");
        }

        return string.Join(Environment.NewLine, lines);
    }

    /// <summary>"entries[12].formula" in a batch starting at record <paramref name="first"/> → "file.csv line 57 (id 'x'), formula: ".</summary>
    private static string Locate(string field, string path, IReadOnlyList<EntryRecord> records, int first)
    {
        if (field.StartsWith("entries[", StringComparison.Ordinal))
        {
            int close = field.IndexOf(']');
            if (close > 8 && int.TryParse(field.AsSpan(8, close - 8), out int index) && first + index < records.Count)
            {
                EntryRecord record = records[first + index];
                string column = close + 2 <= field.Length ? field[(close + 2)..] : string.Empty;
                return $"{Path.GetFileName(path)} {EntryFileReader.Locate(record)} (id '{record.Id}'){(column.Length > 0 ? ", " + column : string.Empty)}: ";
            }
        }

        return field + ": ";
    }
}
