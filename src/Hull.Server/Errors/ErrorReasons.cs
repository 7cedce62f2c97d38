using Grpc.Core;

namespace Hull.Server.Errors;

/// <summary>
/// Every reason code the service answers with. The server README's table lists exactly these (a test holds the
/// two together); each status without a more specific reason gets that status's general one.
/// </summary>
public static class ErrorReasons
{
    /// <summary>google.rpc.ErrorInfo.domain of every error of this service.</summary>
    public const string Domain = "hull.v1";

    public static ErrorReason InvalidField { get; } = new("INVALID_FIELD", StatusCode.InvalidArgument,
        "a request field is malformed or out of range; BadRequest names the field");
    public static ErrorReason InvalidEntry { get; } = new("INVALID_ENTRY", StatusCode.InvalidArgument,
        "an import batch has a bad row (formula, energy, basis, id, note) or repeats an id; nothing was written; BadRequest names `entries[i].field`");
    public static ErrorReason InvalidDatasetName { get; } = new("INVALID_DATASET_NAME", StatusCode.InvalidArgument,
        "a dataset name breaks the naming rules; BadRequest names the field");
    public static ErrorReason InvalidPageToken { get; } = new("INVALID_PAGE_TOKEN", StatusCode.InvalidArgument,
        "a page_token that this call did not hand out, or one from another request; BadRequest names `page_token`");
    public static ErrorReason DatasetNotFound { get; } = new("DATASET_NOT_FOUND", StatusCode.NotFound,
        "no dataset of that name; ResourceInfo names it");
    public static ErrorReason VersionNotFound { get; } = new("VERSION_NOT_FOUND", StatusCode.NotFound,
        "the dataset has no such live version (deleted, never issued, or no version yet); ResourceInfo names `dataset@version`");
    public static ErrorReason EntryNotFound { get; } = new("ENTRY_NOT_FOUND", StatusCode.NotFound,
        "an entry id is not in the version; ResourceInfo names it, BadRequest names `entry_ids[i]`");
    public static ErrorReason ImportSessionNotFound { get; } = new("IMPORT_SESSION_NOT_FOUND", StatusCode.NotFound,
        "the import session is not open: committed, cancelled, or lapsed (metadata `expired`) and its staged rows removed; nothing of it was written");
    public static ErrorReason ResourceNotFound { get; } = new("RESOURCE_NOT_FOUND", StatusCode.NotFound,
        "something else that was named does not exist; ResourceInfo says what");
    public static ErrorReason DatasetExists { get; } = new("DATASET_EXISTS", StatusCode.AlreadyExists,
        "the dataset name is taken; ResourceInfo names it");
    public static ErrorReason EntryIdExists { get; } = new("ENTRY_ID_EXISTS", StatusCode.AlreadyExists,
        "an imported id is already in the latest version under DUPLICATE_POLICY_REJECT; ResourceInfo and BadRequest name it");
    public static ErrorReason ResourceExists { get; } = new("RESOURCE_EXISTS", StatusCode.AlreadyExists,
        "something else that was to be created exists; ResourceInfo says what");
    public static ErrorReason MissingElementalReference { get; } = new("MISSING_ELEMENTAL_REFERENCE", StatusCode.FailedPrecondition,
        "a total energy needs an element's reference and the version has no pure total-energy entry of it; PreconditionFailure subject `element:Fe`");
    public static ErrorReason DatasetNotAnalysable { get; } = new("DATASET_NOT_ANALYSABLE", StatusCode.FailedPrecondition,
        "the version's stored entries cannot be analysed as they are (e.g. a stored formula the service cannot read); PreconditionFailure says which");
    public static ErrorReason PreconditionFailed { get; } = new("PRECONDITION_FAILED", StatusCode.FailedPrecondition,
        "another state of the data prevents the call; PreconditionFailure says which");
    public static ErrorReason LimitExceeded { get; } = new("LIMIT_EXCEEDED", StatusCode.ResourceExhausted,
        "past a documented work limit; QuotaFailure subject is the limit's ServerLimits field (e.g. `max_entries_per_system`), metadata `limit` and `limit_value`");
    public static ErrorReason WriteTokenRequired { get; } = new("WRITE_TOKEN_REQUIRED", StatusCode.Unauthenticated,
        "a write call without the bearer token this server requires");
    public static ErrorReason WriteTokenRejected { get; } = new("WRITE_TOKEN_REJECTED", StatusCode.PermissionDenied,
        "a write call with a bearer token that is not the server's");
    public static ErrorReason DatasetMoved { get; } = new("DATASET_MOVED", StatusCode.Aborted,
        "other servers on the same store kept committing to the dataset while the import was checked, five times over; nothing was written; retry");
    public static ErrorReason StoreUnavailable { get; } = new("STORE_UNAVAILABLE", StatusCode.Unavailable,
        "the shared store's database cannot be reached right now; nothing of the call was written; retry, here or on another server");
    public static ErrorReason DeadlineExceeded { get; } = new("DEADLINE_EXCEEDED", StatusCode.DeadlineExceeded,
        "the caller's deadline passed before the work finished");
    public static ErrorReason Cancelled { get; } = new("CANCELLED", StatusCode.Cancelled,
        "the caller cancelled the call");
    public static ErrorReason InternalError { get; } = new("INTERNAL_ERROR", StatusCode.Internal,
        "a fault of the server; metadata `trace_id` finds it in the server log");

    /// <summary>Every reason, in the order of the README's table.</summary>
    public static IReadOnlyList<ErrorReason> All { get; } =
    [
        InvalidField, InvalidEntry, InvalidDatasetName, InvalidPageToken,
        DatasetNotFound, VersionNotFound, EntryNotFound, ImportSessionNotFound, ResourceNotFound,
        DatasetExists, EntryIdExists, ResourceExists,
        MissingElementalReference, DatasetNotAnalysable, PreconditionFailed,
        LimitExceeded, WriteTokenRequired, WriteTokenRejected, DatasetMoved, StoreUnavailable,
        DeadlineExceeded, Cancelled, InternalError,
    ];

    /// <summary>The general reason of a status, for an error raised without a more specific one.</summary>
    public static ErrorReason DefaultFor(StatusCode status) => status switch
    {
        StatusCode.InvalidArgument => InvalidField,
        StatusCode.NotFound => ResourceNotFound,
        StatusCode.AlreadyExists => ResourceExists,
        StatusCode.FailedPrecondition => PreconditionFailed,
        StatusCode.ResourceExhausted => LimitExceeded,
        StatusCode.Unauthenticated => WriteTokenRequired,
        StatusCode.PermissionDenied => WriteTokenRejected,
        StatusCode.DeadlineExceeded => DeadlineExceeded,
        StatusCode.Cancelled => Cancelled,
        _ => InternalError with { Status = status },
    };
}
