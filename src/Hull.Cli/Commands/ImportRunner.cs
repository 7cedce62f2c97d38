using Grpc.Core;
using Hull.Cli.Client;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// Sends entry files to the server as one import: one new dataset version holding all of them, or nothing. An import
/// that fits one batch is one ImportEntries call; a larger one is an import session (BeginImport, StageEntries per
/// batch, CommitImport). A refused batch, a cancel or a lost server cancels the session, and the message maps the
/// server's "entries[i].field" or "staged[k].field" back to the file's line.
/// </summary>
public sealed class ImportRunner(HullConnection server, TextWriter progress, bool showProgress, bool progressIsTerminal = false)
{
    /// <summary>Rows per batch by default: about 100 kB per call.</summary>
    public const int DefaultBatchSize = 1000;

    /// <summary>Largest batch the CLI sends: stays well inside the server's default 16 MiB message limit.</summary>
    public const int MaxBatchSize = 10_000;

    /// <summary>Imports shorter than this many batches print no progress: they finish at once.</summary>
    private const int ProgressFromBatches = 3;

    /// <summary>How long the cancel of a failed session may take; it runs after the caller's own token may have fired.</summary>
    private static readonly TimeSpan CancelDeadline = TimeSpan.FromSeconds(10);

    /// <summary>One file's entries.</summary>
    public sealed record ImportInput(string Path, IReadOnlyList<EntryRecord> Records);

    /// <summary>The committed import: its one version and counts.</summary>
    public sealed record ImportOutcome(IReadOnlyList<ImportInput> Inputs, int Entries, int Batches, ImportEntriesResponse Response);

    /// <summary>One file imported as one version (the per-file form the demo uses).</summary>
    public sealed record BatchOutcome(string File, int FirstRecord, int Rows, ImportEntriesResponse Response);

    /// <summary>The server refused the import; nothing of it was written.</summary>
    public sealed class BatchRefusedException(string message, RpcException cause) : Exception(message, cause)
    {
        public RpcException Cause { get; } = cause;
    }

    public async Task<IReadOnlyList<BatchOutcome>> ImportAsync(
        string dataset, string path, IReadOnlyList<EntryRecord> records, DuplicatePolicy policy, int batchSize, string note,
        CancellationToken cancellation)
    {
        ImportOutcome outcome = await ImportAsync(dataset, [new ImportInput(path, records)], policy, batchSize, note, cancellation);
        return [new BatchOutcome(path, 0, records.Count, outcome.Response)];
    }

    public async Task<ImportOutcome> ImportAsync(
        string dataset, IReadOnlyList<ImportInput> inputs, DuplicatePolicy policy, int batchSize, string note, CancellationToken cancellation)
    {
        var all = new List<(ImportInput Input, EntryRecord Record)>();
        var firstById = new Dictionary<string, (ImportInput Input, EntryRecord Record)>(StringComparer.Ordinal);
        foreach (ImportInput input in inputs)
        {
            foreach (EntryRecord record in input.Records)
            {
                // Caught here, before anything is sent, so the message can name both places.
                if (!firstById.TryAdd(record.Id, (input, record)))
                {
                    var earlier = firstById[record.Id];
                    throw new InputFileException(input.Path, record.Line > 0 ? record.Line : null,
                        $"{(record.Line > 0 ? string.Empty : EntryFileReader.Locate(record) + ": ")}id '{record.Id}' repeats {Path.GetFileName(earlier.Input.Path)} " +
                        $"{EntryFileReader.Locate(earlier.Record)}; ids must be unique within one import");
                }
                all.Add((input, record));
            }
        }

        string label = string.Join(", ", inputs.Select(i => Path.GetFileName(i.Path)));
        int batches = (all.Count + batchSize - 1) / batchSize;
        if (batches <= 1)
        {
            var request = new ImportEntriesRequest { Dataset = dataset, DuplicatePolicy = policy, SourceLabel = label, Note = note };
            foreach (var item in all) request.Entries.Add(item.Record.ToWire());
            try
            {
                return new ImportOutcome(inputs, all.Count, 1, await server.Datasets.ImportEntriesAsync(request, server.Call(cancellation)));
            }
            catch (RpcException e) when (IsRefusal(e))
            {
                throw new BatchRefusedException(DescribeRefusal(e, dataset, all, first: 0, count: all.Count, sessionCancelled: false), e);
            }
        }

        var bar = showProgress && batches >= ProgressFromBatches ? new ProgressLine(progress, progressIsTerminal, label) : null;
        ImportSession session;
        try
        {
            session = await server.Datasets.BeginImportAsync(
                new BeginImportRequest { Dataset = dataset, DuplicatePolicy = policy, SourceLabel = label, Note = note }, server.Call(cancellation));
        }
        catch (RpcException e) when (IsRefusal(e))
        {
            throw new BatchRefusedException(DescribeRefusal(e, dataset, all, first: 0, count: all.Count, sessionCancelled: true), e);
        }

        int firstOfBatch = 0, countOfBatch = all.Count;
        try
        {
            for (int b = 0; b < batches; b++)
            {
                firstOfBatch = b * batchSize;
                countOfBatch = Math.Min(batchSize, all.Count - firstOfBatch);
                var stage = new StageEntriesRequest { SessionId = session.SessionId };
                for (int i = firstOfBatch; i < firstOfBatch + countOfBatch; i++) stage.Entries.Add(all[i].Record.ToWire());
                await server.Datasets.StageEntriesAsync(stage, server.Call(cancellation));
                bar?.Report(firstOfBatch + countOfBatch, all.Count);
            }

            firstOfBatch = 0;
            countOfBatch = all.Count;
            ImportEntriesResponse committed = await server.Datasets.CommitImportAsync(
                new CommitImportRequest { SessionId = session.SessionId }, server.Call(cancellation));
            bar?.Finish();
            return new ImportOutcome(inputs, all.Count, batches, committed);
        }
        catch (Exception e) when (e is RpcException or OperationCanceledException)
        {
            bar?.Finish();
            bool cancelled = await TryCancelAsync(session.SessionId);
            if (e is RpcException rpc && IsRefusal(rpc))
            {
                throw new BatchRefusedException(DescribeRefusal(rpc, dataset, all, firstOfBatch, countOfBatch, cancelled), rpc);
            }

            if (!cancelled)
            {
                progress.WriteLine($"hull: the import was not committed; its staged rows are removed when the session lapses ({session.IdleExpirySeconds} s without a call).");
            }
            throw;
        }
    }

    /// <summary>Drops the session on the server; false when the server cannot be told (it then lapses by itself).</summary>
    private async Task<bool> TryCancelAsync(string sessionId)
    {
        try
        {
            await server.Datasets.CancelImportAsync(new CancelImportRequest { SessionId = sessionId },
                server.Call(CancellationToken.None).WithDeadline(DateTime.UtcNow + CancelDeadline));
            return true;
        }
        catch (RpcException)
        {
            return false;
        }
    }

    /// <summary>An answer about the import itself, as opposed to a lost server, a timeout or a cancel.</summary>
    private static bool IsRefusal(RpcException e) =>
        e.StatusCode is not (StatusCode.Unavailable or StatusCode.DeadlineExceeded or StatusCode.Cancelled);

    private static string DescribeRefusal(
        RpcException error, string dataset, List<(ImportInput Input, EntryRecord Record)> all, int first, int count, bool sessionCancelled)
    {
        string where = count == all.Count ? $"the import of {all.Count} entries" : $"entries {first + 1}-{first + count} of {all.Count}";
        var lines = new List<string> { $"{where} refused ({error.StatusCode}); nothing was written, no version was made." };
        if (error.StatusCode == StatusCode.NotFound && RpcFailure.ViolationsOf(error).Any(v => v.Field == "dataset"))
        {
            lines[0] = $"dataset '{dataset}' does not exist; nothing was written. Add --create to create it first.";
            return string.Join(Environment.NewLine, lines);
        }

        var violations = RpcFailure.ViolationsOf(error);
        if (violations.Count == 0) lines.Add($"  {error.Status.Detail}");
        foreach (var violation in violations)
        {
            string line = "  " + Locate(violation.Field, all, first) + violation.Description;
            if (error.StatusCode == StatusCode.AlreadyExists && violation.Field.EndsWith(".id", StringComparison.Ordinal)
                && violation.Description.Contains("is already in dataset", StringComparison.Ordinal))
            {
                line += "; import with --on-duplicate replace to supersede it";
            }
            lines.Add(line);
        }

        if (!sessionCancelled && count != all.Count) lines.Add("  (the server could not be told to drop the rows staged so far; they are removed when the session lapses)");
        return string.Join(Environment.NewLine, lines);
    }

    /// <summary>"entries[12].formula" of a batch starting at entry <paramref name="first"/>, or "staged[57].id" of the whole
    /// import → "file.csv line 58 (id 'x'), formula: ".</summary>
    private static string Locate(string field, List<(ImportInput Input, EntryRecord Record)> all, int first)
    {
        int offset = field.StartsWith("entries[", StringComparison.Ordinal) ? first
            : field.StartsWith("staged[", StringComparison.Ordinal) ? 0 : -1;
        int open = field.IndexOf('[');
        int close = field.IndexOf(']');
        if (offset >= 0 && close > open + 1 && int.TryParse(field.AsSpan(open + 1, close - open - 1), out int index) && offset + index < all.Count)
        {
            (ImportInput input, EntryRecord record) = all[offset + index];
            string column = close + 2 <= field.Length ? field[(close + 2)..] : string.Empty;
            return $"{Path.GetFileName(input.Path)} {EntryFileReader.Locate(record)} (id '{record.Id}'){(column.Length > 0 ? ", " + column : string.Empty)}: ";
        }

        return field + ": ";
    }
}
