using System.Reflection;
using Hull.Store.Tests.Backends;

namespace Hull.Store.Tests;

/// <summary>
/// The shared write loop for a session's version rows, on every backend: rows staged in batches of the size asked
/// for and committed whole, the correction record written with the version, and any failure cancelling the session
/// (nothing staged left) while the first failure is what the caller sees, even when the cancel fails too.
/// </summary>
public abstract class SessionVersionWriteTests : IDisposable
{
    private static readonly TimeSpan Expiry = TimeSpan.FromMinutes(5);

    private readonly StoreLocation _location;
    private readonly IDatasetStore _store;

    protected SessionVersionWriteTests(StoreBackend backend)
    {
        _location = backend.NewLocation();
        _store = _location.Open();
        _store.CreateDataset("d");
    }

    public void Dispose()
    {
        _store.Dispose();
        _location.Dispose();
    }

    [Fact]
    public void Rows_are_staged_in_batches_of_the_size_asked_for_and_committed_as_one_version()
    {
        IReadOnlyList<EntryRow> rows = Rows.Many("a", 7);
        var watched = Watched.Around(_store);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Expiry);

        ImportResult result = SessionVersionWrite.Run((IDatasetStore)watched, session, rows, Expiry, batchRows: 3);

        Assert.Equal([3, 3, 1], watched.StagedBatchSizes);
        Assert.Equal(1, result.NewVersion);
        Assert.Equal(7, result.Inserted);
        Rows.AssertSame(rows, Rows.Sorted(_store.GetEntries("d", 1)), "the written version");
        Assert.Null(_store.GetVersionCorrections("d", 1));
        Assert.Empty(_store.ListImports("d"));
        Assert.Equal(0, _store.CountStagedRows());
    }

    [Fact]
    public void A_correction_record_is_written_with_the_version_it_derives()
    {
        _store.ImportBatch("d", Rows.Many("a", 4), DuplicatePolicy.Reject, BatchProvenance.None);
        _store.PutCorrectionSet("fit", 2, """{"set_schema": 1}""");
        IReadOnlyList<EntryRow> corrected = Rows.Many("a", 4, offsetEv: -0.5);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Expiry);

        ImportResult result = SessionVersionWrite.Run(_store, session, corrected, Expiry, new VersionCorrections("fit", 2, 1), basedOn: 1, batchRows: 2);

        Assert.Equal(2, result.NewVersion);
        Assert.Equal(new VersionCorrections("fit", 2, 1), _store.GetVersionCorrections("d", 2));
        Rows.AssertSame(corrected, Rows.Sorted(_store.GetEntries("d", 2)), "the corrected version");
    }

    [Fact]
    public void A_failed_commit_cancels_the_session_and_surfaces_its_own_failure()
    {
        _store.ImportBatch("d", Rows.Many("a", 2), DuplicatePolicy.Reject, BatchProvenance.None);
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Replace, BatchProvenance.None, Expiry);

        // Checked against version 5, which is not the latest: the commit refuses after every batch was staged.
        Assert.Throws<BaseVersionChangedException>(() => SessionVersionWrite.Run(_store, session, Rows.Many("b", 5), Expiry, basedOn: 5, batchRows: 2));

        Assert.Empty(_store.ListImports("d"));
        Assert.Equal(0, _store.CountStagedRows());
        Assert.Equal([1L], _store.ListVersions("d").Select(v => v.Version));
    }

    [Fact]
    public void A_failed_cancel_is_swallowed_and_the_first_failure_is_rethrown()
    {
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Expiry);
        var watched = Watched.Around(_store);
        watched.FailCancel = true;

        // The record names a set that is not stored: the mark fails, then the cancel fails too.
        Assert.Throws<CorrectionSetNotFoundException>(() =>
            SessionVersionWrite.Run((IDatasetStore)watched, session, Rows.Many("a", 3), Expiry, new VersionCorrections("absent", 1, 1)));

        Assert.Equal(1, watched.CancelCalls);
        // The cancel never reached the store: the session is still open, to lapse; no version was written.
        Assert.Single(_store.ListImports("d"));
        Assert.Empty(_store.ListVersions("d"));
        _store.CancelImport(session.SessionId);
    }

    [Fact]
    public void No_rows_is_refused_by_the_commit_and_leaves_no_session()
    {
        ImportSessionInfo session = _store.BeginImport("d", DuplicatePolicy.Reject, BatchProvenance.None, Expiry);
        Assert.Throws<InvalidBatchException>(() => SessionVersionWrite.Run(_store, session, [], Expiry));
        Assert.Empty(_store.ListImports("d"));
        Assert.Throws<ArgumentOutOfRangeException>(() => SessionVersionWrite.Run(_store, session, Rows.Many("a", 1), Expiry, batchRows: 0));
    }

    /// <summary>A store seen through a proxy that records staged batch sizes and can fail the cancel.</summary>
    public class Watched : DispatchProxy
    {
        private IDatasetStore _inner = null!;

        public List<int> StagedBatchSizes { get; } = [];

        public int CancelCalls { get; private set; }

        public bool FailCancel { get; set; }

        public static Watched Around(IDatasetStore inner)
        {
            IDatasetStore proxy = Create<IDatasetStore, Watched>();
            var watched = (Watched)(object)proxy;
            watched._inner = inner;
            return watched;
        }

        protected override object? Invoke(MethodInfo? targetMethod, object?[]? args)
        {
            ArgumentNullException.ThrowIfNull(targetMethod);
            if (targetMethod.Name == nameof(IDatasetStore.StageBatch)) StagedBatchSizes.Add(((IReadOnlyList<EntryRow>)args![1]!).Count);
            if (targetMethod.Name == nameof(IDatasetStore.CancelImport))
            {
                CancelCalls++;
                if (FailCancel) throw new InvalidOperationException("the cancel failed as well");
            }

            try
            {
                return targetMethod.Invoke(_inner, args);
            }
            catch (TargetInvocationException e) when (e.InnerException is not null)
            {
                System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(e.InnerException).Throw();
                throw;
            }
        }
    }
}

public sealed class SessionVersionWriteTestsOnSqlite() : SessionVersionWriteTests(StoreBackend.Sqlite)
{
}

public sealed class SessionVersionWriteTestsOnPostgres() : SessionVersionWriteTests(StoreBackend.Postgres)
{
}
